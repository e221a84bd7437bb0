/**
 * Mesh and cost of the scenario being edited, from a cheap prepare (mesh, pattern, analysis; no
 * factorisation) in a worker of its own, a moment after the last edit. A request that comes while an
 * older one is still being prepared replaces it: the busy worker is terminated, a fresh one started.
 */
import type { MeshInfo } from '../../../engine/solve/problem.ts';
import { send, type WorkerPort } from '../../../engine/sweep/protocol.ts';
import { createStore, type Store } from '../store/store.ts';

export interface EstimateState {
  status: 'idle' | 'working' | 'ready' | 'error';
  /** The scenario text the state belongs to. */
  key: string | null;
  info: MeshInfo | null;
  prepareSeconds: number;
  message: string | null;
  /** The engine refused the size without confirmation. */
  tooLarge: boolean;
}

export const IDLE_ESTIMATE: EstimateState = { status: 'idle', key: null, info: null, prepareSeconds: 0, message: null, tooLarge: false };

export interface Estimator {
  store: Store<EstimateState>;
  /** Estimate for this scenario value (already valid) after `delayMs`, unless it is what the state already shows. */
  request(scenario: unknown, allowLarge: boolean, delayMs?: number): void;
  clear(): void;
  dispose(): void;
}

export interface Timers { set(f: () => void, ms: number): unknown; clear(handle: unknown): void }

// Wrapped: a browser refuses setTimeout called as a method of another object ("Illegal invocation").
const GLOBAL_TIMERS: Timers = { set: (f, ms) => setTimeout(f, ms), clear: (h) => clearTimeout(h as ReturnType<typeof setTimeout>) };

export function createEstimator(createWorker: () => WorkerPort, timers: Timers = GLOBAL_TIMERS): Estimator {
  const store = createStore<EstimateState>(IDLE_ESTIMATE);
  let worker: WorkerPort | null = null, busy: number | null = null, nextId = 1, timer: unknown = null;
  const keys = new Map<number, string>();

  const fresh = (): WorkerPort => {
    const w = createWorker();
    w.onmessage = (e) => {
      const m = e.data;
      if ((m.type !== 'estimate' && m.type !== 'estimate-error') || m.id !== busy) return;
      busy = null;
      const key = keys.get(m.id) ?? null;
      keys.delete(m.id);
      if (key !== store.get().key) return;
      if (m.type === 'estimate') store.set({ status: 'ready', key, info: m.info, prepareSeconds: m.prepareSeconds, message: null, tooLarge: false });
      else store.set({ status: 'error', key, info: null, prepareSeconds: 0, message: m.message, tooLarge: m.tooLarge });
    };
    w.onerror = (e) => {
      e.preventDefault?.();
      busy = null;
      worker?.terminate();
      worker = null;
      store.set((s) => ({ ...s, status: 'error', message: e.message || 'the estimate worker stopped (out of memory?)' }));
    };
    return w;
  };

  const run = (scenario: unknown, allowLarge: boolean, key: string) => {
    if (busy !== null && worker) { worker.terminate(); worker = null; }
    worker ??= fresh();
    const id = nextId++;
    busy = id;
    keys.set(id, key);
    send(worker, { type: 'estimate', id, scenario, allowLarge });
  };

  return {
    store,
    request(scenario, allowLarge, delayMs = 350) {
      const key = JSON.stringify({ scenario, allowLarge });
      const s = store.get();
      if (s.key === key && s.status !== 'idle') return;
      store.set({ ...s, status: 'working', key, message: null });
      if (timer) timers.clear(timer);
      timer = timers.set(() => { timer = null; run(scenario, allowLarge, key); }, delayMs);
    },
    clear() {
      if (timer) timers.clear(timer);
      timer = null;
      store.set(IDLE_ESTIMATE);
    },
    dispose() {
      if (timer) timers.clear(timer);
      worker?.terminate();
      worker = null;
    },
  };
}
