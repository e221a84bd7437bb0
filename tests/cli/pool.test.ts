// The command line's host of the sweep (engine/node/pool.ts): the scheduler over worker_threads with a
// stand-in worker (bookkeeping: failures, crashes, cancel, order checks, transfers), then with the real worker
// against the main thread, and in the main thread alone.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { solveSweep, type NodeSweepOptions } from '../../engine/node/pool.ts';
import { recordOf, type SweepRecord } from '../../engine/sweep/record.ts';
import type { SweepEvent, SweepOutcome } from '../../engine/sweep/scheduler.ts';
import { readScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { DuctPoint } from '../../engine/solve/points.ts';
import { ROOT } from './helpers.ts';

const FAKE = new URL('./fixtures/fake-worker.mjs', import.meta.url);
const freqsOf = (points: readonly { frequencyHz: number }[]) => points.map((p) => p.frequencyHz).sort((a, b) => a - b);

interface Ran { record: SweepRecord; outcome: SweepOutcome; events: SweepEvent[] }

/** Runs the host, folding its events into a record; `during` sees each event and may cancel. */
async function sweep(opts: Omit<NodeSweepOptions, 'onEvent' | 'keepFields' | 'allowLarge'> & { keepFields?: boolean }, during?: (e: SweepEvent, cancel: () => void) => void): Promise<Ran> {
  const events: SweepEvent[] = [];
  let cancel = () => undefined as void;
  const run = solveSweep({ keepFields: false, allowLarge: true, ...opts, onEvent: (e) => { events.push(e); during?.(e, cancel); } });
  cancel = run.cancel;
  const outcome = await run.done;
  return { record: recordOf(events, 0), outcome, events };
}
const failures = (r: SweepRecord) => r.frequencies.filter((s) => s.status === 'failed').map((s) => ({ frequencyHz: s.frequencyHz, message: s.message }));

describe('the command line\'s sweep host (stand-in worker)', () => {
  it('streams every result and keeps going past a failed frequency', async () => {
    const { record, events } = await sweep({ scenario: { failAt: [2] }, plan: [1, 2, 3, 4], workers: 2, entry: FAKE });
    expect(freqsOf(record.points)).toEqual([1, 3, 4]);
    expect(events.filter((e) => e.type === 'result')).toHaveLength(3);
    expect(failures(record)).toEqual([{ frequencyHz: 2, message: 'singular at 2' }]);
    expect(record.status).toBe('done');
  });

  it('reports a crashed worker with the frequency it was on, and loses no other result', async () => {
    const { record } = await sweep({ scenario: { crashAt: [3] }, plan: [1, 2, 3, 4, 5, 6], workers: 2, entry: FAKE });
    expect(freqsOf(record.points)).toEqual([1, 2, 4, 5, 6]);
    expect(failures(record)).toHaveLength(1);
    expect(failures(record)[0].frequencyHz).toBe(3);
    expect(failures(record)[0].message).toMatch(/solving 3 Hz stopped: boom at 3/);
  });

  it('ends, every frequency accounted for, when workers keep crashing', async () => {
    const all = [1, 2, 3, 4, 5, 6, 7, 8];
    const { record } = await sweep({ scenario: { crashAt: all }, plan: all, workers: 2, entry: FAKE });
    expect(record.points).toEqual([]);
    expect(freqsOf(failures(record))).toEqual(all);
  });

  it('cancel terminates the workers and keeps the finished results', async () => {
    let results = 0;
    const { record, outcome } = await sweep({ scenario: { hangAt: [3] }, plan: [1, 2, 3, 4, 5], workers: 2, entry: FAKE }, (e, cancel) => { if (e.type === 'result' && ++results === 4) cancel(); });
    expect(outcome.cancelled).toBe(true);
    expect(freqsOf(record.points)).toEqual([1, 2, 4, 5]);
    expect(outcome.unsolved).toEqual([3]);
    expect(record.frequencies.find((s) => s.frequencyHz === 3)!.status).toBe('unsolved');
  });

  it('order checks come back apart from the sweep, a failed check is not a failed frequency', async () => {
    const { record } = await sweep({ scenario: { failAt: [-3] }, plan: [1, 2, 3], checkHz: [2, 3], workers: 2, entry: FAKE });
    expect(freqsOf(record.points)).toEqual([1, 2, 3]);
    expect(failures(record)).toEqual([]);
    expect(record.checks.map((c) => [c.frequencyHz, c.status, c.finer?.kind === 'duct' ? c.finer.tlDb : c.message])).toEqual([[2, 'done', 3], [3, 'failed', 'check singular at 3']]);
    expect(record.points[1].accuracy.orderCheckDb).toBe(1);
  });

  it('a cancel drops the order checks not done; only sweep frequencies count as unsolved', async () => {
    const { record, outcome } = await sweep({ scenario: { hangAt: [2] }, plan: [1, 2], checkHz: [1, 2], workers: 2, entry: FAKE }, (e, cancel) => { if (e.type === 'checked') cancel(); });
    expect(outcome.cancelled).toBe(true);
    expect(outcome.unsolved).toEqual([2]);
    expect(freqsOf(record.points)).toEqual([1]);
    expect(record.checks.map((c) => [c.frequencyHz, c.status])).toEqual([[1, 'done'], [2, 'dropped']]);
  });

  it('transfers field arrays when asked', async () => {
    const { events } = await sweep({ scenario: {}, plan: [7, 8], workers: 2, entry: FAKE, keepFields: true });
    const p = events.flatMap((e) => (e.type === 'result' && e.point.frequencyHz === 8 ? [e.point] : []))[0];
    expect(p.field!.re).toBeInstanceOf(Float64Array);
    expect([p.field!.re[0], p.field!.im[0]]).toEqual([8, -8]);
  });
});

describe('the command line\'s sweep host (real worker)', () => {
  const text = readFileSync(join(ROOT, 'scenarios/kitchen-extract-stub-resonator.json'), 'utf8');
  const scenario = readScenario(text).scenario, value = JSON.parse(text) as unknown;
  const freqs = [scenario.sweep.frequenciesHz[0], scenario.sweep.frequenciesHz[3]];

  it('solves in worker threads exactly what the main thread solves', async () => {
    const { record, outcome, events } = await sweep({ scenario: value, plan: freqs, workers: 2, keepFields: true });
    expect(outcome.workers).toBe(2);
    expect(failures(record)).toEqual([]);
    const problem = prepareProblem(scenario);
    for (const f of freqs) {
      const here = problem.solve(f, () => performance.now(), true) as DuctPoint;
      const there = events.flatMap((e) => (e.type === 'result' && e.point.frequencyHz === f ? [e.point as DuctPoint] : []))[0];
      expect(there.tlDb).toBe(here.tlDb);
      expect(there.field!.re).toEqual(here.field!.re);
    }
  });

  it('solves in this thread with one worker, and a cancel stops before the next frequency', async () => {
    const { record, outcome } = await sweep({ scenario: value, plan: freqs, workers: 1 }, (e, cancel) => { if (e.type === 'result') cancel(); });
    expect(outcome.workers).toBe(0);
    expect(freqsOf(record.points)).toEqual([freqs[0]]);
    expect(outcome.unsolved).toEqual([freqs[1]]);
    expect(outcome.cancelled).toBe(true);
  });
});
