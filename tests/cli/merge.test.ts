// quietgrid merge: a sweep solved in two halves and merged must give the report of one full solve.
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, cpSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readScenario } from '../../engine/scenario/index.ts';
import { parseCsv } from '../../engine/report/index.ts';
import { mergeCommand } from '../../cli/merge.ts';
import { UsageError, type Io } from '../../cli/common.ts';
import { ROOT, quietgrid } from './helpers.ts';

const DUCT = 'scenarios/plant-room-supply-silencer.json';
const ROOM = 'scenarios/generator-room-small.json';
let tmp: string;
const lines: string[] = [];
const io: Io = { out: (l) => lines.push(l), err: (l) => lines.push(l) };

function sweepOf(file: string): number[] {
  return [...readScenario(readFileSync(join(ROOT, file), 'utf8')).scenario.sweep.frequenciesHz];
}

async function solve(file: string, out: string, freqs?: number[]): Promise<void> {
  const args = ['solve', file, '--no-check-order', '--workers', '1', '--out', out, ...(freqs ? ['--frequencies', freqs.map(String).join(',')] : [])];
  const r = await quietgrid(...args);
  expect(r.code, r.stderr).toBe(0);
}

const table = (dir: string, name: string) => parseCsv(readFileSync(join(dir, name), 'utf8'));
const summary = (dir: string) => JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8')) as Record<string, unknown>;

/** Same shape, same text where not a number, numbers within a relative 1e-6 (the CSV keeps 8 digits, bands are recomputed from them). */
function expectSameTable(a: string[][], b: string[][]): void {
  expect(a.length).toBe(b.length);
  expect(a[0]).toEqual(b[0]);
  for (let i = 1; i < a.length; i++) {
    for (let c = 0; c < a[i].length; c++) {
      const x = Number(a[i][c]), y = Number(b[i][c]);
      if (a[i][c] === '' || Number.isNaN(x)) expect(a[i][c], `${a[0][c]} row ${i}`).toBe(b[i][c]);
      else expect(Math.abs(x - y), `${a[0][c]} row ${i}: ${a[i][c]} vs ${b[i][c]}`).toBeLessThanOrEqual(1e-6 * Math.max(Math.abs(x), Math.abs(y)));
    }
  }
}

beforeAll(async () => {
  tmp = mkdtempSync(join(tmpdir(), 'quietgrid-merge-'));
  const f = sweepOf(DUCT), half = Math.ceil(f.length / 2);
  await Promise.all([
    solve(DUCT, join(tmp, 'full')),
    solve(DUCT, join(tmp, 'low'), f.slice(0, half)),
    solve(DUCT, join(tmp, 'high'), f.slice(half)),
    solve(DUCT, join(tmp, 'overlap'), f.slice(half - 2, half + 1)),
    solve(ROOM, join(tmp, 'room'), sweepOf(ROOM).slice(0, 2)),
  ]);
}, 240_000);
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('quietgrid merge', () => {
  it('two halves of a sweep merge into the report of one full solve', async () => {
    const out = join(tmp, 'merged');
    expect(await mergeCommand([join(tmp, 'high'), join(tmp, 'low'), '--out', out], io)).toBe(0);
    // the spectrum rows are the full run's, text for text
    expect(readFileSync(join(out, 'spectrum.csv'), 'utf8')).toBe(readFileSync(join(tmp, 'full', 'spectrum.csv'), 'utf8'));
    expectSameTable(table(out, 'bands.csv'), table(join(tmp, 'full'), 'bands.csv'));
    const m = summary(out), full = summary(join(tmp, 'full'));
    for (const key of ['title', 'kind', 'dofs', 'order', 'layers', 'frequenciesHz', 'solvedFrequenciesHz', 'failures', 'accuracy', 'cutOnHz', 'defaultsUsed', 'warnings', 'cautions', 'perturbedPivots']) {
      expect(m[key], key).toEqual(full[key]);
    }
    expect(m.outletLwaTotalDb as number).toBeCloseTo(full.outletLwaTotalDb as number, 5);
    // timings are the halves' totals
    const t = (d: string) => (summary(join(tmp, d)).timing as { factor_s: number }).factor_s;
    expect((m.timing as { factor_s: number }).factor_s).toBeCloseTo(t('low') + t('high'), 9);
    expect((m.notes as string[]).some((n) => n.startsWith('Merged from 2 runs'))).toBe(true);
  });

  it('a frequency solved twice with the same result is kept once', async () => {
    const out = join(tmp, 'merged-overlap');
    expect(await mergeCommand([join(tmp, 'low'), join(tmp, 'overlap'), join(tmp, 'high'), '--out', out], io)).toBe(0);
    expect(readFileSync(join(out, 'spectrum.csv'), 'utf8')).toBe(readFileSync(join(tmp, 'full', 'spectrum.csv'), 'utf8'));
  });

  it('refuses a frequency solved twice with different results', async () => {
    const bad = join(tmp, 'tampered');
    cpSync(join(tmp, 'overlap'), bad, { recursive: true });
    const rows = table(bad, 'spectrum.csv'), tl = rows[0].indexOf('tl_db');
    rows[1][tl] = String(Number(rows[1][tl]) + 0.5);
    writeFileSync(join(bad, 'spectrum.csv'), rows.map((r) => r.join(',')).join('\r\n') + '\r\n');
    await expect(mergeCommand([join(tmp, 'low'), bad, '--out', join(tmp, 'x')], io)).rejects.toThrow(/with different results \(tl_db/);
  });

  it('refuses runs of different scenarios or meshes, naming what differs', async () => {
    await expect(mergeCommand([join(tmp, 'low'), join(tmp, 'room'), '--out', join(tmp, 'x')], io)).rejects.toThrow(/not runs of the same scenario and mesh \(title .*kind "room" against "duct"/);
    const other = join(tmp, 'other-order');
    cpSync(join(tmp, 'high'), other, { recursive: true });
    const s = summary(other);
    writeFileSync(join(other, 'summary.json'), JSON.stringify({ ...s, order: 3 }));
    await expect(mergeCommand([join(tmp, 'low'), other, '--out', join(tmp, 'x')], io)).rejects.toThrow(/order 3 against 4/);
  });

  it('says what is missing: no folders, no --out, not a result folder', async () => {
    await expect(mergeCommand(['--out', join(tmp, 'x')], io)).rejects.toThrow(UsageError);
    await expect(mergeCommand([join(tmp, 'low')], io)).rejects.toThrow(/--out DIR is required/);
    await expect(mergeCommand([join(tmp, 'nowhere'), '--out', join(tmp, 'x')], io)).rejects.toThrow(/is not a result folder of quietgrid solve/);
  });
});
