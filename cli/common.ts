/**
 * What every command shares: option parsing with our own messages, reading the scenario file into a
 * normalised scenario (exit 2 with the field and the fix when it is wrong), frequencies from the
 * command line, and how results are written.
 */
import { parseArgs, type ParseArgsConfig } from 'node:util';
import { basename, extname, join } from 'node:path';
import { freemem } from 'node:os';
import { DEFAULT_MAX_BYTES, ScenarioError, buildGeometry, formatIssues, parseScenarioText, validateScenario, type Issue, type NormalisedScenario } from '../engine/scenario/index.ts';
import { estimateSize, LARGE_PROBLEM_DOFS, ProblemTooLarge } from '../engine/solve/size.ts';
import { describeFileError, readTextFile, writeFileAtomicIn } from '../engine/node/files.ts';
import { prepareProblem } from '../engine/solve/prepare.ts';
import type { Problem } from '../engine/solve/problem.ts';
import type { PointResult } from '../engine/solve/points.ts';
import { buildReport, tableCsv, type ReportInput, type Summary } from '../engine/report/results.ts';
import { fieldToVtu } from '../engine/report/vtk.ts';
import { dofCoordinates } from '../engine/grid/mesh.ts';

/** Bad input from the user: exit status 2, the message says what to change. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}

export const EXIT_OK = 0;
export const EXIT_FAILED = 1;
export const EXIT_USAGE = 2;
/** 128 + SIGINT, as shells report a program stopped by Ctrl-C. */
export const EXIT_INTERRUPTED = 130;

export interface Io {
  out: (line: string) => void;
  err: (line: string) => void;
}

type Options = NonNullable<ParseArgsConfig['options']>;

/** node:util parseArgs, strict, with its errors reworded for the command at hand. */
export function parseOptions<O extends Options>(command: string, args: string[], options: O) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (e) {
    const code = (e as { code?: string }).code, name = /'(--?[\w-]+)/.exec((e as Error).message)?.[1];
    if (code === 'ERR_PARSE_ARGS_UNKNOWN_OPTION') throw new UsageError(`unknown option ${name ?? ''} for "quietgrid ${command}"; see quietgrid ${command} --help`);
    if (code === 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE') {
      const text = (e as Error).message;
      const problem = /does not take/.test(text) ? 'takes no value' : /ambiguous/.test(text) ? `is followed by a value starting with "-"; write ${name}=VALUE if that is the value` : 'needs a value';
      throw new UsageError(`option ${name ?? ''} ${problem}; see quietgrid ${command} --help`);
    }
    if (code === 'ERR_PARSE_ARGS_UNEXPECTED_POSITIONAL') throw new UsageError(`unexpected argument; see quietgrid ${command} --help`);
    throw e;
  }
}

/** Exactly one positional argument: the scenario file. */
export function scenarioPath(command: string, positionals: string[]): string {
  if (positionals.length === 0) throw new UsageError(`${command} needs a scenario file, e.g. quietgrid ${command} scenarios/plant-room-supply-silencer.json`);
  if (positionals.length > 1) throw new UsageError(`${command} takes one scenario file, got ${positionals.length}: ${positionals.join(' ')}`);
  return positionals[0];
}

/** value: the file's value as parsed (what workers are sent: each validates it itself). */
export interface Loaded { path: string; value: unknown; scenario: NormalisedScenario; warnings: Issue[] }

/** Reads, parses and validates; every problem becomes a UsageError naming the file, the field and the fix. */
export async function loadScenario(path: string): Promise<Loaded> {
  let text: string;
  try {
    text = await readTextFile(path, DEFAULT_MAX_BYTES);
  } catch (e) {
    throw new UsageError(`cannot read the scenario: ${describeFileError(e, path)}`);
  }
  let value: unknown;
  try {
    value = parseScenarioText(text);
  } catch (e) {
    if (e instanceof ScenarioError) throw new UsageError(`${path}: ${e.message}`);
    throw e;
  }
  const result = validateScenario(value);
  if (!result.ok) {
    const n = result.errors.length;
    throw new UsageError(`${path}: the scenario has ${n} error${n === 1 ? '' : 's'}:\n${formatIssues(result.errors)}`);
  }
  return { path, value, scenario: result.scenario, warnings: result.warnings };
}

export function topFrequency(s: NormalisedScenario): number {
  return Math.max(...s.sweep.frequenciesHz);
}

/** A positive frequency no higher than the sweep's top (the mesh is graded for that top, and is too coarse above it). */
export function checkFrequency(option: string, f: number, s: NormalisedScenario): number {
  const top = topFrequency(s);
  if (!(Number.isFinite(f) && f > 0)) throw new UsageError(`${option}: ${f} is not a frequency; give a positive number of Hz`);
  if (f > top * (1 + 1e-9)) {
    throw new UsageError(`${option}: ${f} Hz is above ${hz(top)} Hz, the top of the scenario's sweep, for which the mesh is graded; to solve higher, raise the top of "sweep" in the scenario`);
  }
  return f;
}

