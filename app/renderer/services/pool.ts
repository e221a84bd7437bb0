/**
 * The run pool: frequencies of one scenario solved side by side in Web Workers. Each worker prepares
 * the scenario once, then takes frequencies from a shared queue one at a time, so a slow frequency holds
 * up only its own worker. Cancel terminates every worker at once (no waiting for a frequency to finish)
 * and keeps what has finished. A worker that dies loses only its current frequency and is replaced,
 * but not forever.
 */
import type { MeshInfo, PointResult } from '../../../engine/solve/scenario.ts';
import { send, type FromWorker, type SectionCutOns, type WorkerPort } from '../protocol.ts';

export interface PoolEvents {
  /** The first worker has prepared the scenario. */
  ready(info: MeshInfo, cutOns: SectionCutOns[], prepareSeconds: number): void;
  started(frequencyHz: number, worker: number, at: number): void;
  /** A solved frequency; its field (if kept) is in point.field. */
  result(point: PointResult, at: number): void;
  failure(frequencyHz: number, message: string, at: number): void;
  /** Once, at the end: finished, cancelled, or every worker gone. */
  done(outcome: PoolOutcome): void;
}

export interface PoolOutcome { cancelled: boolean; unsolved: number[] }

export interface PoolOptions {
  workers: number;
  keepFields: boolean;
  allowLarge: boolean;
  createWorker: () => WorkerPort;
  now: () => number;
}

export interface PoolRun { cancel(): void }

interface Slot { port: WorkerPort; index: number; current: number | null; ready: boolean }

export function runPool(scenario: unknown, frequenciesHz: readonly number[], opts: PoolOptions, events: PoolEvents): PoolRun {
  const queue = [...frequenciesHz];
  const slots = new Set<Slot>();
  let respawnsLeft = Math.max(1, opts.workers), readySent = false, finished = false, nextIndex = 0;

  const finish = (outcome: PoolOutcome) => {
    if (finished) return;
    finished = true;
    for (const s of slots) s.port.terminate();
    slots.clear();
    events.done(outcome);
  };

  const feed = (slot: Slot) => {
    const f = queue.shift();
    if (f === undefined) {
      slot.current = null;
      slot.port.terminate();
      slots.delete(slot);
      if (slots.size === 0) finish({ cancelled: false, unsolved: [] });
      return;
    }
    slot.current = f;
    events.started(f, slot.index, opts.now());
    send(slot.port, { type: 'solve', frequencyHz: f });
  };

  const receive = (slot: Slot, m: FromWorker) => {
    if (finished || !slots.has(slot)) return;
    switch (m.type) {
      case 'ready':
        slot.ready = true;
        if (!readySent) { readySent = true; events.ready(m.info, m.cutOns, m.prepareSeconds); }
        return feed(slot);
      case 'result':
        slot.current = null;
        events.result(m.point, opts.now());
        return feed(slot);
      case 'failure':
        slot.current = null;
        events.failure(m.frequencyHz, m.message, opts.now());
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
    if (slot.current !== null) events.failure(slot.current, `the worker solving ${slot.current} Hz stopped: ${message}`, opts.now());
    if (queue.length > 0 && respawnsLeft-- > 0) spawn();
    else if (slots.size === 0) {
      for (const f of queue.splice(0)) events.failure(f, `not solved: every worker stopped (last: ${message})`, opts.now());
      finish({ cancelled: false, unsolved: [] });
    }
  };

  const spawn = () => {
    const slot: Slot = { port: opts.createWorker(), index: nextIndex++, current: null, ready: false };
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
      const inFlight = [...slots].flatMap((s) => (s.current === null ? [] : [s.current]));
      const unsolved = [...inFlight, ...queue.splice(0)].sort((a, b) => a - b);
      finish({ cancelled: true, unsolved });
    },
  };
}
