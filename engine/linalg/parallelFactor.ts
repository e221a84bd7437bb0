/**
 * One factorisation on several threads sharing memory: each thread factors whole subtrees of the
 * assembly tree (parallelPlan.ts) into the one factor, every thread in its own arena and stack; the
 * update matrices of the subtrees' roots cross over in a shared handoff buffer, and the calling thread
 * factors the fronts above them when the others are done.
 *
 * The engine starts no threads: a host gives it HelperThreads (engine/node/factorThreads.ts with
 * worker_threads; a Web Worker host where the page is cross-origin isolated), each of which runs
 * serveFactorHelper(setup) on the setup it is posted. Thread and caller meet on Atomics in shared
 * memory, so factor() stays synchronous: the caller waits with Atomics.wait, which Node allows on any
 * thread and browsers in workers.
 */
import type { ComplexCsr } from './sparse.ts';
import type { Symbolic } from './symbolic.ts';
import type { FrontDiagonal } from './frontal.ts';
import { createArena, arenaLayout, type ArenaSizes } from './frontArena.ts';
import type { KernelKind } from './denseKernels.ts';
import { factorFronts, PivotGuard, type FrontStructure, type Handoff } from './fronts.ts';
import { NonFiniteMatrixError, SingularSystemError } from './errors.ts';
import { planParallel, type ParallelPlan } from './parallelPlan.ts';

/** Threads a host lends to a factorisation. */
export interface HelperThreads {
  /** Helper threads besides the calling one. */
  readonly size: number;
  /** Starts helper i on the setup (its typed arrays are views of SharedArrayBuffers): the helper runs serveFactorHelper(setup) until told to stop. */
  post(i: number, setup: HelperSetup): void;
  /** Ends the helpers (after a last 'stop' they exit by themselves). */
  close(): void;
}

/** What a helper is given once per workspace: shared views only (plus numbers), so posting it copies nothing large. */
export interface HelperSetup {
  kind: 'quietgrid-factor-helper';
  S: FrontStructure;
  A: ComplexCsr; // pattern and values (the values are rewritten before every factorisation)
  panels: Float64Array; scale: Float64Array; diagonal: FrontDiagonal; handoff: Handoff;
  list: Int32Array; arena: ArenaSizes; kernel: KernelKind;
  control: Int32Array; // CONTROL_INTS: sequence numbers and the error's kind and text
  numbers: Float64Array; // NUMBERS: tolerance and limit in, pivot statistics and error figures out
}

const SEQ = 0, DONE = 1, ERROR_KIND = 2, ERROR_LEN = 3, ERROR_TEXT = 4, TEXT_MAX = 400, CONTROL_INTS = ERROR_TEXT + TEXT_MAX;
const TOLERANCE = 0, LIMIT = 1, COUNT = 2, MIN_RATIO = 3, MIN_AT = 4, MIN_MAG = 5, E1 = 6, E2 = 7, E3 = 8, E4 = 9, NUMBERS = 10;
const STOP = -1;
const NO_ERROR = 0, SINGULAR = 1, NON_FINITE = 2, OTHER = 3;

const shared = <T extends Float64Array | Int32Array>(Ctor: { new (b: SharedArrayBuffer): T; BYTES_PER_ELEMENT: number }, length: number): T =>
  new Ctor(new SharedArrayBuffer(Math.max(1, length) * Ctor.BYTES_PER_ELEMENT));
function sharedCopy<T extends Float64Array | Int32Array>(a: T): T {
  const out = new (a.constructor as { new (b: SharedArrayBuffer): T })(new SharedArrayBuffer(Math.max(8, a.byteLength)));
  out.set(a);
  return out.subarray(0, a.length) as T;
}

/** The shared memory and helpers of a workspace that factors with threads. */
export class ParallelState {
  readonly plan: ParallelPlan;
  readonly S: FrontStructure;
  readonly A: ComplexCsr; // shared pattern, values copied in at every factorisation
  readonly panels: Float64Array;
  readonly scale: Float64Array;
  readonly diagonal: FrontDiagonal;
  readonly handoff: Handoff;
  private readonly setups: HelperSetup[] = [];
  private started = false;

  constructor(readonly symbolic: Symbolic, A: ComplexCsr, readonly threads: HelperThreads, readonly kernel: KernelKind) {
    this.plan = planParallel(symbolic, threads.size + 1);
    const S = symbolic, n = S.n;
    this.S = {
      n, nSuper: S.nSuper, perm: sharedCopy(S.perm), pinv: sharedCopy(S.pinv), superStart: sharedCopy(S.superStart), rowPtr: sharedCopy(S.rowPtr),
      rowIdx: sharedCopy(S.rowIdx), childPtr: sharedCopy(S.childPtr), child: sharedCopy(S.child), panelPtr: sharedCopy(S.panelPtr),
    };
    this.A = { n, rowPtr: sharedCopy(A.rowPtr), colIdx: sharedCopy(A.colIdx), re: shared(Float64Array, S.nnzA), im: shared(Float64Array, S.nnzA) };
    this.panels = shared(Float64Array, 2 * S.storedEntries);
    this.scale = shared(Float64Array, n);
    this.diagonal = { dRe: shared(Float64Array, n), dIm: shared(Float64Array, n), invRe: shared(Float64Array, n), invIm: shared(Float64Array, n) };
    this.handoff = { at: sharedCopy(this.plan.handoffAt), buf: shared(Float64Array, this.plan.handoffDoubles) };
    for (let t = 1; t < this.plan.threads; t++) {
      this.setups.push({
        kind: 'quietgrid-factor-helper', S: this.S, A: this.A, panels: this.panels, scale: this.scale, diagonal: this.diagonal, handoff: this.handoff,
        list: sharedCopy(this.plan.lists[t]), arena: this.plan.arenas[t], kernel, control: shared(Int32Array, CONTROL_INTS), numbers: shared(Float64Array, NUMBERS),
      });
    }
  }

