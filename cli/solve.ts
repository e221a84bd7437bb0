/**
 * quietgrid solve: the whole sweep (or a subset) of one scenario, in worker threads, to
 * spectrum.csv, bands.csv and summary.json; optionally the fields as .vtu files.
 */
import { performance } from 'node:perf_hooks';
import type { PointResult } from '../engine/solve/points.ts';
import type { Problem } from '../engine/solve/problem.ts';
import { defaultWorkerCount, solveFrequencies, type PointFailure, type PoolOutcome } from '../engine/node/pool.ts';
import {
  prepareGuarded,
  EXIT_FAILED, EXIT_INTERRUPTED, EXIT_OK, UsageError, defaultOutDir, describeDefaults, describeWarnings, fieldWriter, hz, loadScenario,
  megabytes, parseFrequencyList, parseOptions, parseWorkers, scenarioPath, writeReport, type Io, type Loaded,
} from './common.ts';
import { Progress } from './progress.ts';
import { defaultOrderCheckFrequencies } from '../engine/sweep/plan.ts';

export const SOLVE_HELP = `Usage: quietgrid solve SCENARIO.json [options]

Solves the scenario at every frequency of its sweep and writes
  DIR/spectrum.csv   one row per frequency (TL, reflection, energy balance; or SPL per receiver),
                     each with its accuracy columns and flags (see README, "Reading the accuracy columns")
  DIR/bands.csv      band values (TL from the mean transmitted power; SPL as energy means),
                     with a source power also the outlet sound power and its A-weighted level
  DIR/summary.json   mesh, timings, cut-on frequencies, defaults used, warnings, failures, cautions
Each file is written to a temporary name and renamed, so a file is either whole or absent.

Options:
  --out DIR            folder for the results (default results/<scenario file name>)
  --frequencies LIST   solve only these frequencies, Hz, separated by commas (e.g. 125,250,500).
                       Any positive frequencies are allowed, not only those of the sweep, but the
                       mesh stays graded for the top of the scenario's own sweep, so results can be
                       merged with other runs of the same scenario; frequencies above that top are
                       refused (the mesh would be too coarse): raise the sweep in the scenario instead.
  --fields DIR         also write the pressure field at each frequency as DIR/field-<f>Hz.vtu
                       (VTK XML unstructured grid; absorbing layers left out)
  --workers N          worker threads (default: the cores, as many as there are solves and
                       as free memory allows); 1 solves in the main thread
  --check-order        re-solve every frequency at element order p + 1 (column order_check_db)
  --no-check-order     skip that check; by default it runs at the top frequency and two more
                       spread over the sweep (at most 3), in the same worker threads
  --yes                run even when the scenario implies more than 250 000 unknowns (the
                       run stops before solving otherwise, and says which levers shrink it)
  --help               this text

Progress goes to stderr: a bar when it is a terminal, one line per frequency otherwise.
Ctrl-C stops the run and still writes the frequencies already solved.
Exit status: 0 solved; 1 a frequency failed (the others are still written, the failures are
listed in summary.json); 2 invalid input; 130 stopped by Ctrl-C.
`;

const OPTIONS = {
  out: { type: 'string' },
  frequencies: { type: 'string' },
  fields: { type: 'string' },
  workers: { type: 'string' },
  'check-order': { type: 'boolean' },
  'no-check-order': { type: 'boolean' },
  yes: { type: 'boolean' },
  help: { type: 'boolean' },
} as const;

/** The frequencies of the order check at p + 1: all, none, or by default at most three. */
export function orderCheckFrequencies(frequencies: readonly number[], all: boolean | undefined, none: boolean | undefined): number[] {
  if (all && none) throw new UsageError('--check-order and --no-check-order contradict each other: give one of them (or neither, for the default of at most three frequencies)');
  if (none) return [];
  return all ? [...frequencies] : defaultOrderCheckFrequencies(frequencies);
}

export async function solveCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('solve', args, OPTIONS);
  if (values.help) {
    io.out(SOLVE_HELP);
    return EXIT_OK;
  }
  const loaded = await loadScenario(scenarioPath('solve', positionals));
  const frequencies = values.frequencies !== undefined ? parseFrequencyList(values.frequencies, loaded.scenario) : [...loaded.scenario.sweep.frequenciesHz];
  const requestedWorkers = parseWorkers(values.workers);
  const checks = orderCheckFrequencies(frequencies, values['check-order'], values['no-check-order']);
  const prepared = prepareGuarded(loaded, values.yes === true);
  describeRun(loaded, prepared, io);
  const jobs = frequencies.length + checks.length;
  const workers = requestedWorkers ?? defaultWorkerCount(jobs, prepared.info.workerMemoryBytes);
  io.out(`Solving ${frequencies.length} frequenc${frequencies.length === 1 ? 'y' : 'ies'} (${hz(frequencies[0])}–${hz(frequencies[frequencies.length - 1])} Hz) ${Math.min(workers, jobs) > 1 ? `in ${Math.min(workers, jobs)} worker threads` : 'in the main thread'}`);
  io.out(checks.length === 0
    ? 'Order check: off (--no-check-order)'
    : `Order check: ${checks.length === frequencies.length && checks.length > 3 ? 'every frequency' : checks.map(hz).join(', ') + ' Hz'} again at order ${prepared.info.order + 1} (--check-order for every frequency, --no-check-order for none)`);
  const start = performance.now();
  const { outcome, fieldError } = await sweep(loaded, prepared, frequencies, checks, workers, values.fields);
  const dir = values.out ?? defaultOutDir(loaded.path);
  const failures: PointFailure[] = [...outcome.failures, ...outcome.unsolved.map((f) => ({ frequencyHz: f, message: 'not solved: the run was stopped' }))];
  const { files, summary } = await writeReport(dir, {
    loaded, prepared, points: outcome.results, frequenciesHz: frequencies, failures, totalSeconds: (performance.now() - start) / 1000,
    checks: outcome.checks, checkFailures: outcome.checkFailures,
  });
  io.out(`Wrote ${files.join(', ')}${values.fields !== undefined && !fieldError ? `, and the fields in ${values.fields}` : ''}`);
  for (const line of describeFlags(summary.accuracy.flagsByFrequency)) io.out(line);
  for (const f of outcome.checkFailures) io.err(`quietgrid: warning: the order check at ${hz(f.frequencyHz)} Hz failed (the result there stands, unchecked): ${f.message}`);
  if (fieldError) io.err(`quietgrid: cannot write the field files: ${fieldError}`);
  return fieldError ? Math.max(EXIT_FAILED, finalStatus(outcome, io)) : finalStatus(outcome, io);
}

