/**
 * The engine in a Web Worker: the only place the renderer's solves, mesh estimates and field slices run.
 * The role is fixed by the first message (see protocol.ts). A failure at one frequency is reported and
 * the worker goes on with the next; a scenario that cannot be prepared is 'fatal'.
 */
import { validateScenario, formatIssues, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { Problem } from '../../engine/solve/problem.ts';
import { ProblemTooLarge } from '../../engine/solve/size.ts';
import { ACCURACY_READING, FLAG_MEANINGS, THRESHOLDS, withOrderCheck } from '../../engine/solve/assess.ts';
import { defaultOrderCheckFrequencies } from '../../engine/sweep/plan.ts';
import type { ComplexVector } from '../../engine/linalg/sparse.ts';
import { elementOfCell, sampleSlice } from './field/sampler.ts';
import { transferOf, type FromWorker, type ToWorker, type WorkerScope } from './protocol.ts';

const scope = self as unknown as WorkerScope;
const now = () => performance.now();

function post(message: FromWorker): void {
  scope.postMessage(message, { transfer: transferOf(message) });
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

function normalise(value: unknown): NormalisedScenario {
  const r = validateScenario(value);
  if (!r.ok) throw new Error(`the scenario has errors:\n${formatIssues(r.errors)}`);
  return r.scenario;
}

let prepared: Problem | undefined;
let scenarioOf: NormalisedScenario | undefined;
/** The same scenario one order higher, for the order check: prepared on the first check. */
let finer: Problem | undefined;
let keepFields = false;
const fields = new Map<number, ComplexVector>();
let cellElements: Int32Array | undefined;

function limits(allowLarge: boolean) {
  return allowLarge ? { maxDofs: Infinity } : {};
}

function prepare(scenario: unknown, keep: boolean, allowLarge: boolean): void {
  const t0 = now();
  try {
    scenarioOf = normalise(scenario);
    prepared = prepareProblem(scenarioOf, limits(allowLarge));
    keepFields = keep;
    const accuracy = { reading: ACCURACY_READING, flagMeanings: { ...FLAG_MEANINGS }, thresholds: { ...THRESHOLDS }, planeWaveValidBelowHz: prepared.describe().planeWaveValidBelowHz };
    post({ type: 'ready', info: prepared.info, cutOns: prepared.cutOns(prepared.info.topFrequencyHz), accuracy, orderCheckHz: defaultOrderCheckFrequencies(scenarioOf.sweep.frequenciesHz), prepareSeconds: (now() - t0) / 1000 });
  } catch (e) {
    post({ type: 'fatal', message: messageOf(e) });
  }
}

function solve(frequencyHz: number): void {
  if (!prepared) return post({ type: 'failure', frequencyHz, message: 'the worker has no prepared scenario' });
  try {
    const solved = prepared.solve(frequencyHz, now, keepFields);
    post({ type: 'result', point: { ...solved, accuracy: prepared.assess(solved) } });
  } catch (e) {
    post({ type: 'failure', frequencyHz, message: messageOf(e) });
  }
}

function check(point: Extract<ToWorker, { type: 'check' }>['point']): void {
  const f = point.frequencyHz;
  try {
    if (!prepared) throw new Error('the worker has no prepared scenario');
    finer ??= prepared.finer();
    post({ type: 'checked', frequencyHz: f, accuracy: withOrderCheck(point.accuracy, point, finer.solve(f, now, false)) });
  } catch (e) {
    post({ type: 'check-failure', frequencyHz: f, message: messageOf(e) });
  }
}

function estimate(id: number, scenario: unknown, allowLarge: boolean): void {
  const t0 = now();
  try {
    const p = prepareProblem(normalise(scenario), limits(allowLarge));
    post({ type: 'estimate', id, info: p.info, prepareSeconds: (now() - t0) / 1000 });
  } catch (e) {
    post({ type: 'estimate-error', id, message: messageOf(e), tooLarge: e instanceof ProblemTooLarge });
  }
}

function slice(id: number, frequencyHz: number, request: Extract<ToWorker, { type: 'slice' }>['request']): void {
  try {
    if (!prepared) throw new Error('the field worker has no prepared scenario');
    const u = fields.get(frequencyHz);
    if (!u) throw new Error(`no field kept at ${frequencyHz} Hz`);
    const mesh = prepared.mesh;
    cellElements ??= elementOfCell(mesh);
    const b = prepared.bounds;
    post({ type: 'slice', id, slice: sampleSlice(mesh, cellElements, u, b, frequencyHz, request) });
  } catch (e) {
    post({ type: 'slice-error', id, message: messageOf(e) });
  }
}

scope.onmessage = (event) => {
  const m = event.data;
  switch (m.type) {
    case 'prepare': return prepare(m.scenario, m.keepFields, m.allowLarge);
    case 'solve': return solve(m.frequencyHz);
    case 'check': return check(m.point);
    case 'estimate': return estimate(m.id, m.scenario, m.allowLarge);
    case 'field':
      // Fields are kept as the total pressure (the solver's inlet run holds the reflected wave only).
      fields.set(m.frequencyHz, prepared ? prepared.totalField(m.frequencyHz, { re: m.re, im: m.im }) : { re: m.re, im: m.im });
      return;
    case 'slice': return slice(m.id, m.frequencyHz, m.request);
  }
};
