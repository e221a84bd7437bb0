/**
 * quietgrid solve: the whole sweep (or a subset) of one scenario, in worker threads, to
 * spectrum.csv, bands.csv and summary.json; optionally the fields as .vtu files.
 */
import { performance } from 'node:perf_hooks';
import type { Problem } from '../engine/solve/problem.ts';
import { nodeWorkerCount, solveSweep } from '../engine/node/pool.ts';
import { orderCheckFrequencies as checkFrequencies } from '../engine/sweep/plan.ts';
import { emptyRecord, recordEvent, reportInput, type SweepRecord } from '../engine/sweep/record.ts';
import type { SweepEvent, SweepOutcome } from '../engine/sweep/scheduler.ts';
import {
  prepareGuarded,
  EXIT_FAILED, EXIT_INTERRUPTED, EXIT_OK, UsageError, defaultOutDir, describeDefaults, describeWarnings, fieldWriter, hz, loadScenario,
  megabytes, parseFrequencyList, parseOptions, parseWorkers, peakMemoryBytes, scenarioPath, writeReport, type Io, type Loaded,
} from './common.ts';
import { Progress } from './progress.ts';

export const SOLVE_HELP = `Usage: quietgrid solve SCENARIO.json [options]

Solves the scenario at every frequency of its sweep and writes
  DIR/spectrum.csv   one row per frequency (TL, reflection, energy balance; or SPL per receiver),
                     each with its accuracy columns, the solve's residual and the flags
                     (see README, "Reading the accuracy columns")
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
  --fields DIR         also write the total pressure field at each frequency as
                       DIR/field-<f>Hz.vtu (VTK XML unstructured grid; absorbing layers left out)
  --workers N          worker threads (default: the cores, no more than there are frequencies,
                       as many as free memory allows); 1 solves in the main thread
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
  return checkFrequencies(frequencies, none ? 'none' : all ? 'all' : 'default');
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
  const problem = prepareGuarded(loaded, values.yes === true);
  describeRun(loaded, problem, io);
  const workers = Math.min(requestedWorkers ?? nodeWorkerCount(frequencies.length, problem.info.workerMemoryBytes), frequencies.length);
  io.out(`Solving ${frequencies.length} frequenc${frequencies.length === 1 ? 'y' : 'ies'} (${hz(frequencies[0])}–${hz(frequencies[frequencies.length - 1])} Hz) ${workers > 1 ? `in ${workers} worker threads` : 'in the main thread'}`);
  io.out(checks.length === 0
    ? 'Order check: off (--no-check-order)'
    : `Order check: ${checks.length === frequencies.length && checks.length > 3 ? 'every frequency' : checks.map(hz).join(', ') + ' Hz'} again at order ${problem.info.order + 1} (--check-order for every frequency, --no-check-order for none)`);
  const start = performance.now();
  const { record, outcome, fieldError } = await sweep(loaded, problem, frequencies, checks, workers, values.fields);
  const dir = values.out ?? defaultOutDir(loaded.path);
  const input = reportInput(record, { totalSeconds: (performance.now() - start) / 1000, peakMemoryBytes: peakMemoryBytes() });
  if (!input) throw new Error('no worker could describe the problem'); // prepareGuarded prepared it here already
  const { files, summary } = await writeReport(dir, input);
  io.out(`Wrote ${files.join(', ')}${values.fields !== undefined && !fieldError ? `, and the fields in ${values.fields}` : ''}`);
  for (const line of describeFlags(summary.accuracy.flagsByFrequency)) io.out(line);
  for (const c of record.checks) if (c.status === 'failed') io.err(`quietgrid: warning: the order check at ${hz(c.frequencyHz)} Hz failed (the result there stands, unchecked): ${c.message}`);
  if (fieldError) io.err(`quietgrid: cannot write the field files: ${fieldError}`);
  return fieldError ? Math.max(EXIT_FAILED, finalStatus(record, outcome, io)) : finalStatus(record, outcome, io);
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


function describeRun(loaded: Loaded, problem: Problem, io: Io): void {
  const { scenario: s } = loaded, i = problem.info;
  io.out(`Scenario: ${s.title} (${s.kind})`);
  io.out(`Mesh: order ${i.order}, ${i.elements} elements, ${i.dofs} dofs, ${i.layers} absorbing layers (${i.absorberKind}), graded for ${hz(i.topFrequencyHz)} Hz at ${i.pointsPerWavelength} points per wavelength`);
  io.out(`Solver: ${i.nnz} matrix entries, ${i.factorNonzeros} factor entries; memory about ${megabytes(i.workerMemoryBytes)} per worker, of which the factor ${megabytes(i.memoryEstimateBytes)}`);
  for (const line of [...describeDefaults(s), ...describeWarnings(loaded.warnings)]) io.out(line);
}

/** Runs the sweep with progress on stderr, Ctrl-C as cancel, and fields written as they arrive; the run's record at the end. */
async function sweep(loaded: Loaded, problem: Problem, frequencies: number[], checks: number[], workers: number, fieldsDir: string | undefined): Promise<{ record: SweepRecord; outcome: SweepOutcome; fieldError?: string }> {
  const progress = new Progress(frequencies.length + checks.length, process.stderr, () => performance.now());
  const writeField = fieldsDir !== undefined ? fieldWriter(fieldsDir, problem) : undefined;
  let record = emptyRecord(performance.now()), fieldWrites: Promise<unknown> = Promise.resolve(), fieldError: string | undefined;
  const onEvent = (e: SweepEvent) => {
    record = recordEvent(record, e);
    if (e.type === 'result') {
      progress.solved(e.point);
      // One field file at a time; the record keeps no fields, so a written one goes with its event.
      const point = e.point;
      if (writeField) fieldWrites = fieldWrites.then(() => writeField(point)).catch((err: unknown) => { fieldError ??= err instanceof Error ? err.message : String(err); });
    } else if (e.type === 'failure') progress.failed(e.frequencyHz, e.message);
    else if (e.type === 'checked') progress.checked(e.point, problem.info.order + 1);
    else if (e.type === 'check-failure') progress.checkFailed(e.frequencyHz, e.message);
  };
  const run = solveSweep({
    scenario: loaded.value, plan: frequencies, checkHz: checks, workers, keepFields: writeField !== undefined, allowLarge: true, preset: problem, onEvent,
  });
  const onInterrupt = () => run.cancel();
  process.once('SIGINT', onInterrupt);
  try {
    const outcome = await run.done;
    await fieldWrites;
    return { record, outcome, fieldError };
  } finally {
    process.removeListener('SIGINT', onInterrupt);
    progress.finish();
  }
}

function finalStatus(record: SweepRecord, outcome: SweepOutcome, io: Io): number {
  const failed = record.frequencies.filter((s) => s.status === 'failed'), unsolved = record.frequencies.filter((s) => s.status === 'unsolved');
  if (outcome.cancelled) {
    io.err(`Stopped: ${record.points.length} frequencies solved and written, ${unsolved.length} not solved.`);
    return EXIT_INTERRUPTED;
  }
  if (failed.length > 0) {
    for (const f of failed) io.err(`quietgrid: the solve failed at ${hz(f.frequencyHz)} Hz: ${f.message}`);
    io.err(`${failed.length} of ${failed.length + record.points.length} frequencies failed; the others are written, the failures listed in summary.json.`);
    return EXIT_FAILED;
  }
  return EXIT_OK;
}