/** One line per flagged frequency, or one saying none fired. */
export function describeFlags(byFrequency: readonly { frequencyHz: number; flags: readonly string[] }[]): string[] {
  const flagged = byFrequency.filter((x) => x.flags.length > 0);
  if (flagged.length === 0) return ['Accuracy flags: none (spectrum.csv column "flags"; see README, "Reading the accuracy columns")'];
  return [
    `Accuracy flags at ${flagged.length} of ${byFrequency.length} frequencies (what they mean and what to do: summary.json "accuracy", README "Reading the accuracy columns"):`,
    ...flagged.map((x) => `  ${hz(x.frequencyHz)} Hz: ${x.flags.join(', ')}`),
  ];
}


function describeRun(loaded: Loaded, prepared: Problem, io: Io): void {
  const { scenario: s } = loaded, i = prepared.info;
  io.out(`Scenario: ${s.title} (${s.kind})`);
  io.out(`Mesh: order ${i.order}, ${i.elements} elements, ${i.dofs} dofs, ${i.layers} absorbing layers (${i.absorberKind}), graded for ${hz(i.topFrequencyHz)} Hz at ${i.pointsPerWavelength} points per wavelength`);
  io.out(`Solver: ${i.nnz} matrix entries, ${i.factorNonzeros} factor entries; memory about ${megabytes(i.workerMemoryBytes)} per worker, of which the factor ${megabytes(i.memoryEstimateBytes)}`);
  for (const line of [...describeDefaults(s), ...describeWarnings(loaded.warnings)]) io.out(line);
}

/** Runs the pool with progress on stderr, Ctrl-C as cancel, and fields written as they arrive. */
async function sweep(loaded: Loaded, prepared: Problem, frequencies: number[], checks: number[], workers: number, fieldsDir: string | undefined): Promise<{ outcome: PoolOutcome; fieldError?: string }> {
  const progress = new Progress(frequencies.length + checks.length, process.stderr, () => performance.now());
  const writeField = fieldsDir !== undefined ? fieldWriter(fieldsDir, prepared) : undefined;
  let fieldWrites: Promise<unknown> = Promise.resolve(), fieldError: string | undefined;
  const onResult = (point: PointResult) => {
    progress.solved(point);
    if (!writeField) return;
    // One field file at a time, and the field dropped once written: a sweep keeps no fields in memory.
    fieldWrites = fieldWrites.then(() => writeField(point)).then(() => { point.field = undefined; }, (e: unknown) => {
      point.field = undefined;
      fieldError ??= e instanceof Error ? e.message : String(e);
    });
  };
  const run = solveFrequencies(loaded.scenario, frequencies, {
    workers, prepared, keepFields: writeField !== undefined, onResult, onFailure: (f) => progress.failed(f.frequencyHz, f.message),
    checkFrequencies: checks, onCheck: (p) => progress.checked(p, prepared.info.order + 1), onCheckFailure: (f) => progress.checkFailed(f.frequencyHz, f.message),
  });
  const onInterrupt = () => run.cancel();
  process.once('SIGINT', onInterrupt);
  try {
    const outcome = await run.done;
    await fieldWrites;
    return { outcome, fieldError };
  } finally {
    process.removeListener('SIGINT', onInterrupt);
    progress.finish();
  }
}

function finalStatus(outcome: PoolOutcome, io: Io): number {
  if (outcome.cancelled) {
    io.err(`Stopped: ${outcome.results.length} frequencies solved and written, ${outcome.unsolved.length} not solved.`);
    return EXIT_INTERRUPTED;
  }
  if (outcome.failures.length > 0) {
    for (const f of outcome.failures) io.err(`quietgrid: the solve failed at ${hz(f.frequencyHz)} Hz: ${f.message}`);
    io.err(`${outcome.failures.length} of ${outcome.failures.length + outcome.results.length} frequencies failed; the others are written, the failures listed in summary.json.`);
    return EXIT_FAILED;
  }
  return EXIT_OK;
}
