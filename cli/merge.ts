/**
 * quietgrid merge: the result folders of several `quietgrid solve --frequencies …` runs of one scenario
 * (other machines, a job array, GNU parallel) joined into one report, as if the sweep had been solved in
 * one run. The points are read back from each spectrum.csv and checked against each other (every result
 * column; the diagnostic ones of engine/report/columns.ts may differ); spectrum.csv keeps the rows as written,
 * bands.csv and summary.json are rebuilt from the union by the same report code the solve uses.
 */
import { join } from 'node:path';
import { buildReport, tableCsv, type ReportAccuracy, type ReportAccuracyInfo, type ReportDuctPoint, type ReportFailure, type ReportMeshInfo, type ReportPoint, type ReportRoomPoint, type ReportScenario, type Summary } from '../engine/report/results.ts';
import { parseCsv } from '../engine/report/csv.ts';
import { columnOf } from '../engine/report/columns.ts';
import { describeFileError, readTextFile, writeFileAtomicIn } from '../engine/node/files.ts';
import { EXIT_OK, UsageError, hz, parseOptions, type Io } from './common.ts';

export const MERGE_HELP = `Usage: quietgrid merge DIR... --out DIR

Joins the result folders of several "quietgrid solve --frequencies ..." runs of the same scenario
into one report: DIR/spectrum.csv with every frequency once, bands.csv rebuilt from all of them,
and summary.json for the whole set (timings summed over the runs).

The runs must describe the same problem: the same scenario title and kind, and the same mesh
(dofs, element order, absorbing layers, points per wavelength, top frequency); merge refuses
otherwise. A frequency solved in more than one run must have agreed results there.

Options:
  --out DIR   folder for the merged spectrum.csv, bands.csv and summary.json (required)
  --help      this text

Example: two halves of a sweep, then one report
  quietgrid solve S.json --frequencies 63,80,100,125 --out part1
  quietgrid solve S.json --frequencies 160,200,250 --out part2
  quietgrid merge part1 part2 --out all
`;

const OPTIONS = { out: { type: 'string' }, help: { type: 'boolean' } } as const;

// A summary is a few kilobytes, a spectrum a line per frequency: this admits any real sweep.
const MAX_FILE_BYTES = 50_000_000;
/** Summary fields that say which problem was solved; every run must agree on all of them. */
const SAME_PROBLEM = ['title', 'kind', 'dofs', 'order', 'layers', 'absorberKind', 'pointsPerWavelength', 'topFrequencyHz', 'elements', 'nnz'] as const;
/** Results of one frequency agree when their numbers differ by less than this, relative (CSV keeps 8 digits). */
const AGREEMENT = 1e-6;
/** Notes that buildReport writes itself from the points: recomputed for the merged set, not carried over. */
const DERIVED_NOTES = ['The A-weighted outlet total is unknown', 'sourcePower is not applied to room levels'];

interface Run { dir: string; summary: Summary; spectrum: string[][]; bands: string[][] }

export async function mergeCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('merge', args, OPTIONS);
  if (values.help) {
    io.out(MERGE_HELP);
    return EXIT_OK;
  }
  if (positionals.length === 0) throw new UsageError('merge needs the result folders to join, e.g. quietgrid merge part1 part2 --out all');
  if (values.out === undefined) throw new UsageError('--out DIR is required: the folder for the merged report');
  const runs = await Promise.all(positionals.map(readRun));
  const report = mergeRuns(runs);
  const files = [join(values.out, 'spectrum.csv'), join(values.out, 'bands.csv'), join(values.out, 'summary.json')];
  await writeFileAtomicIn(files[0], tableCsv(report.spectrum));
  await writeFileAtomicIn(files[1], tableCsv(report.bands));
  await writeFileAtomicIn(files[2], `${JSON.stringify(report.summary, null, 2)}\n`);
  const s = report.summary;
  io.out(`Merged ${runs.length} runs of "${s.title}": ${s.solvedFrequenciesHz.length} frequencies solved${s.failures.length > 0 ? `, ${s.failures.length} failed` : ''}`);
  io.out(`Wrote ${files.join(', ')}`);
  return EXIT_OK;
}

