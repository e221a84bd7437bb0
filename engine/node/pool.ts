/**
 * Frequencies of one scenario solved side by side in worker threads. Every frequency is an
 * independent problem on the same mesh, so each worker prepares the scenario once (mesh, pattern,
 * analysis) and then takes frequencies from a shared queue one at a time: a slow frequency holds up
 * only its own worker, and a worker that dies loses only the frequency it was on.
 *
 * With one worker, or one frequency, the work is done in this thread (no second copy of the mesh).
 *
 * The order check (engine/solve/accuracy.ts) runs in the same pool: frequencies in `checkFrequencies` are
 * solved once more at element order p + 1, queued after the sweep; a worker prepares that finer problem the
 * first time it takes such a job. Their results arrive apart from the sweep's (onCheck, outcome.checks), and a
 * failed check is not a failed frequency.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism, freemem } from 'node:os';
import { performance } from 'node:perf_hooks';
import { setImmediate as yieldToEvents } from 'node:timers/promises';
import type { NormalisedScenario } from '../scenario/index.ts';
import { prepareProblem } from '../solve/prepare.ts';
import type { Problem } from '../solve/problem.ts';
import type { PointResult } from '../solve/points.ts';

export interface PointFailure { frequencyHz: number; message: string }

export interface PoolOptions {
  /** Worker threads; default os.availableParallelism(). Never more than there are frequencies. */
  workers?: number;
  /** Keep each point's solved field (transferred from the worker, not copied). */
  keepFields?: boolean;
  /** Called as each frequency finishes, in the order they finish. */
  onResult?: (point: PointResult) => void;
  onFailure?: (failure: PointFailure) => void;
  /** The scenario already prepared in this thread: reused when solving in-process. */
  prepared?: Problem;
  /** Worker entry (a .mjs bootstrap); default ./worker.mjs beside this file. */
  entry?: URL;
  /** Frequencies to solve once more at element order p + 1 (the order check), after the sweep. */
  checkFrequencies?: readonly number[];
  /** Called as each order-check solve finishes. */
  onCheck?: (point: PointResult) => void;
  onCheckFailure?: (failure: PointFailure) => void;
}

export interface PoolOutcome {
  results: PointResult[];
  failures: PointFailure[];
  /** Frequencies not solved because the run was cancelled. */
  unsolved: number[];
  cancelled: boolean;
  /** Worker threads used; 0 when solved in this thread. */
  workers: number;
  /** The order-check solves at p + 1 that finished, and those that failed (a cancelled run drops the rest). */
  checks: PointResult[];
  checkFailures: PointFailure[];
}

export interface PoolRun {
  done: Promise<PoolOutcome>;
  /** Stops the run: workers are terminated, finished results are kept. */
  cancel(): void;
}

/** What a worker is started with (worker_threads workerData). */
export interface WorkerSetup { scenario: NormalisedScenario; keepFields: boolean }
/** finer: solve at element order p + 1 (the order check); a check's field is never kept. */
export type ToWorker = { type: 'solve'; frequencyHz: number; finer?: boolean } | { type: 'stop' };
export type FromWorker =
  | { type: 'ready' }
  | { type: 'result'; point: PointResult; finer?: boolean }
  | { type: 'failure'; frequencyHz: number; message: string; finer?: boolean }
  | { type: 'fatal'; message: string };

interface Job { frequencyHz: number; finer: boolean }

function jobsOf(frequenciesHz: readonly number[], checks: readonly number[] = []): Job[] {
  return [...frequenciesHz.map((f) => ({ frequencyHz: f, finer: false })), ...checks.map((f) => ({ frequencyHz: f, finer: true }))];
}

function emptyOutcome(workers: number): PoolOutcome {
  return { results: [], failures: [], unsolved: [], cancelled: false, workers, checks: [], checkFailures: [] };
}

const DEFAULT_ENTRY = new URL('./worker.mjs', import.meta.url);

/**
 * How many workers fit: at most the cores, the frequencies, and what free memory holds, each worker
 * holding its own prepared problem, matrix, factor and vectors (MeshInfo.workerMemoryBytes).
 */