/** "125,250, 500" → [125, 250, 500], ascending, duplicates dropped. */
export function parseFrequencyList(text: string, s: NormalisedScenario): number[] {
  const parts = text.split(',').map((t) => t.trim());
  if (parts.some((t) => t === '')) throw new UsageError(`--frequencies: "${text}" has an empty entry; give numbers of Hz separated by commas, e.g. --frequencies 125,250,500`);
  const values = parts.map((t) => {
    const f = Number(t);
    if (!Number.isFinite(f)) throw new UsageError(`--frequencies: "${t}" is not a number; give numbers of Hz separated by commas, e.g. --frequencies 125,250,500`);
    return checkFrequency('--frequencies', f, s);
  });
  return [...new Set(values)].sort((a, b) => a - b);
}

export function parseFrequency(option: string, text: string | undefined, s: NormalisedScenario): number {
  if (text === undefined) throw new UsageError(`${option} HZ is required`);
  const f = Number(text);
  if (text.trim() === '' || !Number.isFinite(f)) throw new UsageError(`${option}: "${text}" is not a number of Hz`);
  return checkFrequency(option, f, s);
}

export function parseWorkers(text: string | undefined): number | undefined {
  if (text === undefined) return undefined;
  const n = Number(text);
  if (!(Number.isInteger(n) && n >= 1 && n <= 1024)) throw new UsageError(`--workers: "${text}" is not a number of worker threads; give a whole number from 1 up`);
  return n;
}

export function defaultOutDir(scenarioFile: string): string {
  return join('results', basename(scenarioFile, extname(scenarioFile)));
}

/** Six significant digits, without trailing noise: 630.957, 125. */
export function hz(f: number): string {
  return String(Number(f.toPrecision(6)));
}

export function megabytes(bytes: number): string {
  return `${(bytes / 1e6).toFixed(1)} MB`;
}

export function peakMemoryBytes(): number {
  // maxRSS is in kilobytes and covers every thread of the process, workers included.
  return process.resourceUsage().maxRSS * 1024;
}

/** spectrum.csv, bands.csv and summary.json in `dir`, each written atomically. */
export async function writeReport(dir: string, input: ReportInput): Promise<{ files: string[]; summary: Summary }> {
  const report = buildReport(input);
  const files = [join(dir, 'spectrum.csv'), join(dir, 'bands.csv'), join(dir, 'summary.json')];
  await writeFileAtomicIn(files[0], tableCsv(report.spectrum));
  await writeFileAtomicIn(files[1], tableCsv(report.bands));
  await writeFileAtomicIn(files[2], `${JSON.stringify(report.summary, null, 2)}\n`);
  return { files, summary: report.summary };
}

/** A writer of field files that keeps the dof coordinates, computed once per mesh. */
export function fieldWriter(dir: string, prepared: Problem): (point: PointResult) => Promise<string | undefined> {
  const mesh = prepared.mesh;
  let xyz: Float64Array | undefined;
  return async (point) => {
    if (!point.field) return undefined;
    xyz ??= dofCoordinates(mesh);
    const file = join(dir, `field-${hz(point.frequencyHz)}Hz.vtu`);
    // the total pressure: upstream of a duct's split plane the solver's unknowns are the reflected wave alone
    await writeFileAtomicIn(file, fieldToVtu(mesh, xyz, prepared.totalField(point.frequencyHz, point.field), { frequencyHz: point.frequencyHz }));
    return file;
  };
}

export function describeDefaults(s: NormalisedScenario): string[] {
  if (s.defaultsUsed.length === 0) return ['Defaults used: none'];
  return ['Defaults used:', ...s.defaultsUsed.map((d) => `  ${d.path} = ${JSON.stringify(d.value)} (${d.why})`)];
}

export function describeWarnings(warnings: readonly Issue[]): string[] {
  return warnings.length === 0 ? [] : ['Warnings:', ...formatIssues(warnings).split('\n').map((l) => `  ${l}`)];
}

/**
 * The problem set up for solving, guarded: above the size limit only with --yes (a length typed in
 * millimetres as metres should not take the machine down), and never when the factor would not fit in
 * the free memory — that stops before any factorisation, with the estimate and the levers.
 */
export function prepareGuarded(loaded: Loaded, confirmed: boolean, freeBytes: number = freemem()): Problem {
  const s = loaded.scenario, size = estimateSize(s, buildGeometry(s));
  if (!confirmed && !(size.dofs <= LARGE_PROBLEM_DOFS)) throw new UsageError(`${loaded.path}: ${new ProblemTooLarge(size, LARGE_PROBLEM_DOFS).message}`);
  let prepared: Problem;
  try {
    prepared = prepareProblem(s, { maxDofs: Infinity });
  } catch (e) {
    // prepareProblem refuses what the engine cannot model, naming the field.
    throw new UsageError(`${loaded.path}: cannot set up the problem: ${e instanceof Error ? e.message : String(e)}`);
  }
  // freeBytes was read before the problem was prepared, so the prepared arrays count against it too
  const need = prepared.info.workerMemoryBytes, free = freeBytes;
  if (need > 0.8 * free) {
    throw new UsageError(`${loaded.path}: one frequency needs about ${megabytes(need)} (its factor alone ${megabytes(prepared.info.memoryEstimateBytes)}, estimated from the symbolic analysis) but only ${megabytes(free)} is free: ` +
      'lower mesh.order or mesh.pointsPerWavelength, lower the sweep\'s top frequency, or split the sweep and solve the high frequencies on a larger machine (quietgrid solve --frequencies …)');
  }
  return prepared;
}
