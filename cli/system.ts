/**
 * quietgrid export-system / import-solution: the linear system at one frequency out to another
 * solver as Matrix Market files, and that solver's answer back in as the usual report.
 */
import { performance } from 'node:perf_hooks';
import { readMatrixMarketVector, relativeResidual, writeMatrixMarket, writeMatrixMarketVector } from '../engine/linalg/index.ts';
import { describeFileError, readTextFile, writeFileAtomicIn } from '../engine/node/files.ts';
import { describeSweep } from '../engine/sweep/job.ts';
import { recordOf, reportInput, type SweepRecord } from '../engine/sweep/record.ts';
import type { SweepDescription } from '../engine/sweep/protocol.ts';
import type { SweepEvent } from '../engine/sweep/scheduler.ts';
import type { AssessedPoint } from '../engine/solve/points.ts';
import {
  prepareGuarded,
  EXIT_OK, UsageError, defaultOutDir, fieldWriter, hz, loadScenario, parseFrequency, parseOptions, peakMemoryBytes, scenarioPath, writeReport, type Io,
} from './common.ts';

const ROUND_TRIP = `Round trip with another solver:
  quietgrid export-system S.json --frequency 250 --out A.mtx      writes A.mtx and A.rhs.mtx
  (solve A x = b elsewhere; write x as a Matrix Market "array complex general" column)
  quietgrid import-solution S.json --frequency 250 --solution X.mtx --out DIR
Both commands must be given the same scenario file and the same frequency: the system depends on
both, and the mesh on the scenario's whole sweep. import-solution prints the relative residual
‖A x − b‖ / ‖b‖ of the solution it was given, so a mismatch shows.`;

export const EXPORT_HELP = `Usage: quietgrid export-system SCENARIO.json --frequency HZ --out A.mtx

Writes the assembled finite-element system A x = b at one frequency in the Matrix Market exchange
format (NIST): A.mtx as "coordinate complex symmetric" (lower triangle, 1-based), and the
right-hand side b next to it as A.rhs.mtx, "array complex general". A is complex symmetric, not
Hermitian (the weak form is bilinear). Unknowns are peak pressures, Pa, at the mesh nodes.

Options:
  --frequency HZ   the frequency, at most the top of the scenario's sweep
  --out A.mtx      the matrix file; the right-hand side goes beside it as A.rhs.mtx
  --help           this text

${ROUND_TRIP}
`;

export const IMPORT_HELP = `Usage: quietgrid import-solution SCENARIO.json --frequency HZ --solution X.mtx [--out DIR]

Reads the solution x of the system written by export-system (same scenario, same frequency) and
writes the same report files as quietgrid solve for that one frequency.

Options:
  --frequency HZ     the frequency the system was exported at
  --solution X.mtx   the solution vector, Matrix Market "array" (complex or real), one entry per unknown
  --out DIR          folder for spectrum.csv, bands.csv, summary.json (default results/<scenario file name>)
  --fields DIR       also write the field as DIR/field-<f>Hz.vtu
  --help             this text

${ROUND_TRIP}
`;

// A Matrix Market vector takes about 50 bytes per unknown; this admits some eight million of them.
const MAX_SOLUTION_BYTES = 400_000_000;
// Above this the solution does not belong to this system (wrong scenario, frequency or solver failure).
const RESIDUAL_WARNING = 1e-6;

const EXPORT_OPTIONS = { frequency: { type: 'string' }, out: { type: 'string' }, yes: { type: 'boolean' }, help: { type: 'boolean' } } as const;
const IMPORT_OPTIONS = { ...EXPORT_OPTIONS, solution: { type: 'string' }, fields: { type: 'string' } } as const;


/** A.mtx → A.rhs.mtx; any other name gets .rhs.mtx appended. */
export function rhsPath(matrixPath: string): string {
  return matrixPath.endsWith('.mtx') ? `${matrixPath.slice(0, -4)}.rhs.mtx` : `${matrixPath}.rhs.mtx`;
}

/** Comment lines after the Matrix Market header say where the system came from. */
function withComments(text: string, comments: string[]): string {
  const end = text.indexOf('\n');
  const lines = comments.map((c) => `% ${c.replace(/[\r\n]+/g, ' ')}`).join('\n');
  return `${text.slice(0, end + 1)}${lines}\n${text.slice(end + 1)}`;
}

