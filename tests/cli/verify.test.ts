// quietgrid verify as a user runs it: the whole suite once (about a minute on two cores, most of it the
// monopole group), against the rows stored before the sweep engine, and the options.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { quietgrid } from './helpers.ts';
import { NUMBERS, jsonDifferences } from './numbers.ts';

interface Row { case: string; source: string; tolerance: string; value: number; shown: string; pass: boolean }

describe('quietgrid verify', () => {
  it('--json: exit 0, every row passes, names its source and tolerance, and prints what it printed before the sweep engine', async () => {
    const run = await quietgrid('verify', '--json');
    expect(run.code, run.stderr).toBe(0);
    const report = JSON.parse(run.stdout) as { pass: boolean; tables: { id: string; rows: Row[] }[] };
    expect(report.pass).toBe(true);
    expect(report.tables.map((t) => t.id)).toEqual(['outgoing', 'pade', 'monopole', 'duct', 'porous']);
    expect(jsonDifferences(JSON.parse(readFileSync(join(NUMBERS, 'verify.json'), 'utf8')), report)).toEqual([]);
    const rows = report.tables.flatMap((t) => t.rows);
    expect(rows.length).toBeGreaterThan(40);
    for (const r of rows) {
      expect(r.pass, `${r.case}: ${r.shown} (${r.tolerance})`).toBe(true);
      expect(r.source.length).toBeGreaterThan(5);
      expect(r.tolerance.length).toBeGreaterThan(0);
      expect(Number.isFinite(r.value)).toBe(true);
    }
    expect(run.stderr).toMatch(/verify: porous done in/);
  }, 600_000); // the whole suite: about a minute alone, several on a busy machine

  it('prints a table per group, with pass or FAIL per row and a closing count', async () => {
    const run = await quietgrid('verify', '--only', 'pade');
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/^case +value +tolerance +result +source$/m);
    expect(run.stdout).toMatch(/^p = 3, 2 layers: measured .* pass {4}Guddati & Lim/m);
    expect(run.stdout).toMatch(/All 2 checks passed/);
  });

  it('refuses an unknown group or a scenario file: exit 2', async () => {
    const bad = await quietgrid('verify', '--only', 'pade,bogus');
    expect(bad.code).toBe(2);
    expect(bad.stderr).toMatch(/unknown group "bogus"; the groups are outgoing, pade, monopole, duct, porous/);
    const file = await quietgrid('verify', 'scenarios/plant-room-supply-silencer.json');
    expect(file.code).toBe(2);
    expect((await quietgrid('verify', '--help')).stdout).toMatch(/Usage: quietgrid verify/);
  });
});
