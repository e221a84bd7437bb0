// quietgrid solve on every scenario in scenarios/, a few frequencies each, read back as a user would.
import { describe, expect, it, beforeAll, afterAll } from 'vitest';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { readScenario, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { bandIndexOf } from '../../engine/acoustics/index.ts';
import { parseCsv } from '../../engine/report/index.ts';
import { ROOT, pickFrequencies, quietgrid, scenarioFiles } from './helpers.ts';
import { folderDifferences } from './numbers.ts';

let tmp: string;
beforeAll(() => { tmp = mkdtempSync(join(tmpdir(), 'quietgrid-cli-')); });
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

function load(file: string): NormalisedScenario {
  return readScenario(readFileSync(join(ROOT, file), 'utf8')).scenario;
}

function readTable(path: string): { header: string[]; rows: string[][] } {
  const [header, ...rows] = parseCsv(readFileSync(path, 'utf8'));
  return { header, rows };
}

const DUCT_HEADER = ['frequency_hz', 'tl_db', 'tl_decomposition_db', 'inlet_reflection', 'inlet_absorption', 'energy_balance', 'method', 'reflection_estimate', 'order_check_db', 'tl_plane_db', 'residual', 'flags'];
const ROOM_ACCURACY = ['reflection_estimate', 'order_check_db', 'residual', 'flags'];
const FLAGS = ['layer_reflection', 'energy', 'order', 'plane_wave_invalid', 'not_passive', 'not_finite', 'near_singular'];
const BAND_HEADER = ['band_hz', 'band_low_hz', 'band_high_hz', 'bandwidth', 'points'];
const SUMMARY_FIELDS = ['title', 'kind', 'dofs', 'nnz', 'order', 'layers', 'absorberKind', 'elements', 'factorNonzeros', 'memoryEstimateBytes', 'workerMemoryBytes', 'peakMemoryBytes',
  'cutOnHz', 'timing', 'defaultsUsed', 'warnings', 'frequenciesHz', 'failures', 'accuracy', 'cautions', 'conventions'];

function column(t: { header: string[]; rows: string[][] }, name: string): string[] {
  const i = t.header.indexOf(name);
  expect(i, `column ${name}`).toBeGreaterThanOrEqual(0);
  return t.rows.map((r) => r[i]);
}

function expectFinite(cells: string[], what: string): void {
  for (const c of cells) expect(Number.isFinite(Number(c)) && c !== '', `${what} = "${c}"`).toBe(true);
}

function checkFlags(t: { header: string[]; rows: string[][] }): void {
  for (const cell of column(t, 'flags')) for (const f of cell === '' ? [] : cell.split(';')) expect(FLAGS, `flag "${f}"`).toContain(f);
  // run with --no-check-order: the column is there, blank
  expect(column(t, 'order_check_db').every((c) => c === '')).toBe(true);
}

function checkSpectrum(s: NormalisedScenario, dir: string, freqs: number[]): void {
  const t = readTable(join(dir, 'spectrum.csv'));
  expect(t.rows).toHaveLength(freqs.length);
  expectFinite(column(t, 'frequency_hz'), 'frequency_hz');
  column(t, 'frequency_hz').forEach((f, i) => expect(Number(f)).toBeCloseTo(freqs[i], 3));
  checkFlags(t);
  // every solve's relative residual, checked by the engine against ACCEPTED_RESIDUAL
  expectFinite(column(t, 'residual'), 'residual');
  for (const v of column(t, 'residual')) expect(Number(v)).toBeLessThanOrEqual(1e-8);
  if (s.kind === 'room') {
    expect(t.header).toEqual(['frequency_hz', ...s.room.receivers.map((_, i) => t.header[i + 1]), ...ROOM_ACCURACY]);
    for (const h of t.header.slice(1, 1 + s.room.receivers.length)) {
      expect(h).toMatch(/^spl_db_[a-z0-9_]+$/);
      expectFinite(column(t, h), h);
    }
    return;
  }
  expect(t.header).toEqual(DUCT_HEADER);
  if (s.duct.outlet === 'rigid') return;
  if (s.linings.length === 0) expectFinite(column(t, 'tl_plane_db'), 'tl_plane_db');
  if (s.absorber.kind === 'discrete') expectFinite(column(t, 'reflection_estimate'), 'reflection_estimate');
  const tl = column(t, 'tl_db'), balance = column(t, 'energy_balance');
  expectFinite(tl, 'tl_db');
  expectFinite(balance, 'energy_balance');
  expectFinite(column(t, 'inlet_reflection'), 'inlet_reflection');
  // common practice: a passive silencer without flow cannot amplify (TL ≥ 0); 0.5 dB allows for discretisation
  for (const v of tl) expect(Number(v)).toBeGreaterThanOrEqual(-0.5);
  // common practice: incident power = reflected + transmitted for a lossless duct (energy conservation); a lining absorbs
  if (s.linings.length === 0) for (const v of balance) expect(Number(v)).toBeLessThan(1e-2);
  else for (const v of balance) expect(Number(v)).toBeGreaterThan(0);
}

function checkBands(s: NormalisedScenario, dir: string, freqs: number[]): void {
  const t = readTable(join(dir, 'bands.csv'));
  expect(t.header.slice(0, BAND_HEADER.length)).toEqual(BAND_HEADER);
  const fraction = s.sweep.spacing === 'octave' ? 1 : 3, name = fraction === 1 ? 'octave' : 'third-octave';
  const own = t.rows.filter((r) => r[3] === name);
  expect(own).toHaveLength(new Set(freqs.map((f) => bandIndexOf(f, fraction))).size);
  expect(own.reduce((n, r) => n + Number(r[4]), 0)).toBe(freqs.length);
  for (const r of own) expectFinite(r.slice(0, 3).concat(r.slice(4, 6)), 'band cell');
  if (s.kind === 'duct' && s.sourcePower) {
    expect(t.header.slice(-3)).toEqual(['source_lw_db', 'outlet_lw_db', 'outlet_lwa_db']);
    const octaves = t.rows.filter((r) => r[3] === 'octave');
    for (const b of s.sourcePower.octaveBands) expect(octaves.some((r) => Number(r[0]) === b.nominalHz)).toBe(true);
  }
}

function checkSummary(s: NormalisedScenario, dir: string, freqs: number[]): void {
  const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
  for (const key of SUMMARY_FIELDS) expect(summary, key).toHaveProperty(key);
  expect(summary.kind).toBe(s.kind);
  expect(summary.dofs).toBeGreaterThan(0);
  expect(summary.frequenciesHz).toEqual(freqs);
  expect(summary.failures).toEqual([]);
  expect(summary.timing.total_s).toBeGreaterThan(0);
  expect(summary.conventions).toMatch(/e\^\{\+jωt\}/);
  expect(summary.cautions.length).toBeGreaterThan(0);
  if (s.kind === 'duct') expect(summary.cutOnHz.map((c: { section: string }) => c.section)).toEqual(expect.arrayContaining(s.duct.sections.map((x) => x.name)));
  expect(summary.accuracy.reading).toMatch(/reflection_estimate/);
  expect(Object.keys(summary.accuracy.flagMeanings).sort()).toEqual([...FLAGS].sort());
  expect(summary.accuracy.flagsByFrequency.map((x: { frequencyHz: number }) => x.frequencyHz)).toEqual(freqs);
  expect(summary.accuracy.orderCheckedHz).toEqual([]);
}

const stem = (file: string) => file.replace(/^scenarios\//, '').replace(/\.json$/, '');

describe.each(scenarioFiles())('quietgrid solve %s', (file) => {
  it('writes spectrum.csv, bands.csv and summary.json that read back, with the numbers stored before the sweep engine', async () => {
    const s = load(file), freqs = [...s.sweep.frequenciesHz], dir = join(tmp, file.replace(/\W/g, '_'));
    // the order check has tests of its own below: here each demo's whole sweep is solved once
    const run = await quietgrid('solve', file, '--out', dir, '--no-check-order');
    expect(run.stderr).not.toMatch(/FAILED/);
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Mesh: order \d+, \d+ elements, \d+ dofs, \d+ absorbing layers/);
    expect(run.stdout).toMatch(/Defaults used/);
    expect(run.stdout).toMatch(/Order check: off/);
    expect(run.stdout).toMatch(/^Accuracy flags/m);
    checkSpectrum(s, dir, freqs);
    checkBands(s, dir, freqs);
    checkSummary(s, dir, freqs);
    expect(folderDifferences(stem(file), dir)).toEqual([]);
  });
});

describe('quietgrid solve with the default order check', () => {
  it.each(['scenarios/plant-room-supply-silencer.json', 'scenarios/generator-room-small.json'])('%s prints the numbers stored before the sweep engine', async (file) => {
    const dir = join(tmp, `checked-${stem(file)}`);
    const run = await quietgrid('solve', file, '--out', dir);
    expect(run.code, run.stderr).toBe(0);
    expect(folderDifferences(`${stem(file)}-checked`, dir)).toEqual([]);
  });
});

describe('quietgrid solve, workers', () => {
  it('gives the same numbers from worker threads as from the main thread', async () => {
    const file = 'scenarios/kitchen-extract-stub-resonator.json', freqs = pickFrequencies(load(file).sweep.frequenciesHz).join(',');
    const a = await quietgrid('solve', file, '--out', join(tmp, 'w1'), '--frequencies', freqs, '--workers', '1');
    const b = await quietgrid('solve', file, '--out', join(tmp, 'w2'), '--frequencies', freqs, '--workers', '2');
    expect([a.code, b.code]).toEqual([0, 0]);
    expect(a.stdout).toMatch(/in the main thread/);
    expect(b.stdout).toMatch(/in 2 worker threads/);
    expect(readFileSync(join(tmp, 'w2', 'spectrum.csv'), 'utf8')).toBe(readFileSync(join(tmp, 'w1', 'spectrum.csv'), 'utf8'));
  });

  it('prints one progress line per solve when stderr is not a terminal', async () => {
    const run = await quietgrid('solve', 'scenarios/kitchen-extract-stub-resonator.json', '--out', join(tmp, 'p'), '--frequencies', '200,400', '--no-check-order');
    expect(run.code).toBe(0);
    const lines = run.stderr.trim().split('\n');
    expect(lines).toHaveLength(2);
    // two workers by default on two cores: the count follows completion, which frequency finishes first is not fixed
    const line = /^\[(\d)\/2\] (\d+) Hz: TL -?\d+\.\d\d dB \(elapsed \d+:\d\d, left ~\d+:\d\d\)$/;
    for (const l of lines) expect(l).toMatch(line);
    expect(lines.map((l) => line.exec(l)![1])).toEqual(['1', '2']);
    expect(lines.map((l) => Number(line.exec(l)![2])).sort((x, y) => x - y)).toEqual([200, 400]);
  });

  it('writes the fields as .vtu files with --fields', async () => {
    const dir = join(tmp, 'fields');
    const run = await quietgrid('solve', 'scenarios/kitchen-extract-stub-resonator.json', '--out', join(tmp, 'f'), '--frequencies', '250', '--fields', dir, '--no-check-order');
    expect(run.code, run.stderr).toBe(0);
    const vtu = readFileSync(join(dir, 'field-250Hz.vtu'), 'utf8');
    expect(vtu).toMatch(/^<\?xml version="1.0"\?>\n<VTKFile type="UnstructuredGrid"/);
    for (const name of ['pressure_abs_pa', 'spl_db', 'pressure_re_pa', 'pressure_im_pa']) expect(vtu).toContain(`Name="${name}"`);
    // the total pressure: upstream of the split plane (x < 0.17 m) the incident 1 Pa wave is added back to the
    // solver's reflected wave (|R| ≈ 0.5 at 250 Hz), so |p| there averages about 1 Pa, not |R|
    const numbers = (start: string) => vtu.slice(vtu.indexOf(start)).split('>')[1].split('<')[0].trim().split(/\s+/).map(Number);
    const abs = numbers('Name="pressure_abs_pa"'), xyz = numbers('NumberOfComponents="3"');
    const upstream = abs.filter((_, i) => xyz[3 * i] < 0.1);
    expect(upstream.length).toBeGreaterThan(10);
    expect(upstream.reduce((a, b) => a + b, 0) / upstream.length).toBeGreaterThan(0.75);
  });
});

describe('quietgrid solve, order check', () => {
  const file = 'scenarios/kitchen-extract-stub-resonator.json';

  it('by default re-solves at most three frequencies at p + 1, the top among them, in the same pool', async () => {
    const dir = join(tmp, 'oc-default'), freqs = [160, 250, 400, 630];
    const run = await quietgrid('solve', file, '--out', dir, '--frequencies', freqs.join(','), '--workers', '2');
    expect(run.code, run.stderr).toBe(0);
    expect(run.stdout).toMatch(/Order check: 250, 400, 630 Hz again at order 5/);
    const lines = run.stderr.trim().split('\n');
    expect(lines).toHaveLength(7);
    expect(lines.filter((l) => /Hz order check at p = 5: TL -?\d+\.\d\d dB/.test(l))).toHaveLength(3);
    const t = readTable(join(dir, 'spectrum.csv')), check = column(t, 'order_check_db');
    expect(check[0]).toBe('');
    expectFinite(check.slice(1), 'order_check_db');
    // common practice: the demo's own mesh is converged to well under the flag's 0.5 dB in TL
    for (const v of check.slice(1)) expect(Number(v)).toBeLessThan(0.5);
    const summary = JSON.parse(readFileSync(join(dir, 'summary.json'), 'utf8'));
    expect(summary.accuracy.orderCheckedHz).toEqual([250, 400, 630]);
  });

  it('--check-order checks every frequency; both options at once are refused', async () => {
    const dir = join(tmp, 'oc-all');
    const run = await quietgrid('solve', file, '--out', dir, '--frequencies', '200,315', '--check-order', '--workers', '1');
    expect(run.code, run.stderr).toBe(0);
    expectFinite(column(readTable(join(dir, 'spectrum.csv')), 'order_check_db'), 'order_check_db');
    const both = await quietgrid('solve', file, '--out', dir, '--check-order', '--no-check-order');
    expect(both.code).toBe(2);
    expect(both.stderr).toMatch(/--check-order and --no-check-order contradict/);
  });
});
