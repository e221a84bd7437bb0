/**
 * The one message protocol between the renderer and its engine workers (app/renderer/engine.worker.ts).
 * Both sides import it. Every message is a plain object with a `type`; large arrays (solved fields and
 * field slices) travel as transferred buffers, listed by `transferOf`, never copied.
 *
 * A worker plays one role for its whole life:
 *   solve     prepare once, then one 'solve' per frequency (a worker of the run pool)
 *   estimate  one 'estimate' per request: prepare only, report the mesh and solver sizes
 *   field     prepare once, keep the fields handed to it, and answer 'slice' requests
 */
import type { MeshInfo } from '../../engine/solve/problem.ts';
import type { PointAccuracy, PointResult } from '../../engine/solve/points.ts';
import type { DuctMode } from '../../engine/acoustics/index.ts';

export interface SectionCutOns { section: string; modes: DuctMode[] }

/** A solved point with its own accuracy figures and flags (engine/solve/accuracy.ts). */
export type AssessedPoint = PointResult & { accuracy: PointAccuracy };

/** How the points' accuracy is to be read: the engine's legend, meanings and thresholds. */
export interface AccuracyInfo {
  reading: string;
  flagMeanings: Record<string, string>;
  thresholds: Record<string, number>;
  planeWaveValidBelowHz: number | null;
}

/** Axis normal to a slice plane: 0 = x, 1 = y, 2 = z. */
export type Axis = 0 | 1 | 2;

/** The in-plane axes of a plane normal to `axis`, in x, y, z order. */
export function planeAxes(axis: Axis): [Axis, Axis] {
  return axis === 0 ? [1, 2] : axis === 1 ? [0, 2] : [0, 1];
}

export interface SliceRequest {
  axis: Axis;
  /** Coordinate of the plane along its normal, m. */
  position: number;
  /** Samples along the longer in-plane side; the shorter side gets as many as keep the cells square. */
  maxSamples: number;
}

/**
 * A field slice sampled on a regular grid of the plane: value k = i + nu·j lies at (u[i], v[j]), where
 * (u, v) are the plane's axes in x, y, z order (normal x: u = y, v = z; normal y: u = x, v = z; normal z:
 * u = x, v = y). re and im are the complex peak pressure, Pa; NaN where the point is solid.
 */
export interface Slice {
  frequencyHz: number;
  axis: Axis;
  position: number;
  u: Float64Array;
  v: Float64Array;
  re: Float64Array;
  im: Float64Array;
}

/** Messages to a worker, keyed by type. */
export interface ToWorkerMap {
  /** Prepare the scenario (the scenario file's value; the worker validates it again). */
  /** allowLarge: the user confirmed a problem above the engine's size limit (LARGE_PROBLEM_DOFS). */
  prepare: { role: 'solve' | 'field'; scenario: unknown; keepFields: boolean; allowLarge: boolean };
  solve: { frequencyHz: number };
  /** The order check: solve the point's frequency again at element order p + 1 and assess the point with it. */
  check: { point: AssessedPoint };
  estimate: { id: number; scenario: unknown; allowLarge: boolean };
  /** A solved field for a field worker to keep. */
  field: { frequencyHz: number; re: Float64Array; im: Float64Array };
  slice: { id: number; frequencyHz: number; request: SliceRequest };
}

/** Messages from a worker, keyed by type. */
export interface FromWorkerMap {
  /** Prepared: the mesh and solver sizes, and each section's cut-on frequencies up to the top of the sweep. */
  /** orderCheckHz: the engine's default frequencies for the order check of this sweep. */
  ready: { info: MeshInfo; cutOns: SectionCutOns[]; accuracy: AccuracyInfo; orderCheckHz: number[]; prepareSeconds: number };
  result: { point: AssessedPoint };
  checked: { frequencyHz: number; accuracy: PointAccuracy };
  'check-failure': { frequencyHz: number; message: string };
  failure: { frequencyHz: number; message: string };
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

/** What a worker needs of its global scope (a DedicatedWorkerGlobalScope), typed without the WebWorker lib. */
export interface WorkerScope {
  postMessage(message: FromWorker, options: { transfer: Transferable[] }): void;
  onmessage: ((event: MessageEvent<ToWorker>) => void) | null;
}

/** What the renderer needs of a Worker; fakes of it drive the pool in tests. */
export interface WorkerPort {
  postMessage(message: ToWorker, transfer: Transferable[]): void;
  terminate(): void;
  onmessage: ((event: { data: FromWorker }) => void) | null;
  onerror: ((event: { message?: string; preventDefault?: () => void }) => void) | null;
}

/** Sends a message with its buffers transferred. */
export function send(port: WorkerPort, message: ToWorker): void {
  port.postMessage(message, transferOf(message));
}
