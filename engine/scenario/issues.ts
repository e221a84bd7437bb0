/**
 * Issues: one sentence per problem that a user can act on without opening the schema —
 * where it is, what the file says, which rule it breaks, and what to write instead.
 */
import type { Issue } from './types.ts';

/** Marks a field that the file leaves out, as opposed to one set to some value. */
export const MISSING: unique symbol = Symbol('missing');
export type Found = unknown | typeof MISSING;

/** Thrown by the text readers; carries every issue, errors first. */
export class ScenarioError extends Error {
  readonly issues: Issue[];
  constructor(issues: Issue[], heading = 'the scenario cannot be read') {
    super(`${heading}:\n${formatIssues(issues)}`);
    this.name = 'ScenarioError';
    this.issues = issues;
  }
}

export function makeIssue(path: string, value: Found, rule: string, statement: string, fix: string): Issue {
  const where = path === '' ? 'the scenario' : path;
  const head = value === MISSING ? `${where} is missing` : `${where} = ${showValue(value)}`;
  const issue: Issue = { path, rule, fix, message: `${head}: ${statement}; fix: ${fix}` };
  if (value !== MISSING) issue.value = value;
  return issue;
}

/** One issue per line, numbered, ready for a terminal or a dialog box. */
export function formatIssues(issues: readonly Issue[]): string {
  return issues.map((issue, i) => `${i + 1}. ${issue.message}`).join('\n');
}

const MAX_SHOWN_CHARS = 80;
const MAX_SHOWN_ITEMS = 6;

/**
 * A short, bounded rendering of any value: never recursive beyond one level, so a huge, deep or
 * cyclic value cannot make an error message expensive or throw.
 */
export function showValue(value: unknown): string {
  if (Array.isArray(value)) return clip(showArray(value));
  if (value !== null && typeof value === 'object') return clip(showObjectKeys(value));
  return clip(showScalar(value));
}

function showScalar(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'number' || typeof value === 'boolean' || value === null) return String(value);
  return `(${typeof value})`;
}

function showArray(items: unknown[]): string {
  if (items.length > MAX_SHOWN_ITEMS) return `[… ${items.length} items]`;
  const parts = items.map((item) => (item !== null && typeof item === 'object' ? (Array.isArray(item) ? '[…]' : '{…}') : showScalar(item)));
  return `[${parts.join(', ')}]`;
}

function showObjectKeys(value: object): string {
  const keys = Object.keys(value);
  if (keys.length === 0) return '{}';
  const shown = keys.slice(0, MAX_SHOWN_ITEMS).map((k) => JSON.stringify(k));
  return `{ ${shown.join(', ')}${keys.length > MAX_SHOWN_ITEMS ? ', …' : ''} }`;
}

function clip(text: string): string {
  return text.length <= MAX_SHOWN_CHARS ? text : `${text.slice(0, MAX_SHOWN_CHARS - 1)}…`;
}

/** Numbers in messages: six significant digits, no trailing noise such as 0.5700000000000001. */
export function num(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(6))) : String(x);
}
