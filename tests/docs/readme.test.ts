/** The README documents every scenario field and shows every demo scenario with the command that runs it. */
import { describe, expect, it } from 'vitest';
import { readFileSync, readdirSync } from 'node:fs';

const readme = readFileSync('README.md', 'utf8');
const schema = JSON.parse(readFileSync('scenarios/schema.json', 'utf8'));

function fieldPaths(node: Record<string, unknown>, path: string, out: Set<string>, depth = 0): void {
  const defs = (schema.$defs ?? {}) as Record<string, Record<string, unknown>>;
  const resolve = (n: Record<string, unknown>): Record<string, unknown> => (typeof n.$ref === 'string' ? resolve(defs[n.$ref.split('/').pop()!]) : n);
  const n = resolve(node);
  if (depth > 8) return;
  for (const alt of [...((n.oneOf ?? []) as Record<string, unknown>[]), ...((n.anyOf ?? []) as Record<string, unknown>[])]) fieldPaths(alt, path, out, depth + 1);
  for (const [k, v] of Object.entries((n.properties ?? {}) as Record<string, Record<string, unknown>>)) {
    const p = path ? `${path}.${k}` : k, r = resolve(v);
    out.add(p);
    fieldPaths(r, p, out, depth + 1);
    if (r.items) fieldPaths(r.items as Record<string, unknown>, `${p}[]`, out, depth + 1);
    if (r.additionalProperties && typeof r.additionalProperties === 'object') fieldPaths(r.additionalProperties as Record<string, unknown>, `${p}.*`, out, depth + 1);
  }
}

describe('README', () => {
  it('documents every field of scenarios/schema.json', () => {
    const paths = new Set<string>();
    fieldPaths(schema, '', paths);
    expect(paths.size).toBeGreaterThan(30);
    const missing = [...paths].filter((p) => !readme.includes(`\`${p}\``));
    expect(missing).toEqual([]);
  });
  it('shows the command for every demo scenario', () => {
    const demos = readdirSync('scenarios').filter((f) => f.endsWith('.json') && f !== 'schema.json');
    expect(demos.length).toBeGreaterThanOrEqual(4);
    for (const d of demos) expect(readme).toContain(`npx quietgrid solve scenarios/${d}`);
  });
  it('opens with the job and gives the two set-up commands', () => {
    const first = readme.split('\n\n')[1];
    expect(first).toMatch(/transmission loss/);
    expect(readme).toContain('npm ci && npx quietgrid solve scenarios/');
    expect(readme).toContain('npm test');
  });
});
