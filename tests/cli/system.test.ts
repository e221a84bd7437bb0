// export-system → an external solve → import-solution gives the same report as solve.
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readScenario } from '../../engine/scenario/index.ts';
import { analyze, factor, readMatrixMarket, readMatrixMarketVector, relativeResidual, solve, writeMatrixMarketVector } from '../../engine/linalg/index.ts';
import { parseCsv } from '../../engine/report/index.ts';
import { ROOT, quietgrid } from './helpers.ts';

const FILE = 'scenarios/kitchen-extract-stub-resonator.json';
let tmp: string;
beforeAll(() => { tmp = mkdtempSync(join(tmpdir(), 'quietgrid-mtx-')); });
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function dataLines(text: string): string[] {
  return text.split('\n').filter((l) => l !== '' && !l.startsWith('%'));
}

describe('export-system and import-solution', () => {
  it('round-trips through an external solve to the result of solve, within 1e-6 dB', async () => {
    const sweep = readScenario(readFileSync(join(ROOT, FILE), 'utf8')).scenario.sweep.frequenciesHz;
    const f = String(sweep[Math.floor(sweep.length / 2)]), A = join(tmp, 'A.mtx'), X = join(tmp, 'X.mtx');
    const exported = await quietgrid('export-system', FILE, '--frequency', f, '--out', A);
    expect(exported.code, exported.stderr).toBe(0);

    const aText = readFileSync(A, 'utf8'), bText = readFileSync(join(tmp, 'A.rhs.mtx'), 'utf8');
    // Source: Boisvert, Pozo & Remington, "The Matrix Market Exchange Formats: Initial Design", NIST IR 5935 (1996): header, then the size line
    expect(aText.split('\n')[0]).toBe('%%MatrixMarket matrix coordinate complex symmetric');
    expect(bText.split('\n')[0]).toBe('%%MatrixMarket matrix array complex general');
    const [n, m, entries] = dataLines(aText)[0].split(' ').map(Number);
    expect(m).toBe(n);
    expect(dataLines(aText)).toHaveLength(1 + entries);
    expect(dataLines(bText)[0]).toBe(`${n} 1`);
    expect(dataLines(bText)).toHaveLength(1 + n);

    const matrix = readMatrixMarket(aText), b = readMatrixMarketVector(bText);
    const x = solve(factor(matrix, analyze(matrix)), b);
    expect(relativeResidual(matrix, x, b)).toBeLessThan(1e-10);
    writeFileSync(X, writeMatrixMarketVector(x));

    const imported = await quietgrid('import-solution', FILE, '--frequency', f, '--solution', X, '--out', join(tmp, 'imported'));
    expect(imported.code, imported.stderr).toBe(0);
    expect(imported.stdout).toMatch(/relative residual/);
    const solved = await quietgrid('solve', FILE, '--frequencies', f, '--out', join(tmp, 'solved'));
    expect(solved.code, solved.stderr).toBe(0);

    const row = (dir: string) => parseCsv(readFileSync(join(tmp, dir, 'spectrum.csv'), 'utf8'))[1].map((c) => (c === '' || Number.isNaN(Number(c)) ? c : Number(c)));
    const a = row('imported'), s = row('solved');
    expect(a[0]).toBe(s[0]);
    expect(Math.abs((a[1] as number) - (s[1] as number))).toBeLessThan(1e-6);
    expect(Math.abs((a[2] as number) - (s[2] as number))).toBeLessThan(1e-6);
    expect(a[6]).toBe(s[6]);
  });

  it('refuses a solution of the wrong length, naming both sizes', async () => {
    const X = join(tmp, 'short.mtx');
    writeFileSync(X, writeMatrixMarketVector({ re: new Float64Array(3), im: new Float64Array(3) }));
    const run = await quietgrid('import-solution', FILE, '--frequency', '250', '--solution', X, '--out', join(tmp, 'never'));
    expect(run.code).toBe(2);
    expect(run.stderr).toMatch(/has 3 entries but the system of this scenario has \d+ unknowns/);
  });
});
