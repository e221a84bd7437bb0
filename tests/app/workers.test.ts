// The renderer's worker traffic with fake workers: the run pool (queue, streaming, cancel, crashes),
// the run state it drives, the estimate worker's superseding, and the field worker's latest-slice rule.
import { describe, expect, it } from 'vitest';
import type { MeshInfo } from '../../engine/solve/problem.ts';
import type { PointAccuracy } from '../../engine/solve/points.ts';
import { transferOf, type AccuracyInfo, type AssessedPoint, type FromWorker, type Slice, type ToWorker, type WorkerPort } from '../../app/renderer/protocol.ts';
import { runPool, type PoolEvents } from '../../app/renderer/services/pool.ts';
import { createEstimator } from '../../app/renderer/services/estimator.ts';
import { createFieldService, SupersededError } from '../../app/renderer/services/fields.ts';
import { checkStarted, finishedRun, frequencyFailed, frequencySolved, frequencyStarted, pointChecked, preparedRun, progressOf, startedRun } from '../../app/renderer/model/run.ts';
import { validateScenario } from '../../engine/scenario/index.ts';
import { demoById } from '../../app/renderer/model/demos.ts';

const INFO: MeshInfo = { order: 4, pointsPerWavelength: 6, topFrequencyHz: 500, absorberKind: 'discrete', layers: 3, elements: 10, dofs: 100, nnz: 1000, factorNonzeros: 500, factorFlops: 1e6, memoryEstimateBytes: 1e6, workerMemoryBytes: 2e6 };

const ACCURACY: AccuracyInfo = { reading: 'r', flagMeanings: {}, thresholds: {}, planeWaveValidBelowHz: null };
const ready = (orderCheckHz: number[] = []): FromWorker => ({ type: 'ready', info: INFO, cutOns: [], accuracy: ACCURACY, orderCheckHz, prepareSeconds: 0 });
const accuracy = (f: number, over: Partial<PointAccuracy> = {}): PointAccuracy => ({ frequencyHz: f, reflectionEstimate: 1e-5, energyBalance: 1e-6, orderCheckDb: null, tlPlaneDb: null, planeWaveValid: null, flags: [], ...over });

function point(f: number, field = false): AssessedPoint {
  return {
    kind: 'duct', frequencyHz: f, tlDb: 10, tlIntensityDb: 10, tlDecompositionDb: 10, method: 'intensity', inletReflection: 0.5, inletAbsorption: 0.75,
    incidentPower: 1, transmittedPower: 0.1, reflectedPower: 0.25, energyBalance: 0.65,
    stats: { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, residual: 0, assembleSeconds: 0 },
    field: field ? { re: new Float64Array(4), im: new Float64Array(4) } : undefined, accuracy: accuracy(f),
  } as AssessedPoint;
}

class FakeWorker implements WorkerPort {
  onmessage: ((e: { data: FromWorker }) => void) | null = null;
  onerror: ((e: { message?: string }) => void) | null = null;
  received: ToWorker[] = [];
  terminated = false;
  postMessage(m: ToWorker) { this.received.push(m); }
  terminate() { this.terminated = true; }
  reply(m: FromWorker) { this.onmessage?.({ data: m }); }
  lastSolve(): number | undefined { const s = this.received.filter((m) => m.type === 'solve').pop(); return s?.type === 'solve' ? s.frequencyHz : undefined; }
}

function harness(freqs: number[], workers: number, orderCheck = false) {
  const made: FakeWorker[] = [], log: string[] = [];
  let outcome: { cancelled: boolean; unsolved: number[] } | null = null;
  const events: PoolEvents = {
    ready: () => log.push('ready'), started: (f, w, _at, check) => log.push(`${check ? 'check' : 'start'} ${f}@${w}`), result: (p) => log.push(`result ${p.frequencyHz}`),
    failure: (f, m) => log.push(`fail ${f}: ${m}`), done: (o) => { outcome = o; },
    checked: (f, a) => log.push(`checked ${f}: ${a.orderCheckDb}`), checkFailed: (f, m) => log.push(`check failed ${f}: ${m}`),
  };
  const run = runPool({ scenario: true }, freqs, { workers, keepFields: true, allowLarge: false, orderCheck, createWorker: () => { const w = new FakeWorker(); made.push(w); return w; }, now: () => 0 }, events);
  return { made, log, run, outcome: () => outcome };
}