  /** Bytes of the memory beyond a sequential workspace's: the helpers' arenas, the shared copies of the pattern and analysis, and the handoff. */
  extraBytes(): number {
    const S = this.symbolic;
    const arenas = this.plan.arenas.slice(1).reduce((a, z) => a + arenaLayout(z).bytes + 4 * S.n, 0);
    return arenas + 8 * this.plan.handoffDoubles + 4 * (S.n + 1 + S.nnzA) + 4 * (2 * S.n + 3 * (S.nSuper + 1) + S.rowIdx.length + S.child.length) + 8 * (S.nSuper + 1) + 8 * S.nSuper;
  }

  /** Starts the helpers' share of a factorisation of A (values copied into shared memory); the caller then does its own and calls join(). */
  start(A: ComplexCsr, tolerance: number, limit: number): void {
    if (A.re !== this.A.re) this.A.re.set(A.re);
    if (A.im !== this.A.im) this.A.im.set(A.im);
    if (!this.started) {
      this.setups.forEach((s, i) => this.threads.post(i, s));
      this.started = true;
    }
    for (const s of this.setups) {
      s.numbers[TOLERANCE] = tolerance;
      s.numbers[LIMIT] = limit;
      Atomics.add(s.control, SEQ, 1);
      Atomics.notify(s.control, SEQ);
    }
  }

  /** Waits for every helper; throws the first helper's error; folds their pivot statistics into the caller's guard. */
  join(guard: PivotGuard): void {
    let failure: Error | null = null;
    for (const s of this.setups) {
      const seq = Atomics.load(s.control, SEQ);
      for (let done = Atomics.load(s.control, DONE); done !== seq; done = Atomics.load(s.control, DONE)) Atomics.wait(s.control, DONE, done, 1000);
      failure ??= helperError(s);
      const x = s.numbers;
      guard.count += x[COUNT];
      if (x[MIN_RATIO] < guard.minRatio) {
        guard.minRatio = x[MIN_RATIO];
        guard.minAt = x[MIN_AT];
        guard.minMagnitude = x[MIN_MAG];
      }
    }
    if (failure) throw failure;
  }

  /** Tells the helpers to end their loops, and the host to end the threads. */
  close(): void {
    for (const s of this.setups) {
      Atomics.store(s.control, SEQ, STOP);
      Atomics.notify(s.control, SEQ);
    }
    this.threads.close();
  }
}

function helperError(s: HelperSetup): Error | null {
  const c = s.control, x = s.numbers;
  const text = String.fromCharCode(...c.subarray(ERROR_TEXT, ERROR_TEXT + c[ERROR_LEN]));
  switch (c[ERROR_KIND]) {
    case NO_ERROR: return null;
    case SINGULAR: return new SingularSystemError({ permuted: x[E1], original: x[E2] }, x[E3], x[E4], text);
    case NON_FINITE: return new NonFiniteMatrixError(x[E1], x[E2]);
    default: return new Error(`a factorisation helper thread failed: ${text}`);
  }
}

/**
 * The helper's side: factors its subtrees at every new sequence number until told to stop. Blocks its
 * thread in Atomics.wait between factorisations.
 */
export function serveFactorHelper(setup: HelperSetup): void {
  const { S, A, panels, scale, diagonal, handoff, list, control: c, numbers: x } = setup;
  const arena = createArena(arenaLayout(setup.arena), setup.kernel);
  const map = new Int32Array(S.n);
  let seen = Atomics.load(c, DONE);
  for (;;) {
    Atomics.wait(c, SEQ, seen);
    const seq = Atomics.load(c, SEQ);
    if (seq === STOP) return;
    if (seq === seen) continue;
    const guard = new PivotGuard(S.perm, scale, x[TOLERANCE], x[LIMIT]);
    c[ERROR_KIND] = NO_ERROR;
    try {
      factorFronts({ A, S, panels, map, scale, diagonal, arena, guard, handoff }, list, 0, list.length);
    } catch (e) {
      report(c, x, e);
    }
    x[COUNT] = guard.count;
    x[MIN_RATIO] = guard.minRatio;
    x[MIN_AT] = guard.minAt;
    x[MIN_MAG] = guard.minMagnitude;
    seen = seq;
    Atomics.store(c, DONE, seq);
    Atomics.notify(c, DONE);
  }
}

function report(c: Int32Array, x: Float64Array, e: unknown): void {
  const message = e instanceof Error ? e.message : String(e);
  if (e instanceof SingularSystemError) {
    c[ERROR_KIND] = SINGULAR;
    [x[E1], x[E2], x[E3], x[E4]] = [e.pivot.permuted, e.pivot.original, e.magnitude, e.scale];
    const detail = /\): (.*)$/.exec(message)?.[1] ?? '';
    writeText(c, detail);
  } else if (e instanceof NonFiniteMatrixError) {
    c[ERROR_KIND] = NON_FINITE;
    [x[E1], x[E2]] = [e.row, e.col];
  } else {
    c[ERROR_KIND] = OTHER;
    writeText(c, message);
  }
}

function writeText(c: Int32Array, text: string): void {
  const len = Math.min(TEXT_MAX, text.length);
  for (let k = 0; k < len; k++) c[ERROR_TEXT + k] = text.charCodeAt(k);
  c[ERROR_LEN] = len;
}
