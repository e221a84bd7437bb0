/**
 * The one message protocol between a host (the CLI's main thread, the app's renderer) and its engine
 * workers (worker_threads in engine/node, Web Workers in app/renderer): declared once, as two maps from
 * message type to payload. Both sides import it. Every message is a plain object with a `type`; large
 * arrays (solved fields, field slices) travel as transferred buffers, listed by `transferOf`, never copied.
 *
 * A worker plays one role for its whole life, fixed by its first message:
 *   solve     'prepare' once, then one 'solve' per frequency and one 'check' per order check
 *   field     'prepare' once, keep the fields handed to it ('field'), answer 'slice' requests
 *   estimate  one 'estimate' per request: prepare only, report the mesh and solver sizes
 * The worker side of every role is engine/sweep/job.ts; the scheduler of the solve role is
 * engine/sweep/scheduler.ts.
 *
 * Adding a message: a key and its payload in the map, its buffers in transferOf if it carries any, its
 * handler in job.ts (to a worker) or in the scheduler or service that receives it (from a worker).
 */
import type { MeshInfo, ProblemDescription } from '../solve/problem.ts';
import type { AssessedPoint, PointResult } from '../solve/points.ts';
import type { Slice, SliceRequest } from '../solve/slice.ts';
import type { ReportScenario } from '../report/results.ts';

export type { Slice, SliceRequest };

export type WorkerRole = 'solve' | 'field';

/** What the report says about a prepared sweep: the problem's own description, the scenario as the report reads it, the file's warnings. */
export interface SweepDescription {
  problem: ProblemDescription;
  scenario: ReportScenario;
  warnings: { message: string }[];
}

/** Messages to a worker, keyed by type. */
export interface ToWorkerMap {
  /**
   * Prepare the scenario: the scenario file's value (the worker validates it itself). allowLarge: the user
   * confirmed a problem above the engine's size limit (LARGE_PROBLEM_DOFS); the order check's finer problem
   * is held to the same limit.
   */
  prepare: { role: WorkerRole; scenario: unknown; keepFields: boolean; allowLarge: boolean };
  solve: { frequencyHz: number };
  /** The order check: solve the frequency again one element order higher. */
  check: { frequencyHz: number };
  estimate: { id: number; scenario: unknown; allowLarge: boolean };
  /** A solved field (the solver's unknowns) for a field worker to keep. */
  field: { frequencyHz: number; re: Float64Array; im: Float64Array };
  slice: { id: number; frequencyHz: number; request: SliceRequest };
}

/** Messages from a worker, keyed by type. */
export interface FromWorkerMap {
  /** Prepared: the description the report needs, and how long preparing took. */
  ready: { description: SweepDescription; prepareSeconds: number };
  /** A solved frequency with its own accuracy figures; its field (if kept) transferred. */
  result: { point: AssessedPoint };
  failure: { frequencyHz: number; message: string };
  /** An order check done: the same frequency solved one element order higher (no field). */
  checked: { frequencyHz: number; point: PointResult };
  'check-failure': { frequencyHz: number; message: string };
  /** The scenario cannot be prepared: the worker can do nothing more. */
  fatal: { message: string };
  estimate: { id: number; info: MeshInfo; prepareSeconds: number };
  /** tooLarge: refused by the size limit before any grid was built. */
  'estimate-error': { id: number; message: string; tooLarge: boolean };
  slice: { id: number; slice: Slice };
  'slice-error': { id: number; message: string };
}

type Tagged<M> = { [K in keyof M]: { type: K } & M[K] }[keyof M];
export type ToWorker = Tagged<ToWorkerMap>;
export type FromWorker = Tagged<FromWorkerMap>;

/** The buffers a message hands over instead of copying (its arrays are unusable by the sender afterwards). */
export function transferOf(message: ToWorker | FromWorker): ArrayBuffer[] {
  switch (message.type) {
    case 'field':
      return distinct([message.re.buffer, message.im.buffer]);
    case 'result':
      return message.point.field ? distinct([message.point.field.re.buffer, message.point.field.im.buffer]) : [];
    case 'slice':
      return 'slice' in message ? distinct([message.slice.u.buffer, message.slice.v.buffer, message.slice.re.buffer, message.slice.im.buffer]) : [];
    default:
      return [];
  }
}

function distinct(buffers: ArrayBufferLike[]): ArrayBuffer[] {
  return [...new Set(buffers)] as ArrayBuffer[];
}

/**
 * What a host needs of a worker: the shape of a Web Worker, which the app passes as it is; engine/node
 * wraps a worker_threads Worker (and a job in its own thread) into it; tests fake it.
 */
export interface WorkerPort {
  postMessage(message: ToWorker, transfer: ArrayBuffer[]): void;
  terminate(): void;
  onmessage: ((event: { data: FromWorker }) => void) | null;
  onerror: ((event: { message?: string; preventDefault?: () => void }) => void) | null;
}

/** Sends a message with its buffers transferred. */
export function send(port: WorkerPort, message: ToWorker): void {
  port.postMessage(message, transferOf(message));
}
