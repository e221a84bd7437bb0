/**
 * Starts and cancels runs: the pool's events become steps of the run state (model/run.ts), solved
 * fields go on to the field service, and the elapsed clock ticks while a run is active.
 */
import type { Issue, NormalisedScenario } from '../../../engine/scenario/index.ts';
import { checkFailed, checkStarted, fieldKept, finishedRun, frequencyFailed, frequencySolved, frequencyStarted, isActive, pointChecked, preparedRun, startedRun, type RunState } from '../model/run.ts';
import type { WorkerPort } from '../protocol.ts';
import type { Store } from '../store/store.ts';
import type { FieldService } from './fields.ts';
import { runPool, type PoolRun } from './pool.ts';

/** Fields kept per run at most, in bytes (16 bytes per dof and frequency): beyond it slices are not offered. */
export const FIELD_BUDGET_BYTES = 512 * 1024 * 1024;

export interface Runner {
  start(scenario: NormalisedScenario, input: unknown, warnings: readonly Issue[], workers: number, allowLarge: boolean, orderCheck: boolean): void;
  cancel(): void;
}

export interface RunnerOptions {
  store: Store<RunState>;
  fields: FieldService;
  createWorker: () => WorkerPort;
  now: () => number;
  onFinished?: (run: RunState) => void;
}

export function createRunner(o: RunnerOptions): Runner {
  let current: PoolRun | null = null, nextId = 1, keptBytes = 0;
  return {
    start(scenario, input, warnings, workers, allowLarge, orderCheck) {
      if (isActive(o.store.get())) return;
      const id = nextId++;
      keptBytes = 0;
      o.fields.begin(input, allowLarge);
      o.store.set(startedRun(id, scenario, input, warnings, workers, o.now()));
      const mine = (apply: (r: RunState) => RunState) => o.store.set((r) => (r.id === id ? apply(r) : r));
      current = runPool(input, scenario.sweep.frequenciesHz, { workers, keepFields: true, allowLarge, orderCheck, createWorker: o.createWorker, now: o.now }, {
        ready: (info, cutOns, accuracy, checkHz) => mine((r) => preparedRun(r, info, cutOns, accuracy, checkHz)),
        started: (f, _w, at, check) => mine((r) => (check ? checkStarted(r, f) : frequencyStarted(r, f, at))),
        checked: (f, accuracy) => mine((r) => pointChecked(r, f, accuracy)),
        checkFailed: (f, message) => mine((r) => checkFailed(r, f, message)),
        result: (point, at) => {
          const field = point.field;
          mine((r) => frequencySolved(r, point, at));
          if (field && keptBytes + 16 * field.re.length <= FIELD_BUDGET_BYTES) {
            keptBytes += 16 * field.re.length;
            o.fields.keep(point.frequencyHz, field.re, field.im);
            mine((r) => fieldKept(r, point.frequencyHz));
          }
        },
        failure: (f, message, at) => mine((r) => frequencyFailed(r, f, message, at)),
        done: ({ cancelled, unsolved }) => {
          current = null;
          mine((r) => finishedRun(r, cancelled, unsolved, o.now()));
          o.onFinished?.(o.store.get());
        },
      });
    },
    cancel() {
      current?.cancel();
    },
  };
}