describe('run pool', () => {
  it('starts no more workers than frequencies, each prepared once, and feeds them from one queue', () => {
    const h = harness([100, 200, 300], 8);
    expect(h.made).toHaveLength(3);
    for (const w of h.made) expect(w.received).toEqual([{ type: 'prepare', role: 'solve', scenario: { scenario: true }, keepFields: true, allowLarge: false }]);
    const h2 = harness([100, 200, 300], 2);
    expect(h2.made).toHaveLength(2);
    const [a, b] = h2.made;
    a.reply(ready());
    b.reply(ready());
    expect([a.lastSolve(), b.lastSolve()]).toEqual([100, 200]);
    b.reply({ type: 'result', point: point(200) });
    expect(b.lastSolve()).toBe(300);
    b.reply({ type: 'result', point: point(300) });
    expect(b.terminated).toBe(true);
    a.reply({ type: 'failure', frequencyHz: 100, message: 'singular' });
    expect(h2.outcome()).toEqual({ cancelled: false, unsolved: [] });
    expect(h2.log).toEqual(['ready', 'start 100@0', 'start 200@1', 'result 200', 'start 300@1', 'result 300', 'fail 100: singular']);
  });

  it('cancels at once: workers terminated, finished results kept, the rest listed unsolved', () => {
    const h = harness([100, 200, 300, 400], 2);
    h.made.forEach((w) => w.reply(ready()));
    h.made[0].reply({ type: 'result', point: point(100) });
    h.run.cancel();
    expect(h.made.every((w) => w.terminated)).toBe(true);
    expect(h.outcome()).toEqual({ cancelled: true, unsolved: [200, 300, 400] });
    h.made[1].reply({ type: 'result', point: point(200) });
    expect(h.log.filter((l) => l.startsWith('result'))).toEqual(['result 100']);
  });

  it('replaces a crashed worker once per worker, then fails what is left', () => {
    const h = harness([100, 200], 1);
    h.made[0].reply(ready());
    h.made[0].onerror!({ message: 'out of memory' });
    expect(h.made).toHaveLength(2);
    expect(h.log).toContain('fail 100: the worker solving 100 Hz stopped: out of memory');
    h.made[1].onerror!({ message: 'again' });
    expect(h.log).toContain('fail 200: not solved: every worker stopped (last: again)');
    expect(h.outcome()).toEqual({ cancelled: false, unsolved: [] });
  });

  it('fails everything with the reason when the scenario cannot be prepared', () => {
    const h = harness([100, 200, 300], 2);
    h.made[0].reply({ type: 'fatal', message: 'too large' });
    expect(h.log).toEqual(['fail 100: too large', 'fail 200: too large', 'fail 300: too large']);
    expect(h.made.every((w) => w.terminated)).toBe(true);
  });

  it('runs the order checks after the sweep, each once its own point is solved', () => {
    const h = harness([100, 200, 300], 2, true);
    const [a, b] = h.made;
    a.reply(ready([200, 300]));
    b.reply(ready([200, 300]));
    a.reply({ type: 'result', point: point(100) });
    expect(a.received.at(-1)).toEqual({ type: 'solve', frequencyHz: 300 });
    // the sweep queue is empty and 200 Hz is still being solved: b's check of it must wait
    b.reply({ type: 'result', point: point(200) });
    const check = b.received.at(-1) as Extract<ToWorker, { type: 'check' }>;
    expect(check.type).toBe('check');
    expect(check.point.frequencyHz).toBe(200);
    expect('field' in check.point && check.point.field !== undefined).toBe(false);
    a.reply({ type: 'result', point: point(300) });
    expect(a.received.at(-1)).toMatchObject({ type: 'check', point: { frequencyHz: 300 } });
    b.reply({ type: 'checked', frequencyHz: 200, accuracy: accuracy(200, { orderCheckDb: 0.1 }) });
    a.reply({ type: 'check-failure', frequencyHz: 300, message: 'singular' });
    expect(h.outcome()).toEqual({ cancelled: false, unsolved: [] });
    expect(h.log).toEqual(['ready', 'start 100@0', 'start 200@1', 'result 100', 'start 300@0', 'result 200', 'check 200@1', 'result 300', 'check 300@0', 'checked 200: 0.1', 'check failed 300: singular']);
  });

  it('transfers field buffers rather than copying them', () => {
    const p = point(100, true);
    expect(transferOf({ type: 'result', point: p })).toEqual([p.field!.re.buffer, p.field!.im.buffer]);
    expect(transferOf({ type: 'solve', frequencyHz: 1 })).toEqual([]);
  });
});