export function defaultWorkerCount(frequencies: number, workerMemoryBytes: number): number {
  const byMemory = Math.floor((0.8 * freemem()) / Math.max(1, workerMemoryBytes));
  return Math.max(1, Math.min(availableParallelism(), frequencies, byMemory));
}

export function solveFrequencies(scenario: NormalisedScenario, frequenciesHz: readonly number[], opts: PoolOptions = {}): PoolRun {
  const workers = Math.min(opts.workers ?? availableParallelism(), frequenciesHz.length + (opts.checkFrequencies?.length ?? 0));
  if (!(Number.isInteger(workers) && workers >= 0)) throw new RangeError(`workers must be a positive integer (got ${opts.workers})`);
  return workers <= 1 ? inThisThread(scenario, frequenciesHz, opts) : new Pool(scenario, frequenciesHz, workers, opts).run();
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

function inThisThread(scenario: NormalisedScenario, frequenciesHz: readonly number[], opts: PoolOptions): PoolRun {
  let cancelled = false;
  const work = async (): Promise<PoolOutcome> => {
    const out = emptyOutcome(0);
    const prepared = opts.prepared ?? prepareProblem(scenario, { maxDofs: Infinity });
    let finer: Problem | Error | undefined;
    const jobs = jobsOf(frequenciesHz, opts.checkFrequencies);
    for (let i = 0; i < jobs.length; i++) {
      // Between frequencies, let signals and timers run so that a cancel can arrive.
      await yieldToEvents();
      if (cancelled) return { ...out, cancelled: true, unsolved: jobs.slice(i).filter((j) => !j.finer).map((j) => j.frequencyHz) };
      const { frequencyHz: f, finer: check } = jobs[i];
      try {
        if (check) {
          finer ??= prepareOrError(() => prepared.finer());
          if (finer instanceof Error) throw finer;
          const point = finer.solve(f, () => performance.now(), false);
          out.checks.push(point);
          opts.onCheck?.(point);
          continue;
        }
        const solved = prepared.solve(f, () => performance.now(), opts.keepFields ?? false), point = { ...solved, accuracy: prepared.assess(solved) };
        out.results.push(point);
        opts.onResult?.(point);
      } catch (e) {
        const failure = { frequencyHz: f, message: messageOf(e) };
        if (check) {
          out.checkFailures.push(failure);
          opts.onCheckFailure?.(failure);
        } else {
          out.failures.push(failure);
          opts.onFailure?.(failure);
        }
      }
    }
    return out;
  };
  return { done: work(), cancel: () => { cancelled = true; } };
}

function prepareOrError(prepare: () => Problem): Problem | Error {
  try {
    return prepare();
  } catch (e) {
    return e instanceof Error ? e : new Error(String(e));
  }
}

interface Slot { current: Job | null; stopping: boolean }

class Pool {
  private readonly queue: Job[];
  private readonly slots = new Map<Worker, Slot>();
  private readonly out = emptyOutcome(0);
  private respawnsLeft: number;
  private lastCrash = '';
  private cancelled = false;
  private finished = false;
  private resolve: (o: PoolOutcome) => void = () => undefined;

  constructor(private readonly scenario: NormalisedScenario, frequenciesHz: readonly number[], private readonly size: number, private readonly opts: PoolOptions) {
    this.queue = jobsOf(frequenciesHz, opts.checkFrequencies);
    // A crash may be this machine's doing (memory): replace a dead worker, but not forever.
    this.respawnsLeft = size;
  }

  run(): PoolRun {
    const done = new Promise<PoolOutcome>((resolve) => { this.resolve = resolve; });
    for (let i = 0; i < this.size; i++) this.spawn();
    return { done, cancel: () => this.cancel() };
  }

  private spawn(): void {
    const setup: WorkerSetup = { scenario: this.scenario, keepFields: this.opts.keepFields ?? false };
    const w = new Worker(this.opts.entry ?? DEFAULT_ENTRY, { workerData: setup });
    this.slots.set(w, { current: null, stopping: false });
    w.on('message', (m: FromWorker) => this.receive(w, m));
    w.on('error', (e) => this.crashed(w, messageOf(e)));
    w.on('exit', (code) => this.exited(w, code));
  }

  private receive(w: Worker, m: FromWorker): void {
    const slot = this.slots.get(w);
    if (!slot || this.cancelled) return;
    if (m.type === 'fatal') return this.fatal(w, m.message);
    // Free the slot before the callbacks: one of them may cancel, and this frequency is done.
    slot.current = null;
    if (m.type === 'result') this.keep(m.point, m.finer ?? false);
    else if (m.type === 'failure') this.fail({ frequencyHz: m.frequencyHz, message: m.message }, m.finer ?? false);
    if (!this.cancelled) this.feed(w, slot);
  }

  private keep(point: PointResult, finer: boolean): void {
    if (finer) {
      this.out.checks.push(point);
      this.opts.onCheck?.(point);
      return;
    }
    this.out.results.push(point);
    this.opts.onResult?.(point);
  }

  private fail(failure: PointFailure, finer: boolean): void {
    if (finer) {
      this.out.checkFailures.push(failure);
      this.opts.onCheckFailure?.(failure);
      return;
    }
    this.out.failures.push(failure);
    this.opts.onFailure?.(failure);
  }

  private feed(w: Worker, slot: Slot): void {
    const job = this.queue.shift();
    if (job === undefined) {
      slot.stopping = true;
      w.postMessage({ type: 'stop' } satisfies ToWorker);
      return;
    }
    slot.current = job;
    w.postMessage((job.finer ? { type: 'solve', frequencyHz: job.frequencyHz, finer: true } : { type: 'solve', frequencyHz: job.frequencyHz }) satisfies ToWorker);
  }

  /** The scenario cannot be prepared: no worker will do better, so nothing left is solved. */
  private fatal(w: Worker, message: string): void {
    for (const j of this.queue.splice(0)) this.fail({ frequencyHz: j.frequencyHz, message }, j.finer);
    this.slots.get(w)!.stopping = true;
    w.postMessage({ type: 'stop' } satisfies ToWorker);
  }

  private crashed(w: Worker, message: string): void {
    const slot = this.slots.get(w);
    if (!slot) return;
    this.slots.delete(w);
    this.lastCrash = message;
    const job = slot.current;
    if (job !== null) this.fail({ frequencyHz: job.frequencyHz, message: `the worker solving ${job.frequencyHz} Hz${job.finer ? ' (order check)' : ''} stopped: ${message}` }, job.finer);
    if (this.queue.length > 0 && !this.cancelled) {
      if (this.respawnsLeft-- > 0) this.spawn();
      else if (this.slots.size === 0) this.failRest();
    }
    this.settleIfDone();
  }

  private exited(w: Worker, code: number): void {
    const slot = this.slots.get(w);
    if (!slot) return;
    if (!slot.stopping) return this.crashed(w, `the worker thread exited with code ${code}`);
    this.slots.delete(w);
    this.settleIfDone();
  }

  private failRest(): void {
    for (const j of this.queue.splice(0)) this.fail({ frequencyHz: j.frequencyHz, message: `not solved: every worker stopped (last: ${this.lastCrash})` }, j.finer);
  }

  private cancel(): void {
    if (this.cancelled || this.finished) return;
    this.cancelled = true;
    const inFlight = [...this.slots.values()].flatMap((s) => (s.current === null ? [] : [s.current]));
    // the order checks not done are dropped: only the sweep's frequencies count as unsolved
    const unsolved = [...inFlight, ...this.queue.splice(0)].filter((j) => !j.finer).map((j) => j.frequencyHz).sort((a, b) => a - b);
    const workers = [...this.slots.keys()];
    this.slots.clear();
    void Promise.all(workers.map((w) => w.terminate())).then(() => this.settle(unsolved));
  }

  private settleIfDone(): void {
    if (!this.cancelled && this.slots.size === 0 && this.queue.length === 0) this.settle([]);
  }

  private settle(unsolved: number[]): void {
    if (this.finished) return;
    this.finished = true;
    this.resolve({ ...this.out, unsolved, cancelled: this.cancelled, workers: this.size });
  }
}