async function readText(dir: string, name: string): Promise<string> {
  const path = join(dir, name);
  try {
    return await readTextFile(path, MAX_FILE_BYTES);
  } catch (e) {
    throw new UsageError(`${dir} is not a result folder of quietgrid solve: ${describeFileError(e, path)}`);
  }
}

async function readRun(dir: string): Promise<Run> {
  const [summaryText, spectrumText, bandsText] = await Promise.all([readText(dir, 'summary.json'), readText(dir, 'spectrum.csv'), readText(dir, 'bands.csv')]);
  let summary: Summary;
  try {
    summary = JSON.parse(summaryText) as Summary;
  } catch (e) {
    throw new UsageError(`${join(dir, 'summary.json')} is not JSON (${e instanceof Error ? e.message : String(e)}): was the run stopped while writing?`);
  }
  for (const key of [...SAME_PROBLEM, 'frequenciesHz', 'solvedFrequenciesHz'] as const) {
    if (summary[key] === undefined) throw new UsageError(`${join(dir, 'summary.json')} has no "${key}": not a summary of quietgrid solve`);
  }
  return { dir, summary, spectrum: parseCsv(spectrumText), bands: parseCsv(bandsText) };
}

/** The merged report of runs of one problem; UsageError when they are not of one problem or disagree. */
export function mergeRuns(runs: readonly Run[]): ReturnType<typeof buildReport> {
  const first = runs[0];
  for (const r of runs.slice(1)) sameProblem(first, r);
  const merged = mergePoints(runs), points = merged.map((m) => m.point);
  const s0 = first.summary;
  const solved = new Set(points.map((p) => p.frequencyHz));
  const failures = dedupeFailures(runs.flatMap((r) => r.summary.failures)).filter((f) => !solved.has(f.frequencyHz));
  const checkFailures = dedupeFailures(runs.flatMap((r) => r.summary.accuracy?.orderCheckFailures ?? []));
  const accuracy: ReportAccuracyInfo = {
    reading: s0.accuracy.reading, flagMeanings: s0.accuracy.flagMeanings, thresholds: s0.accuracy.thresholds, planeWaveValidBelowHz: s0.accuracy.planeWaveValidBelowHz,
    orderCheckedHz: [...new Set(runs.flatMap((r) => r.summary.accuracy.orderCheckedHz))].filter((f) => solved.has(f)), orderCheckFailures: checkFailures,
  };
  const scenario = scenarioOf(runs);
  const info: ReportMeshInfo = {
    order: s0.order, pointsPerWavelength: s0.pointsPerWavelength, topFrequencyHz: s0.topFrequencyHz, absorberKind: s0.absorberKind, layers: s0.layers,
    elements: s0.elements, dofs: s0.dofs, nnz: s0.nnz, factorNonzeros: s0.factorNonzeros, factorFlops: s0.factorFlops, memoryEstimateBytes: s0.memoryEstimateBytes,
    workerMemoryBytes: s0.workerMemoryBytes, // absent from the summaries of older versions: then absent here too
  };
  const sum = (f: (s: Summary) => number) => runs.reduce((acc, r) => acc + f(r.summary), 0);
  const report = buildReport({
    scenario, info, points, accuracy, failures,
    cutOns: s0.cutOnHz.map((c) => ({ section: c.section, modes: c.modes.map((m) => ({ m: m.m, n: m.n, frequencyHz: m.hz })) })),
    frequenciesHz: [...new Set(runs.flatMap((r) => r.summary.frequenciesHz))],
    warnings: [...new Set(runs.flatMap((r) => r.summary.warnings))].map((message) => ({ message })),
    totalSeconds: sum((s) => s.timing.total_s),
    peakMemoryBytes: Math.max(...runs.map((r) => r.summary.peakMemoryBytes ?? 0)) || null,
    notes: [
      ...new Set(runs.flatMap((r) => r.summary.notes).filter((n) => !DERIVED_NOTES.some((d) => n.startsWith(d)) && !n.startsWith('Merged from '))),
      `Merged from ${runs.length} runs (${runs.map((r) => r.dir).join(', ')}): timings are summed over them, the memory peak is the largest of theirs.`,
    ],
  });
  // The spectrum rows as the runs wrote them, every column carried through (those this version does not know too).
  report.spectrum = { header: [...first.spectrum[0]], rows: merged.map((m) => [...m.row]) };
  // Per-frequency timings are not in spectrum.csv: the runs' own totals are.
  report.summary.timing = { assemble_s: sum((s) => s.timing.assemble_s), factor_s: sum((s) => s.timing.factor_s), solve_s: sum((s) => s.timing.solve_s), total_s: sum((s) => s.timing.total_s) };
  report.summary.perturbedPivots = sum((s) => s.perturbedPivots);
  return report;
}

