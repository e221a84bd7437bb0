/**
 * The command line's host of a sweep: engine/sweep's scheduler over worker_threads. Every frequency is an
 * independent problem on the same mesh, so each worker prepares the scenario once and takes frequencies
 * from the scheduler's queue (engine/sweep/scheduler.ts says how, and what it reports).
 *
 * With one worker, the work is done in this thread instead (no second copy of the mesh): the same job the
 * worker threads run (engine/sweep/job.ts), behind a port that hands messages over between events, so a
 * Ctrl-C arrives between frequencies. The problem the caller prepared here is reused.
 */
import { Worker } from 'node:worker_threads';
import { availableParallelism, freemem } from 'node:os';
import { performance } from 'node:perf_hooks';
import { runSweep, type SweepOptions, type SweepPlan, type SweepRun } from '../sweep/scheduler.ts';
import { createWorkerJob } from '../sweep/job.ts';
import { defaultWorkerCount } from '../sweep/plan.ts';
import type { FromWorker, ToWorker, WorkerPort } from '../sweep/protocol.ts';
import type { Problem } from '../solve/problem.ts';

const DEFAULT_ENTRY = new URL('./worker.mjs', import.meta.url);

/** The share of the free memory the workers of one run may take together. */
const FREE_MEMORY_SHARE = 0.8;

/** Workers by default for a sweep of `frequencies` on this machine: the cores, and what free memory holds. */
export function nodeWorkerCount(frequencies: number, workerMemoryBytes: number): number {
  return defaultWorkerCount({ cores: availableParallelism(), frequencies, workerMemoryBytes, memoryBytes: FREE_MEMORY_SHARE * freemem() });
}

export interface NodeSweepOptions extends Omit<SweepOptions, 'createWorker' | 'now'> {
  /** Worker entry (a .mjs bootstrap); default ./worker.mjs beside this file. */
  entry?: URL;
  /** The problem already prepared in this thread from the same scenario: reused when solving in this thread. */
  preset?: Problem;
  now?: () => number;
}

/** Runs the sweep; `done` settles once every worker thread has ended. */
export function solveSweep(o: NodeSweepOptions): SweepRun {
  const now = o.now ?? (() => performance.now());
  const first = Array.isArray(o.plan) ? o.plan.length : (o.plan as SweepPlan).initial().length;
  const inThread = Math.min(o.workers, first) <= 1;
  const ended: Promise<unknown>[] = [];
  const createWorker = inThread ? () => inThreadPort(now, o.preset) : () => threadPort(o.entry ?? DEFAULT_ENTRY, ended);
  const run = runSweep({ ...o, now, createWorker });
  return { cancel: run.cancel, done: run.done.then(async (outcome) => { await Promise.all(ended); return { ...outcome, workers: inThread ? 0 : outcome.workers }; }) };
}

/** A worker_threads Worker as a WorkerPort; a thread this side terminated is not a crash. */
function threadPort(entry: URL, ended: Promise<unknown>[]): WorkerPort {
  const w = new Worker(entry);
  let stopped = false;
  const port: WorkerPort = {
    postMessage: (message, transfer) => w.postMessage(message, transfer),
    terminate: () => {
      if (stopped) return;
      stopped = true;
      ended.push(w.terminate());
    },
    onmessage: null,
    onerror: null,
  };
  w.on('message', (data: FromWorker) => port.onmessage?.({ data }));
  w.on('error', (e: Error) => { if (!stopped) port.onerror?.({ message: e.message }); });
  w.on('exit', (code) => { if (!stopped) port.onerror?.({ message: `the worker thread exited with code ${code}` }); });
  return port;
}

/** The job in this thread, behind a port: each message handled after the events already waiting (signals, timers). */
function inThreadPort(now: () => number, preset: Problem | undefined): WorkerPort {
  let alive = true;
  const later = (f: () => void) => setImmediate(() => { if (alive) f(); });
  const port: WorkerPort = {
    postMessage: (message: ToWorker) => later(() => {
      try {
        job.receive(message);
      } catch (e) {
        port.onerror?.({ message: e instanceof Error ? e.message : String(e) });
      }
    }),
    terminate: () => { alive = false; },
    onmessage: null,
    onerror: null,
  };
  const job = createWorkerJob((data) => later(() => port.onmessage?.({ data })), { now, preset });
  return port;
}
