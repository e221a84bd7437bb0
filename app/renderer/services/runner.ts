/**
 * Starts and cancels runs: the engine's sweep scheduler (engine/sweep/scheduler.ts) over Web Workers, its
 * events folded into the run state (model/run.ts), solved fields passed on to the field service, the
 * elapsed clock ticking while a run is active.
 */
import type { Issue, NormalisedScenario } from '../../../engine/scenario/index.ts';
import { runSweep, type SweepRun } from '../../../engine/sweep/scheduler.ts';
import { orderCheckFrequencies } from '../../../engine/sweep/plan.ts';
import type { WorkerPort } from '../../../engine/sweep/protocol.ts';
import { fieldKept, isActive, runEvent, startedRun, type RunState } from '../model/run.ts';
import type { Store } from '../store/store.ts';
import type { FieldService } from './fields.ts';

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
  let current: SweepRun | null = null, nextId = 1, keptBytes = 0;
  return {
    start(scenario, input, warnings, workers, allowLarge, orderCheck) {
      if (isActive(o.store.get())) return;
      const id = nextId++;
      keptBytes = 0;
      o.fields.begin(input, allowLarge);
      o.store.set(startedRun(id, scenario, input, warnings, workers, o.now()));
      const mine = (apply: (r: RunState) => RunState) => o.store.set((r) => (r.id === id ? apply(r) : r));
      const frequencies = scenario.sweep.frequenciesHz;
      current = runSweep({
        scenario: input, plan: frequencies, checkHz: orderCheckFrequencies(frequencies, orderCheck ? 'default' : 'none'), workers, keepFields: true, allowLarge,
        createWorker: o.createWorker, now: o.now,
        onEvent: (e) => {
          mine((r) => runEvent(r, e));
          if (e.type === 'result' && e.point.field && keptBytes + 16 * e.point.field.re.length <= FIELD_BUDGET_BYTES) {
            const { field } = e.point;
            keptBytes += 16 * field.re.length;
            o.fields.keep(e.point.frequencyHz, field.re, field.im);
            mine((r) => fieldKept(r, e.point.frequencyHz));
          }
          if (e.type === 'done') {
            current = null;
            o.onFinished?.(o.store.get());
          }
        },
      });
    },
    cancel() {
      current?.cancel();
    },
  };
}
