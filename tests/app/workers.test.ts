// The renderer's worker traffic with fake workers: the run state the engine's sweep events drive, the
// estimate worker's superseding, and the field worker's latest-slice rule. (The scheduler itself, shared with
// the command line, is tested in tests/sweep.)
import { describe, expect, it } from 'vitest';
import type { Slice } from '../../engine/sweep/protocol.ts';
import type { SweepEvent } from '../../engine/sweep/scheduler.ts';
import { createEstimator } from '../../app/renderer/services/estimator.ts';
import { createFieldService, SupersededError } from '../../app/renderer/services/fields.ts';
import { progressOf, runEvent, startedRun, type RunState } from '../../app/renderer/model/run.ts';
import { validateScenario } from '../../engine/scenario/index.ts';
import { demoById } from '../../app/renderer/model/demos.ts';
import { DESCRIPTION, FakeWorker, INFO, point } from '../sweep/fakes.ts';

describe('run state', () => {
  const v = validateScenario(demoById('plant-room-supply-silencer')!.draft);
  if (!v.ok) throw new Error('demo invalid');
  const s = v.scenario, all = s.sweep.frequenciesHz, [f0, f1, f2] = all;
  const fold = (r: RunState, events: SweepEvent[]) => events.reduce(runEvent, r);
  const started = (f: number, at: number): SweepEvent => ({ type: 'started', job: { kind: 'solve', frequencyHz: f }, worker: 0, at });
  it('moves through prepare, solve and finish, and keeps points sorted without fields', () => {
    let r = fold(startedRun(1, s, {}, [], 2, 0), [{ type: 'queued', frequenciesHz: [...all], checkHz: [f1], at: 0 }]);
    expect(r.status).toBe('preparing');
    r = fold(r, [{ type: 'ready', description: DESCRIPTION, prepareSeconds: 0, at: 0 }, started(f0, 0), started(f1, 0), { type: 'result', point: point(f1, 10, true), at: 2000 }, { type: 'result', point: point(f0), at: 3000 }]);
    expect(r.status).toBe('running');
    expect(r.record.points.map((p) => p.frequencyHz)).toEqual([f0, f1]);
    expect(r.record.points.every((p) => !('field' in p))).toBe(true);
    expect(r.record.frequencies[1]).toMatchObject({ status: 'done', seconds: 2 });
    // 9 queued and one order check (counted as two), mean 2.5 s per frequency over 2 workers, nothing in flight
    expect(progressOf(r, 3000, null).remainingSeconds).toBeCloseTo(((all.length - 2 + 2) * 2.5) / 2, 12);
    r = fold(r, [{ type: 'started', job: { kind: 'check', frequencyHz: f1 }, worker: 1, at: 3000 }, { type: 'checked', frequencyHz: f1, point: point(f1, 10.9), at: 3500 }]);
    expect(r.record.points[1].accuracy.flags).toEqual(['order']);
    expect(r.record.checks.map((c) => [c.frequencyHz, c.status])).toEqual([[f1, 'done']]);
    r = fold(r, [started(f2, 3000), { type: 'failure', frequencyHz: f2, message: 'singular', at: 4000 }]);
    const done = runEvent(r, { type: 'done', cancelled: true, unsolved: [], at: 5000 });
    expect(done.status).toBe('cancelled');
    expect(done.record.frequencies.filter((x) => x.status === 'unsolved')).toHaveLength(all.length - 3);
    expect(done.message).toBe(`Cancelled: 2 of ${all.length} frequencies solved and kept.`);
    expect(progressOf(done, 9999, null)).toMatchObject({ done: 2, failed: 1, elapsedSeconds: 5, remainingSeconds: 0 });
  });
  it('estimates the time left from the prediction before anything finished', () => {
    const r = fold(startedRun(1, s, {}, [], 1, 0), [{ type: 'queued', frequenciesHz: [...all], checkHz: [], at: 0 }, { type: 'ready', description: DESCRIPTION, prepareSeconds: 0, at: 0 }, started(f0, 0)]);
    expect(progressOf(r, 500, 2).remainingSeconds).toBeCloseTo(1.5 + (all.length - 1) * 2, 12);
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
