/**
 * The run pool: frequencies of one scenario solved side by side in Web Workers. Each worker prepares
 * the scenario once, then takes frequencies from a shared queue one at a time, so a slow frequency holds
 * up only its own worker. After the sweep come the order checks (engine/solve/accuracy.ts): chosen
 * frequencies solved again at element order p + 1 by whichever worker is free, each once its own point
 * is solved. Cancel terminates every worker at once (no waiting for a frequency to finish) and keeps what
 * has finished. A worker that dies loses only its current job and is replaced, but not forever.
 */
import type { MeshInfo } from '../../../engine/solve/problem.ts';
import type { PointAccuracy } from '../../../engine/solve/points.ts';
import { send, type AccuracyInfo, type AssessedPoint, type FromWorker, type SectionCutOns, type WorkerPort } from '../protocol.ts';

export interface PoolEvents {
  /** The first worker has prepared the scenario. */
  /** checkHz: the order checks that will run (none unless asked for). */
  ready(info: MeshInfo, cutOns: SectionCutOns[], accuracy: AccuracyInfo, checkHz: readonly number[], prepareSeconds: number): void;
  started(frequencyHz: number, worker: number, at: number, check: boolean): void;
  /** A solved frequency; its field (if kept) is in point.field. */
  result(point: AssessedPoint, at: number): void;
  failure(frequencyHz: number, message: string, at: number): void;
  /** An order check done: the point's accuracy, now with order_check_db. */
  checked(frequencyHz: number, accuracy: PointAccuracy, at: number): void;
  checkFailed(frequencyHz: number, message: string, at: number): void;
  /** Once, at the end: finished, cancelled, or every worker gone. */
  done(outcome: PoolOutcome): void;
}

export interface PoolOutcome { cancelled: boolean; unsolved: number[] }

export interface PoolOptions {
  workers: number;
  keepFields: boolean;
  allowLarge: boolean;
  /** Solve the engine's default order-check frequencies once more at order p + 1, after the sweep. */
  orderCheck?: boolean;
  createWorker: () => WorkerPort;
  now: () => number;
}

export interface PoolRun { cancel(): void }

type Job = { kind: 'solve'; f: number } | { kind: 'check'; f: number };
interface Slot { port: WorkerPort; index: number; job: Job | null; ready: boolean; parked: boolean }

export function runPool(scenario: unknown, frequenciesHz: readonly number[], opts: PoolOptions, events: PoolEvents): PoolRun {
  const queue = [...frequenciesHz];
  const checks: number[] = [];
  const solved = new Map<number, AssessedPoint>(), failed = new Set<number>();
  const slots = new Set<Slot>();
  let respawnsLeft = Math.max(1, opts.workers), readySent = false, finished = false, nextIndex = 0;

  const finish = (outcome: PoolOutcome) => {
    if (finished) return;
    finished = true;
    for (const s of slots) s.port.terminate();
    slots.clear();
    events.done(outcome);
  };
  const retire = (slot: Slot) => {
    slot.port.terminate();
    slots.delete(slot);
    if (slots.size === 0) finish({ cancelled: false, unsolved: [] });
  };

  /** The next job: a frequency of the sweep, else an order check whose point is solved; null: wait or stop. */
  const nextJob = (): Job | 'wait' | null => {
    const f = queue.shift();
    if (f !== undefined) return { kind: 'solve', f };
    for (let i = 0; i < checks.length; i++) {
      if (failed.has(checks[i])) { checks.splice(i--, 1); continue; }
      if (solved.has(checks[i])) return { kind: 'check', f: checks.splice(i, 1)[0] };
    }
    return checks.length > 0 ? 'wait' : null;
  };

  const feed = (slot: Slot) => {
    const job = nextJob();
    slot.job = null;
    slot.parked = false;
    if (job === null) return retire(slot);
    // A check whose point another worker is still solving: this worker waits for it.
    if (job === 'wait') { slot.parked = true; return; }
    slot.job = job;
    events.started(job.f, slot.index, opts.now(), job.kind === 'check');
    if (job.kind === 'solve') send(slot.port, { type: 'solve', frequencyHz: job.f });
    else {
      const point = { ...solved.get(job.f)!, field: undefined };
      send(slot.port, { type: 'check', point });
    }
  };
  const wakeParked = () => { for (const s of [...slots]) if (s.parked) feed(s); };

  const receive = (slot: Slot, m: FromWorker) => {
    if (finished || !slots.has(slot)) return;
    switch (m.type) {
      case 'ready':
        slot.ready = true;
        if (!readySent) {
          readySent = true;
          if (opts.orderCheck) checks.push(...m.orderCheckHz.filter((f) => frequenciesHz.includes(f)));
          events.ready(m.info, m.cutOns, m.accuracy, [...checks], m.prepareSeconds);
        }
        return feed(slot);
      case 'result':
        solved.set(m.point.frequencyHz, { ...m.point, field: undefined });
        events.result(m.point, opts.now());
        feed(slot);
        return wakeParked();
      case 'failure':
        failed.add(m.frequencyHz);
        events.failure(m.frequencyHz, m.message, opts.now());
        feed(slot);
        return wakeParked();
      case 'checked':
        events.checked(m.frequencyHz, m.accuracy, opts.now());
        return feed(slot);
      case 'check-failure':
        events.checkFailed(m.frequencyHz, m.message, opts.now());
        return feed(slot);
      case 'fatal':
        // No worker will prepare this scenario better: everything left fails with the same reason.
        for (const f of queue.splice(0)) events.failure(f, m.message, opts.now());
        return finish({ cancelled: false, unsolved: [] });
      default:
        return;
    }
  };

  const crashed = (slot: Slot, message: string) => {
    if (finished || !slots.has(slot)) return;
    slots.delete(slot);
    slot.port.terminate();
    const job = slot.job;
    if (job?.kind === 'solve') { failed.add(job.f); events.failure(job.f, `the worker solving ${job.f} Hz stopped: ${message}`, opts.now()); }
    if (job?.kind === 'check') events.checkFailed(job.f, `the worker checking ${job.f} Hz stopped: ${message}`, opts.now());
    const workLeft = queue.length > 0 || checks.length > 0;
    if (workLeft && respawnsLeft-- > 0) spawn();
    else if (slots.size === 0) {
      for (const f of queue.splice(0)) events.failure(f, `not solved: every worker stopped (last: ${message})`, opts.now());
      finish({ cancelled: false, unsolved: [] });
    } else wakeParked();
  };

  const spawn = () => {
    const slot: Slot = { port: opts.createWorker(), index: nextIndex++, job: null, ready: false, parked: false };
    slots.add(slot);
    slot.port.onmessage = (e) => receive(slot, e.data);
    slot.port.onerror = (e) => {
      e.preventDefault?.();
      crashed(slot, e.message || 'the worker failed (out of memory?)');
    };
    send(slot.port, { type: 'prepare', role: 'solve', scenario, keepFields: opts.keepFields, allowLarge: opts.allowLarge });
  };

  const count = Math.max(1, Math.min(opts.workers, queue.length));
  if (queue.length === 0) queueMicrotask(() => finish({ cancelled: false, unsolved: [] }));
  else for (let i = 0; i < count; i++) spawn();

  return {
    cancel() {
      if (finished) return;
      const inFlight = [...slots].flatMap((s) => (s.job?.kind === 'solve' ? [s.job.f] : []));
      const unsolved = [...inFlight, ...queue.splice(0)].sort((a, b) => a - b);
      checks.splice(0);
      finish({ cancelled: true, unsolved });
    },
  };
}
