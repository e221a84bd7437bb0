/**
 * The validator's notebook: errors, warnings and defaults collected in the order found, with a cap
 * so that a file of a million stray keys yields a readable report rather than a million lines.
 */
import { makeIssue, type Found } from './issues.ts';
import type { DefaultUsed, Issue } from './types.ts';

export const MAX_REPORTED_ERRORS = 100;

export class Checker {
  readonly errors: Issue[] = [];
  readonly warnings: Issue[] = [];
  readonly defaultsUsed: DefaultUsed[] = [];
  private unreported = 0;

  error(path: string, value: Found, rule: string, statement: string, fix: string): void {
    if (this.errors.length >= MAX_REPORTED_ERRORS) {
      this.unreported++;
      return;
    }
    this.errors.push(makeIssue(path, value, rule, statement, fix));
  }

  warn(path: string, value: Found, rule: string, statement: string, fix: string): void {
    if (this.warnings.length < MAX_REPORTED_ERRORS) this.warnings.push(makeIssue(path, value, rule, statement, fix));
  }

  usedDefault(path: string, value: unknown, why: string): void {
    this.defaultsUsed.push({ path, value, why });
  }

  /** Errors so far; relational checks run only on parts that read cleanly, and use this to tell. */
  get errorCount(): number {
    return this.errors.length + this.unreported;
  }

  /** The errors, closed by a note on how many more were found but not listed. */
  reportedErrors(): Issue[] {
    if (this.unreported === 0) return this.errors;
    const fix = 'correct the errors above and validate again';
    const statement = `${this.unreported} more errors were found and not listed`;
    return [...this.errors, { path: '', rule: 'too-many-errors', fix, message: `${statement}; fix: ${fix}` }];
  }
}

/** "duct" + "sections" → "duct.sections"; "" + "duct" → "duct". */
export function join(path: string, key: string): string {
  return path === '' ? key : `${path}.${key}`;
}

export function item(path: string, index: number): string {
  return `${path}[${index}]`;
}
