// Results stored before a change, and the comparison that says a run still prints the same numbers.
// tests/cli/fixtures/numbers/ holds `quietgrid verify --json` (timings removed) and, per demo, the
// spectrum.csv, bands.csv and summary.json of `quietgrid solve` (the "-checked" folders with the default
// order check, the others with --no-check-order), written by the code before the sweep engine was built.
// A later run must print every stored cell to the last digit; it may add columns and keys (new outputs),
// and its timings, memory peak and explanatory texts are not numbers of the result.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseCsv } from '../../engine/report/csv.ts';
import { ROOT } from './helpers.ts';

export const NUMBERS = join(ROOT, 'tests/cli/fixtures/numbers');

/** Keys whose values are measurements of the run or prose, not results. */
const NOT_RESULTS = new Set(['timing', 'peakMemoryBytes', 'seconds', 'reading', 'flagMeanings', 'cautions', 'conventions']);

/** Every stored cell, column by column (matched by header), against the new table: the differences, empty when none. */
export function csvDifferences(stored: string, actual: string): string[] {
  const [h0, ...r0] = parseCsv(stored), [h1, ...r1] = parseCsv(actual), out: string[] = [];
  if (r0.length !== r1.length) return [`${r1.length} rows, stored ${r0.length}`];
  for (let c = 0; c < h0.length; c++) {
    const d = h1.indexOf(h0[c]);
    if (d < 0) { out.push(`column ${h0[c]} is missing`); continue; }
    for (let r = 0; r < r0.length; r++) if (r0[r][c] !== r1[r][d]) out.push(`row ${r + 1} ${h0[c]}: ${r1[r][d]}, stored ${r0[r][c]}`);
  }
  return out;
}

/** Every stored value of a JSON document against the new one (new keys allowed, results must match exactly). */
export function jsonDifferences(stored: unknown, actual: unknown, path = ''): string[] {
  if (Array.isArray(stored)) {
    if (!Array.isArray(actual) || actual.length !== stored.length) return [`${path}: ${JSON.stringify(actual)}, stored ${JSON.stringify(stored)}`];
    return stored.flatMap((v, i) => jsonDifferences(v, actual[i], `${path}[${i}]`));
  }
  if (stored !== null && typeof stored === 'object') {
    if (actual === null || typeof actual !== 'object') return [`${path}: ${JSON.stringify(actual)}, stored an object`];
    return Object.entries(stored).flatMap(([k, v]) => (NOT_RESULTS.has(k) ? [] : jsonDifferences(v, (actual as Record<string, unknown>)[k], `${path}.${k}`)));
  }
  return Object.is(stored, actual) ? [] : [`${path}: ${JSON.stringify(actual)}, stored ${JSON.stringify(stored)}`];
}

/** The differences of a result folder from the stored one of that name. */
export function folderDifferences(name: string, dir: string): string[] {
  const read = (base: string, f: string) => readFileSync(join(base, f), 'utf8');
  const stored = join(NUMBERS, name);
  return [
    ...csvDifferences(read(stored, 'spectrum.csv'), read(dir, 'spectrum.csv')).map((d) => `spectrum.csv ${d}`),
    ...csvDifferences(read(stored, 'bands.csv'), read(dir, 'bands.csv')).map((d) => `bands.csv ${d}`),
    ...jsonDifferences(JSON.parse(read(stored, 'summary.json')), JSON.parse(read(dir, 'summary.json'))).map((d) => `summary.json ${d}`),
  ];
}