describe('run state', () => {
  const v = validateScenario(demoById('plant-room-supply-silencer')!.draft);
  if (!v.ok) throw new Error('demo invalid');
  const s = v.scenario, [f0, f1, f2] = s.sweep.frequenciesHz;
  it('moves through prepare, solve and finish, and keeps points sorted without fields', () => {
    let r = preparedRun(startedRun(1, s, {}, [], 2, 0), INFO, [], ACCURACY, [f1]);
    r = frequencyStarted(frequencyStarted(r, f0, 0), f1, 0);
    r = frequencySolved(r, point(f1, true), 2000);
    r = frequencySolved(r, point(f0), 3000);
    expect(r.points.map((p) => p.frequencyHz)).toEqual([f0, f1]);
    expect(r.points.every((p) => !('field' in p))).toBe(true);
    expect(r.frequencies[1]).toMatchObject({ status: 'done', seconds: 2 });
    // 9 queued and one order check (counted as two), mean 2.5 s per frequency over 2 workers, nothing in flight
    expect(progressOf(r, 3000, null).remainingSeconds).toBeCloseTo(((s.sweep.frequenciesHz.length - 2 + 2) * 2.5) / 2, 12);
    r = pointChecked(checkStarted(r, f1), f1, accuracy(f1, { orderCheckDb: 0.9, flags: ['order'] }));
    expect(r.points[1].accuracy.flags).toEqual(['order']);
    expect(r.checks).toEqual([{ frequencyHz: f1, status: 'done' }]);
    r = frequencyFailed(frequencyStarted(r, f2, 3000), f2, 'singular', 4000);
    const done = finishedRun(r, true, [], 5000);
    expect(done.status).toBe('cancelled');
    expect(done.frequencies.filter((x) => x.status === 'unsolved')).toHaveLength(s.sweep.frequenciesHz.length - 3);
    expect(done.message).toBe(`Cancelled: 2 of ${s.sweep.frequenciesHz.length} frequencies solved and kept.`);
    expect(progressOf(done, 9999, null)).toMatchObject({ done: 2, failed: 1, elapsedSeconds: 5, remainingSeconds: 0 });
  });
  it('estimates the time left from the prediction before anything finished', () => {
    const r = frequencyStarted(preparedRun(startedRun(1, s, {}, [], 1, 0), INFO, []), f0, 0);
    expect(progressOf(r, 500, 2).remainingSeconds).toBeCloseTo(1.5 + (s.sweep.frequenciesHz.length - 1) * 2, 12);
    expect(progressOf(r, 500, null).remainingSeconds).toBeNull();
  });
});

describe('estimator', () => {
  it('waits for the edits to settle, and a newer request replaces a busy worker', () => {
    const made: FakeWorker[] = [], timers: (() => void)[] = [];
    const e = createEstimator(() => { const w = new FakeWorker(); made.push(w); return w; }, { set: (f) => { timers.push(f); return timers.length; }, clear: () => undefined });
    e.request({ a: 1 }, false);
    expect(e.store.get().status).toBe('working');
    expect(made).toHaveLength(0);
    timers.shift()!();
    const first = made[0], id1 = (first.received[0] as { id: number }).id;
    e.request({ a: 2 }, false);
    timers.shift()!();
    expect(first.terminated).toBe(true);
    const second = made[1], id2 = (second.received[0] as { id: number }).id;
    first.reply({ type: 'estimate', id: id1, info: { ...INFO, dofs: 1 }, prepareSeconds: 0 });
    expect(e.store.get().info).toBeNull();
    second.reply({ type: 'estimate', id: id2, info: INFO, prepareSeconds: 0.1 });
    expect(e.store.get()).toMatchObject({ status: 'ready', info: INFO });
    e.request({ a: 2 }, false);
    expect(timers).toHaveLength(0);
  });
  it('reports a refusal for size', () => {
    const made: FakeWorker[] = [];
    const e = createEstimator(() => { const w = new FakeWorker(); made.push(w); return w; }, { set: (f) => { f(); return 0; }, clear: () => undefined });
    e.request({ big: true }, false);
    made[0].reply({ type: 'estimate-error', id: (made[0].received[0] as { id: number }).id, message: 'too many unknowns', tooLarge: true });
    expect(e.store.get()).toMatchObject({ status: 'error', tooLarge: true, message: 'too many unknowns' });
  });
});

describe('field service', () => {
  const slice = (f: number): Slice => ({ frequencyHz: f, axis: 2, position: 0, u: new Float64Array(1), v: new Float64Array(1), re: new Float64Array(1), im: new Float64Array(1) });
  it('samples one slice at a time and answers only the newest of those waiting', async () => {
    const made: FakeWorker[] = [];
    const s = createFieldService(() => { const w = new FakeWorker(); made.push(w); return w; });
    s.begin({}, false);
    const w = made[0];
    expect(w.received[0]).toMatchObject({ type: 'prepare', role: 'field' });
    s.keep(100, new Float64Array(2), new Float64Array(2));
    expect(w.received[1]).toMatchObject({ type: 'field', frequencyHz: 100 });
    const a = s.slice(100, { axis: 2, position: 0, maxSamples: 10 });
    const b = s.slice(100, { axis: 1, position: 0, maxSamples: 10 });
    const c = s.slice(100, { axis: 0, position: 0, maxSamples: 10 });
    const sent = () => w.received.filter((m) => m.type === 'slice');
    expect(sent()).toHaveLength(1);
    await expect(b).rejects.toBeInstanceOf(SupersededError);
    w.reply({ type: 'slice', id: (sent()[0] as { id: number }).id, slice: slice(100) });
    await expect(a).resolves.toMatchObject({ frequencyHz: 100 });
    expect(sent()).toHaveLength(2);
    expect(sent()[1]).toMatchObject({ request: { axis: 0 } });
    w.reply({ type: 'slice-error', id: (sent()[1] as { id: number }).id, message: 'no field kept at 100 Hz' });
    await expect(c).rejects.toThrow('no field kept at 100 Hz');
  });
});