export async function exportCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('export-system', args, EXPORT_OPTIONS);
  if (values.help) {
    io.out(EXPORT_HELP);
    return EXIT_OK;
  }
  const loaded = await loadScenario(scenarioPath('export-system', positionals));
  const f = parseFrequency('--frequency', values.frequency, loaded.scenario);
  if (values.out === undefined) throw new UsageError('--out A.mtx is required: the file for the matrix (the right-hand side goes beside it)');
  const { A, b } = prepareGuarded(loaded, values.yes === true).system(f);
  const about = [`quietgrid system A x = b at f = ${f} Hz`, `scenario: ${loaded.path} (${loaded.scenario.title})`, 'unknowns: peak pressure, Pa, at the mesh nodes; time dependence e^{+jwt}'];
  const rhs = rhsPath(values.out);
  await writeFileAtomicIn(values.out, withComments(writeMatrixMarket(A), [...about, 'A: complex symmetric (not Hermitian), lower triangle']));
  await writeFileAtomicIn(rhs, withComments(writeMatrixMarketVector(b), [...about, 'b: the right-hand side']));
  io.out(`Wrote ${values.out} (${A.n} × ${A.n}, ${A.colIdx.length} entries in both triangles) and ${rhs}`);
  return EXIT_OK;
}

export async function importCommand(args: string[], io: Io): Promise<number> {
  const { values, positionals } = parseOptions('import-solution', args, IMPORT_OPTIONS);
  if (values.help) {
    io.out(IMPORT_HELP);
    return EXIT_OK;
  }
  const loaded = await loadScenario(scenarioPath('import-solution', positionals));
  const f = parseFrequency('--frequency', values.frequency, loaded.scenario);
  if (values.solution === undefined) throw new UsageError('--solution X.mtx is required: the solution vector from the other solver');
  const start = performance.now();
  const p = prepareGuarded(loaded, values.yes === true);
  const x = await readSolution(values.solution, p.info.dofs);
  const { A, b } = p.system(f);
  const residual = relativeResidual(A, x, b);
  io.out(`Read ${values.solution}: ${p.info.dofs} unknowns; relative residual ‖Ax − b‖/‖b‖ = ${residual.toExponential(2)}`);
  if (!(residual <= RESIDUAL_WARNING)) io.err(`quietgrid: warning: the residual ${residual.toExponential(2)} is large: was the system exported from ${loaded.path} at ${hz(f)} Hz, and did the other solver converge?`);
  // the external solve's cost is unknown here; its residual is what was just measured
  const solved = p.results(f, x, { assembleSeconds: 0, factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, residual });
  const point = { ...solved, accuracy: p.assess(solved) };
  const notes = [`Solution imported from ${values.solution}, relative residual ${residual.toExponential(3)}; the timings do not include the external solve.`];
  const dir = values.out ?? defaultOutDir(loaded.path);
  const record = importedRecord(describeSweep(loaded.scenario, loaded.warnings, p), point);
  const { files } = await writeReport(dir, reportInput(record, { totalSeconds: (performance.now() - start) / 1000, peakMemoryBytes: peakMemoryBytes(), notes })!);
  if (values.fields !== undefined) files.push((await fieldWriter(values.fields, p)({ ...point, field: x }))!);
  io.out(`Wrote ${files.join(', ')}`);
  return EXIT_OK;
}

/** The record of a one-frequency run whose solve happened elsewhere: the same events a sweep reports. */
function importedRecord(description: SweepDescription, point: AssessedPoint): SweepRecord {
  const events: SweepEvent[] = [
    { type: 'queued', frequenciesHz: [point.frequencyHz], checkHz: [], at: 0 },
    { type: 'ready', description, prepareSeconds: 0, at: 0 },
    { type: 'result', point, at: 0 },
    { type: 'done', cancelled: false, unsolved: [], at: 0 },
  ];
  return recordOf(events, 0);
}

async function readSolution(path: string, dofs: number) {
  let text: string;
  try {
    text = await readTextFile(path, MAX_SOLUTION_BYTES);
  } catch (e) {
    throw new UsageError(`cannot read the solution: ${describeFileError(e, path)}`);
  }
  let x;
  try {
    x = readMatrixMarketVector(text);
  } catch (e) {
    throw new UsageError(`${path}: ${e instanceof Error ? e.message : String(e)}; the solution must be a Matrix Market "array" column vector`);
  }
  if (x.re.length !== dofs) {
    throw new UsageError(`${path} has ${x.re.length} entries but the system of this scenario has ${dofs} unknowns: export the system with the same scenario file and solve that one`);
  }
  return x;
}