function sameProblem(a: Run, b: Run): void {
  const differ = SAME_PROBLEM.filter((k) => a.summary[k] !== b.summary[k]);
  if (differ.length > 0) {
    const what = differ.map((k) => `${k} ${JSON.stringify(b.summary[k])} against ${JSON.stringify(a.summary[k])}`).join(', ');
    throw new UsageError(`cannot merge ${b.dir} with ${a.dir}: they are not runs of the same scenario and mesh (${what}). Merge only folders written by "quietgrid solve" from one scenario file, unchanged between the runs.`);
  }
  if (a.spectrum[0]?.join(',') !== b.spectrum[0]?.join(',')) {
    throw new UsageError(`cannot merge ${b.dir} with ${a.dir}: their spectrum.csv have different columns (${b.spectrum[0]?.join(',')} against ${a.spectrum[0]?.join(',')})`);
  }
}

function dedupeFailures(list: readonly ReportFailure[]): ReportFailure[] {
  const by = new Map<number, ReportFailure>();
  for (const f of list) if (!by.has(f.frequencyHz)) by.set(f.frequencyHz, f);
  return [...by.values()];
}

/** What the report needs of the scenario, from the summaries and bands.csv (which hold the sweep's band width and any source power). */
function scenarioOf(runs: readonly Run[]): ReportScenario {
  const s0 = runs[0].summary;
  const scenario: ReportScenario = { title: s0.title, kind: s0.kind, defaultsUsed: s0.defaultsUsed, sweep: { spacing: spacingOf(runs), frequenciesHz: s0.frequenciesHz } };
  const power = sourcePowerOf(runs);
  if (power) scenario.sourcePower = { octaveBands: power };
  if (s0.kind === 'room') scenario.room = { receivers: Object.values(s0.receiverColumns ?? {}).map((name) => ({ name })) };
  return scenario;
}

function column(table: string[][], name: string): number {
  return table[0]?.indexOf(name) ?? -1;
}

function spacingOf(runs: readonly Run[]): string {
  // Third-octave band rows exist exactly when the sweep is not in octaves (and has points).
  const kinds = new Set(runs.flatMap((r) => r.bands.slice(1).map((row) => row[column(r.bands, 'bandwidth')])));
  return kinds.has('third-octave') ? 'third-octave' : kinds.has('octave') ? 'octave' : 'third-octave';
}

function sourcePowerOf(runs: readonly Run[]): { nominalHz: number; levelDb: number }[] | undefined {
  let found: { nominalHz: number; levelDb: number }[] | undefined;
  for (const r of runs) {
    const lw = column(r.bands, 'source_lw_db'), band = column(r.bands, 'band_hz'), width = column(r.bands, 'bandwidth');
    if (lw < 0) {
      if (found) throw new UsageError(`cannot merge ${r.dir}: its bands.csv has no source power while another run's has one`);
      continue;
    }
    const bands = r.bands.slice(1).filter((row) => row[width] === 'octave' && row[lw] !== '').map((row) => ({ nominalHz: Number(row[band]), levelDb: Number(row[lw]) }));
    if (found && JSON.stringify(found) !== JSON.stringify(bands)) throw new UsageError(`cannot merge ${r.dir}: its source power differs from another run's (bands.csv, column source_lw_db)`);
    found = bands;
  }
  return found;
}

