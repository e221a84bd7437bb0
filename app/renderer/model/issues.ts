/**
 * Validation issues placed at the fields they concern: the validator's Issue.path is the field's path
 * in the scenario file, which is also how the form names its fields.
 */
import type { Issue } from '../../../engine/scenario/index.ts';
import { showValue } from '../../../engine/scenario/issues.ts';

export type IssueIndex = ReadonlyMap<string, readonly Issue[]>;

export function indexIssues(issues: readonly Issue[]): IssueIndex {
  const map = new Map<string, Issue[]>();
  for (const issue of issues) {
    const list = map.get(issue.path);
    if (list) list.push(issue);
    else map.set(issue.path, [issue]);
  }
  return map;
}

/** Issues at the path itself or inside it (a position's coordinates belong to the position field). */
export function issuesAt(index: IssueIndex, path: string): Issue[] {
  const out: Issue[] = [];
  for (const [p, list] of index) if (p === path || p.startsWith(`${path}[`) || p.startsWith(`${path}.`)) out.push(...list);
  return out;
}

/**
 * The issue in words for a field that already shows its own label and value: the message without its
 * leading "path = value: ", e.g. "the section width (along y) must be between 0.001 and 10000 m; fix: …".
 */
export function issueText(issue: Issue): string {
  const where = issue.path === '' ? 'the scenario' : issue.path;
  const heads = 'value' in issue ? [`${where} = ${showValue(issue.value)}: `] : [`${where} is missing: `];
  for (const head of heads) if (issue.message.startsWith(head)) return capitalise(issue.message.slice(head.length));
  return capitalise(issue.message);
}

function capitalise(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}

/** Issues whose path no field shows, to list beside the run button. */
export function unplacedIssues(issues: readonly Issue[], fieldPaths: ReadonlySet<string>): Issue[] {
  return issues.filter((i) => ![...fieldPaths].some((p) => i.path === p || i.path.startsWith(`${p}[`) || i.path.startsWith(`${p}.`)));
}
