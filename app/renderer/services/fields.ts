/**
 * The solved fields of the current run, held by a field worker (it has the mesh to sample them on),
 * and slices of them on request. Only the newest slice request matters: while one is being sampled,
 * later ones wait, and each newer one replaces the one waiting.
 */
import { send, type Slice, type SliceRequest, type WorkerPort } from '../../../engine/sweep/protocol.ts';

export interface FieldService {
  /** A new run: the old fields go, a worker is prepared for this scenario. */
  begin(scenario: unknown, allowLarge: boolean): void;
  /** Hands a solved field over (its buffers are transferred). */
  keep(frequencyHz: number, re: Float64Array, im: Float64Array): void;
  slice(frequencyHz: number, request: SliceRequest): Promise<Slice>;
  dispose(): void;
}

export class SupersededError extends Error {
  constructor() { super('a newer slice was asked for'); this.name = 'SupersededError'; }
}

interface Pending { id: number; frequencyHz: number; request: SliceRequest; resolve: (s: Slice) => void; reject: (e: Error) => void }

export function createFieldService(createWorker: () => WorkerPort): FieldService {
  let worker: WorkerPort | null = null, fatal: string | null = null, nextId = 1;
  let inFlight: Pending | null = null, waiting: Pending | null = null;

  const dispatch = () => {
    if (inFlight || !waiting || !worker) return;
    inFlight = waiting;
    waiting = null;
    send(worker, { type: 'slice', id: inFlight.id, frequencyHz: inFlight.frequencyHz, request: inFlight.request });
  };
  const settle = (id: number, done: (p: Pending) => void) => {
    if (!inFlight || inFlight.id !== id) return;
    const p = inFlight;
    inFlight = null;
    done(p);
    dispatch();
  };
  const failAll = (message: string) => {
    for (const p of [inFlight, waiting]) p?.reject(new Error(message));
    inFlight = waiting = null;
  };

  return {
    begin(scenario, allowLarge) {
      worker?.terminate();
      failAll('a new run started');
      fatal = null;
      const w = createWorker();
      w.onmessage = (e) => {
        const m = e.data;
        if (m.type === 'slice') settle(m.id, (p) => p.resolve(m.slice));
        else if (m.type === 'slice-error') settle(m.id, (p) => p.reject(new Error(m.message)));
        else if (m.type === 'fatal') { fatal = m.message; failAll(m.message); }
      };
      w.onerror = (e) => {
        e.preventDefault?.();
        fatal = e.message || 'the field worker stopped (out of memory?)';
        failAll(fatal);
      };
      send(w, { type: 'prepare', role: 'field', scenario, keepFields: false, allowLarge });
      worker = w;
    },
    keep(frequencyHz, re, im) {
      if (worker) send(worker, { type: 'field', frequencyHz, re, im });
    },
    slice(frequencyHz, request) {
      if (!worker) return Promise.reject(new Error('no run has fields yet'));
      if (fatal) return Promise.reject(new Error(fatal));
      return new Promise<Slice>((resolve, reject) => {
        waiting?.reject(new SupersededError());
        waiting = { id: nextId++, frequencyHz, request, resolve, reject };
        dispatch();
      });
    },
    dispose() {
      worker?.terminate();
      worker = null;
      failAll('closed');
    },
  };
}
