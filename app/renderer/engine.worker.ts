/**
 * The engine in a Web Worker: the only place the renderer's solves, mesh estimates and field slices run.
 * The role is fixed by the first message (see protocol.ts). A failure at one frequency is reported and
 * the worker goes on with the next; a scenario that cannot be prepared is 'fatal'.
 */
import { validateScenario, formatIssues, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { meshOf, prepareScenario, sectionCutOns, solvePoint, type Prepared } from '../../engine/solve/scenario.ts';
import { ProblemTooLarge } from '../../engine/solve/size.ts';
import { ACCURACY_READING, assessPoint, solveAssessed, defaultOrderCheckFrequencies, finerScenario, FLAG_MEANINGS, THRESHOLDS } from '../../engine/solve/accuracy.ts';
import { planeWaveValidBelowHz } from '../../engine/solve/planewave.ts';
import type { ComplexVector } from '../../engine/linalg/sparse.ts';
import { elementOfCell, sampleSlice } from './field/sampler.ts';
import { totalField } from './field/total.ts';
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

let prepared: Prepared | undefined;
/** The same scenario one order higher, for the order check: prepared on the first check. */
let finer: Prepared | undefined;
let allowLargeRun = false;
let keepFields = false;
const fields = new Map<number, ComplexVector>();
let cellElements: Int32Array | undefined;

function limits(allowLarge: boolean) {
  return allowLarge ? { maxDofs: Infinity } : {};
}

function prepare(scenario: unknown, keep: boolean, allowLarge: boolean): void {
  const t0 = now();
  try {
    prepared = prepareScenario(normalise(scenario), limits(allowLarge));
    keepFields = keep;
    allowLargeRun = allowLarge;
    const accuracy = { reading: ACCURACY_READING, flagMeanings: { ...FLAG_MEANINGS }, thresholds: { ...THRESHOLDS }, planeWaveValidBelowHz: planeWaveValidBelowHz(prepared) };
    post({ type: 'ready', info: prepared.info, cutOns: sectionCutOns(prepared, prepared.info.topFrequencyHz), accuracy, orderCheckHz: defaultOrderCheckFrequencies(prepared.scenario.sweep.frequenciesHz), prepareSeconds: (now() - t0) / 1000 });
  } catch (e) {
    post({ type: 'fatal', message: messageOf(e) });
  }
}

function solve(frequencyHz: number): void {
  if (!prepared) return post({ type: 'failure', frequencyHz, message: 'the worker has no prepared scenario' });
  try {
    post({ type: 'result', point: solveAssessed(prepared, frequencyHz, now, keepFields) });
  } catch (e) {
    post({ type: 'failure', frequencyHz, message: messageOf(e) });
  }
}

function check(point: Extract<ToWorker, { type: 'check' }>['point']): void {
  const f = point.frequencyHz;
  try {
    if (!prepared) throw new Error('the worker has no prepared scenario');
    finer ??= prepareScenario(finerScenario(prepared.scenario), limits(allowLargeRun));
    post({ type: 'checked', frequencyHz: f, accuracy: assessPoint(prepared, point, solvePoint(finer, f, now, false)) });
  } catch (e) {
    post({ type: 'check-failure', frequencyHz: f, message: messageOf(e) });
  }
}

function estimate(id: number, scenario: unknown, allowLarge: boolean): void {
  const t0 = now();
  try {
    const p = prepareScenario(normalise(scenario), limits(allowLarge));
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
    const mesh = meshOf(prepared);
    cellElements ??= elementOfCell(mesh);
    const b = prepared.geometry.bounds;
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
      fields.set(m.frequencyHz, prepared ? totalField(prepared, m.frequencyHz, { re: m.re, im: m.im }) : { re: m.re, im: m.im });
      return;
    case 'slice': return slice(m.id, m.frequencyHz, m.request);
  }
};
