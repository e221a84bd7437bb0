/**
 * The worker side of the protocol (protocol.ts): what a worker does with each message, whichever thread it
 * runs in. A host creates one job per worker and wires it to its transport — engine/node/worker.ts to a
 * worker_threads port, app/renderer/engine.worker.ts to a Web Worker's scope, engine/node/pool.ts to the
 * host's own thread when one worker is all a sweep needs.
 *
 *   prepare   validate the scenario, prepare its problem (under the size limit unless allowLarge), post
 *             'ready' with the description the report needs; 'fatal' when it cannot be prepared
 *   solve     solve one frequency in the thread's kept memory, assess it there (the problem chose its
 *             absorber at that frequency already), post 'result'; a failure is posted and the job goes on
 *   check     the order check: the problem one element order higher (prepared at the first check),
 *             solved at the frequency, posted as 'checked'; the record pairs it with its point
 *   estimate  prepare only and post the mesh and solver sizes
 *   field     keep a solved field as the total pressure; slice: sample a kept field on a plane
 *
 * A new kind of job is one more message in protocol.ts and one more handler here.
 */
import { formatIssues, validateScenario, type Issue, type NormalisedScenario } from '../scenario/index.ts';
import { prepareProblem, type PrepareOptions } from '../solve/prepare.ts';
import { ProblemTooLarge } from '../solve/size.ts';
import { elementOfCell, sampleSlice } from '../solve/slice.ts';
import type { Clock, Problem } from '../solve/problem.ts';
import type { AssessedPoint } from '../solve/points.ts';
import type { ComplexVector } from '../core/complex.ts';
import type { FromWorker, SweepDescription, ToWorker, ToWorkerMap } from './protocol.ts';
import { reportScenario } from './record.ts';

export interface JobOptions {
  now: Clock;
  /** How each problem this job prepares factors (kernels, helper threads from the host): engine/solve/prepare.ts PrepareOptions. */
  workspace?: PrepareOptions['workspace'];
  /** The problem the host has already prepared from the same scenario (a job in the host's own thread): used instead of preparing it again. */
  preset?: Problem;
}

export interface WorkerJob {
  receive(message: ToWorker): void;
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

function normalise(value: unknown): { scenario: NormalisedScenario; warnings: Issue[] } {
  const r = validateScenario(value);
  if (!r.ok) throw new Error(`the scenario has errors:\n${formatIssues(r.errors)}`);
  return { scenario: r.scenario, warnings: r.warnings };
}



/** The sweep's description: the problem's, the scenario as the report reads it, the file's warnings. */
export function describeSweep(scenario: NormalisedScenario, warnings: readonly { message: string }[], problem: Problem): SweepDescription {
  return { problem: problem.describe(), scenario: reportScenario(scenario), warnings: warnings.map((w) => ({ message: w.message })) };
}

/** One frequency solved and assessed in this thread. */
export function solveAndAssess(problem: Problem, frequencyHz: number, now: Clock, keepField: boolean): AssessedPoint {
  const point = problem.solve(frequencyHz, now, keepField);
  return { ...point, accuracy: problem.assess(point) };
}

export function createWorkerJob(post: (message: FromWorker) => void, opts: JobOptions): WorkerJob {
  const { now } = opts;
  const limits = (allowLarge: boolean): PrepareOptions => (allowLarge ? { maxDofs: Infinity, workspace: opts.workspace } : { workspace: opts.workspace });
  let problem: Problem | undefined, finer: Problem | Error | undefined, keepFields = false;
  let cellElements: Int32Array | undefined;
  const fields = new Map<number, ComplexVector>();

  const prepare = ({ scenario: value, keepFields: keep, allowLarge }: ToWorkerMap['prepare']) => {
    const t0 = now();
    try {
      const { scenario, warnings } = normalise(value);
      problem = opts.preset ?? prepareProblem(scenario, limits(allowLarge));
      keepFields = keep;
      post({ type: 'ready', description: describeSweep(scenario, warnings, problem), prepareSeconds: (now() - t0) / 1000 });
    } catch (e) {
      post({ type: 'fatal', message: messageOf(e) });
    }
  };

  const solve = (frequencyHz: number) => {
    if (!problem) return post({ type: 'failure', frequencyHz, message: 'the worker has no prepared scenario' });
    try {
      post({ type: 'result', point: solveAndAssess(problem, frequencyHz, now, keepFields) });
    } catch (e) {
      post({ type: 'failure', frequencyHz, message: messageOf(e) });
    }
  };

  const check = (frequencyHz: number) => {
    try {
      if (!problem) throw new Error('the worker has no prepared scenario');
      if (finer === undefined) {
        try {
          finer = problem.finer();
        } catch (e) {
          finer = e instanceof Error ? e : new Error(String(e)); // every later check fails the same way
        }
      }
      if (finer instanceof Error) throw finer;
      post({ type: 'checked', frequencyHz, point: finer.solve(frequencyHz, now, false) });
    } catch (e) {
      post({ type: 'check-failure', frequencyHz, message: messageOf(e) });
    }
  };

  const estimate = ({ id, scenario, allowLarge }: ToWorkerMap['estimate']) => {
    const t0 = now();
    try {
      const p = prepareProblem(normalise(scenario).scenario, limits(allowLarge));
      post({ type: 'estimate', id, info: p.info, prepareSeconds: (now() - t0) / 1000 });
    } catch (e) {
      post({ type: 'estimate-error', id, message: messageOf(e), tooLarge: e instanceof ProblemTooLarge });
    }
  };

  const keep = ({ frequencyHz, re, im }: ToWorkerMap['field']) => {
    // kept as the total pressure (a duct's inlet run holds the reflected wave alone in the solver's unknowns)
    fields.set(frequencyHz, problem ? problem.totalField(frequencyHz, { re, im }) : { re, im });
  };

  const slice = ({ id, frequencyHz, request }: ToWorkerMap['slice']) => {
    try {
      if (!problem) throw new Error('the field worker has no prepared scenario');
      const u = fields.get(frequencyHz);
      if (!u) throw new Error(`no field kept at ${frequencyHz} Hz`);
      cellElements ??= elementOfCell(problem.mesh);
      post({ type: 'slice', id, slice: sampleSlice(problem.mesh, cellElements, u, problem.bounds, frequencyHz, request) });
    } catch (e) {
      post({ type: 'slice-error', id, message: messageOf(e) });
    }
  };

  return {
    receive(m) {
      switch (m.type) {
        case 'prepare': return prepare(m);
        case 'solve': return solve(m.frequencyHz);
        case 'check': return check(m.frequencyHz);
        case 'estimate': return estimate(m);
        case 'field': return keep(m);
        case 'slice': return slice(m);
      }
    },
  };
}
