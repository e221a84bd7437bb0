/**
 * Mutated scenarios through `quietgrid solve`, as a user would run it: every run either solves (three
 * whole report files) or exits 2 with a message naming a field or the size, or exits 1 naming the
 * frequency; nothing throws past the command, nothing hangs, and no half-written file is ever left.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { existsSync, mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { main } from '../../cli/quietgrid.ts';
import { parseCsv } from '../../engine/report/csv.ts';

// small enough that an accepted mutation solves in a fraction of a second
const base = {
  format: 'quietgrid/1', title: 'fuzz base: a small expansion chamber',
  sweep: { frequenciesHz: [200, 400] }, mesh: { order: 2, pointsPerWavelength: 5 }, absorber: { kind: 'discrete', layers: 2 },
  duct: {
    sections: [{ name: 'in', length: 0.3, width: 0.1, height: 0.1 }, { name: 'box', length: 0.3, width: 0.3, height: 0.2 }, { name: 'out', length: 0.3, width: 0.1, height: 0.1 }],
    branches: [{ name: 'stub', section: 'box', at: 0.15, side: '+y', length: 0.1, width: 0.05, height: 0.1, end: 'closed' }],
  },
};

const leaves: [string[], unknown][] = [];
(function collect(v: unknown, at: string[]) {
  if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) collect(x, [...at, k]);
  else leaves.push([at, v]);
})(base, []);

const replacement = fc.oneof(
  fc.constantFrom(0, -1, 1e-9, 1e9, 0.05, 3, 1.5, 1e-3, 'x', null, true, [], {}),
  fc.double({ min: -10, max: 10, noNaN: true }),
);

function mutated(pick: number, value: unknown, drop: boolean): unknown {
  const copy = structuredClone(base) as Record<string, unknown>;
  const [path] = leaves[pick % leaves.length];
  let o = copy as Record<string, unknown>;
  for (const k of path.slice(0, -1)) o = o[k] as Record<string, unknown>;
  if (drop) delete o[path[path.length - 1]];
  else o[path[path.length - 1]] = value;
  return copy;
}

describe('quietgrid solve under mutated scenarios', () => {
  it('solves, or refuses naming the field, and never leaves a partial file', async () => {
    const root = mkdtempSync(join(tmpdir(), 'qg-fuzz-'));
    let run = 0;
    const outcomes = { solved: 0, refused: 0, failed: 0 };
    await fc.assert(fc.asyncProperty(fc.nat(), replacement, fc.boolean(), async (pick, value, drop) => {
      const dir = join(root, `r${run++}`), file = `${dir}.json`, out = join(dir, 'out');
      writeFileSync(file, JSON.stringify(mutated(pick, value, drop)));
      const err: string[] = [];
      const code = await main(['solve', file, '--out', out, '--workers', '1', '--no-check-order'], { out: () => {}, err: (l) => err.push(l) });
      const files = existsSync(out) ? readdirSync(out) : [];
      // common practice: a write is a temporary file and a rename, so no temporary name survives
      expect(files.filter((f) => f.includes('.tmp'))).toEqual([]);
      if (code === 0) {
        outcomes.solved++;
        expect(files.sort()).toEqual(['bands.csv', 'spectrum.csv', 'summary.json']);
        expect(parseCsv(readFileSync(join(out, 'spectrum.csv'), 'utf8')).length).toBeGreaterThan(1);
        JSON.parse(readFileSync(join(out, 'summary.json'), 'utf8'));
      } else if (code === 2) {
        outcomes.refused++;
        expect(files).toEqual([]);
        // the message names a field path of the file, or the size and how to shrink it
        expect(err.join('\n')).toMatch(/(format|title|sweep|mesh|absorber|duct)[.\w[\]]*|unknowns|needs about/);
      } else {
        outcomes.failed++;
        expect(code).toBe(1);
        expect(err.join('\n')).toMatch(/failed at [\d.]+ Hz/);
      }
    }), { numRuns: 150, seed: 42 });
    console.log('outcomes', outcomes);
    expect(outcomes.solved).toBeGreaterThan(0);
    expect(outcomes.refused).toBeGreaterThan(0);
  });

  it('a scenario far larger than intended stops before solving and says --yes', async () => {
    const root = mkdtempSync(join(tmpdir(), 'qg-big-')), file = join(root, 's.json');
    const big = structuredClone(base);
    big.duct.sections[0].length = 500; // a long run at a high top frequency: about a million unknowns
    big.sweep = { frequenciesHz: [4000] };
    writeFileSync(file, JSON.stringify(big));
    const err: string[] = [];
    const code = await main(['solve', file, '--out', join(root, 'out'), '--workers', '1'], { out: () => {}, err: (l) => err.push(l) });
    expect(code).toBe(2);
    expect(err.join('\n')).toMatch(/unknowns.*--yes/s);
    expect(existsSync(join(root, 'out'))).toBe(false);
  });
});

describe('memory guard', () => {
  it('a factor that would not fit in free memory stops before any factorisation, with the estimate and the levers', async () => {
    const { prepareGuarded, loadScenario, UsageError } = await import('../../cli/common.ts');
    const loaded = await loadScenario('scenarios/kitchen-extract-stub-resonator.json');
    expect(() => prepareGuarded(loaded, false, 1e6)).toThrow(UsageError);
    expect(() => prepareGuarded(loaded, false, 1e6)).toThrow(/needs about .* only .* is free: lower mesh.order/);
    // with the machine's real free memory the same scenario is set up
    expect(prepareGuarded(loaded, false).info.dofs).toBeGreaterThan(0);
  });
});