function num(text: string): number | null {
  return text === '' ? null : Number(text);
}

/** The frequency as the run solved it: the CSV keeps 8 digits, summary.json every digit. */
function exactFrequency(cell: string, s: Summary): number {
  const f = Number(cell);
  return s.solvedFrequenciesHz.find((x) => Math.abs(x - f) <= 1e-7 * Math.abs(x)) ?? f;
}

function pointOf(r: Run, row: string[]): ReportPoint {
  const h = r.spectrum[0], get = (name: string) => row[h.indexOf(name)] ?? '';
  const stats = { assembleSeconds: 0, factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0 };
  const accuracy: ReportAccuracy = {
    reflectionEstimate: num(get('reflection_estimate')), orderCheckDb: num(get('order_check_db')), tlPlaneDb: num(get('tl_plane_db')),
    flags: get('flags') === '' ? [] : get('flags').split(';'),
  };
  const frequencyHz = exactFrequency(get('frequency_hz'), r.summary);
  if (r.summary.kind === 'duct') {
    const p: ReportDuctPoint = {
      kind: 'duct', frequencyHz, tlDb: num(get('tl_db')), tlDecompositionDb: num(get('tl_decomposition_db')), inletReflection: num(get('inlet_reflection')) ?? NaN,
      inletAbsorption: num(get('inlet_absorption')) ?? NaN, energyBalance: num(get('energy_balance')) ?? NaN, method: get('method'), stats, accuracy,
    };
    return p;
  }
  const receivers = Object.entries(r.summary.receiverColumns ?? {}).map(([header, name]) => ({ name, splDb: num(get(header)) ?? NaN }));
  const p: ReportRoomPoint = { kind: 'room', frequencyHz, receivers, stats, accuracy };
  return p;
}

/** The results of one frequency from two runs must agree in every result column (the accuracy columns may differ: an order check ran in one only). */
function agree(r: Run, a: string[], b: string[]): string | null {
  const h = r.spectrum[0];
  for (let c = 0; c < h.length; c++) {
    if (columnOf(h[c], r.summary.receiverColumns).diagnostic) continue;
    const x = num(a[c]), y = num(b[c]);
    const same = x === null || y === null || Number.isNaN(x) || Number.isNaN(y) ? a[c] === b[c] : Math.abs(x - y) <= AGREEMENT * Math.max(Math.abs(x), Math.abs(y), 1e-300);
    if (!same) return `${h[c]} ${b[c] === '' ? '(blank)' : b[c]} against ${a[c] === '' ? '(blank)' : a[c]}`;
  }
  return null;
}

/** Each frequency once, ascending: its point (for the bands and the summary) and its spectrum row as written. */
function mergePoints(runs: readonly Run[]): { row: string[]; point: ReportPoint }[] {
  const by = new Map<number, { run: Run; row: string[]; point: ReportPoint }>();
  for (const r of runs) {
    for (const row of r.spectrum.slice(1)) {
      const point = pointOf(r, row), seen = by.get(point.frequencyHz);
      if (!seen) {
        by.set(point.frequencyHz, { run: r, row, point });
        continue;
      }
      const why = agree(r, seen.row, row);
      if (why) throw new UsageError(`cannot merge: ${hz(point.frequencyHz)} Hz was solved in ${seen.run.dir} and in ${r.dir} with different results (${why}); solve it once more, or leave one of the runs out`);
      // keep the one that carries an order check
      if (seen.point.accuracy?.orderCheckDb === null && point.accuracy?.orderCheckDb !== null) by.set(point.frequencyHz, { run: r, row, point });
    }
  }
  return [...by.values()].sort((a, b) => a.point.frequencyHz - b.point.frequencyHz);
}
