// The worker pool's bookkeeping (with a stand-in worker), and the real worker against the main thread.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { performance } from 'node:perf_hooks';
import { solveFrequencies, type PoolOutcome } from '../../engine/node/pool.ts';
import { readScenario, type NormalisedScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { PointResult } from '../../engine/solve/points.ts';
import { ROOT } from './helpers.ts';

const FAKE = new URL('./fixtures/fake-worker.mjs', import.meta.url);
const fake = (behaviour: { crashAt?: number[]; hangAt?: number[]; failAt?: number[] }) => behaviour as unknown as NormalisedScenario;
const freqsOf = (points: { frequencyHz: number }[]) => points.map((p) => p.frequencyHz).sort((a, b) => a - b);

describe('worker pool (stand-in worker)', () => {
  it('streams every result and keeps going past a failed frequency', async () => {
    const seen: number[] = [];
    const out = await solveFrequencies(fake({ failAt: [2] }), [1, 2, 3, 4], { workers: 2, entry: FAKE, onResult: (p) => seen.push(p.frequencyHz) }).done;
    expect(freqsOf(out.results)).toEqual([1, 3, 4]);
    expect(seen.sort()).toEqual([1, 3, 4]);
    expect(out.failures).toEqual([{ frequencyHz: 2, message: 'singular at 2' }]);
    expect(out.cancelled).toBe(false);
  });

  it('reports a crashed worker with the frequency it was on, and loses no other result', async () => {
    const out = await solveFrequencies(fake({ crashAt: [3] }), [1, 2, 3, 4, 5, 6], { workers: 2, entry: FAKE }).done;
    expect(freqsOf(out.results)).toEqual([1, 2, 4, 5, 6]);
    expect(out.failures).toHaveLength(1);
    expect(out.failures[0].frequencyHz).toBe(3);
    expect(out.failures[0].message).toMatch(/solving 3 Hz stopped: boom at 3/);
  });

  it('ends, every frequency accounted for, when workers keep crashing', async () => {
    const all = [1, 2, 3, 4, 5, 6, 7, 8];
    const out = await solveFrequencies(fake({ crashAt: all }), all, { workers: 2, entry: FAKE }).done;
    expect(out.results).toEqual([]);
    expect(freqsOf(out.failures)).toEqual(all);
  });

  it('cancel terminates the workers and keeps the finished results', async () => {
    let cancel = () => undefined as void;
    const results: number[] = [];
    const run = solveFrequencies(fake({ hangAt: [3] }), [1, 2, 3, 4, 5], {
      workers: 2, entry: FAKE, onResult: (p) => { results.push(p.frequencyHz); if (results.length === 4) cancel(); },
    });
    cancel = run.cancel;
    const out: PoolOutcome = await run.done;
    expect(out.cancelled).toBe(true);
    expect(freqsOf(out.results)).toEqual([1, 2, 4, 5]);
    expect(out.unsolved).toEqual([3]);
  });

  it('order checks come back apart from the sweep, a failed check is not a failed frequency', async () => {
    const checked: number[] = [], checkFailed: number[] = [];
    const out = await solveFrequencies(fake({ failAt: [-3] }), [1, 2, 3], {
      workers: 2, entry: FAKE, checkFrequencies: [2, 3], onCheck: (p) => checked.push(p.frequencyHz), onCheckFailure: (f) => checkFailed.push(f.frequencyHz),
    }).done;
    expect(freqsOf(out.results)).toEqual([1, 2, 3]);
    expect(out.failures).toEqual([]);
    expect(out.checks.map((p) => [p.frequencyHz, (p as { tlDb: number }).tlDb])).toEqual([[2, 3]]);
    expect(out.checkFailures).toEqual([{ frequencyHz: 3, message: 'check singular at 3' }]);
    expect([checked, checkFailed]).toEqual([[2], [3]]);
  });

  it('a cancel drops the order checks not done; only sweep frequencies count as unsolved', async () => {
    let cancel = () => undefined as void;
    const run = solveFrequencies(fake({ hangAt: [2] }), [1, 2], {
      workers: 2, entry: FAKE, checkFrequencies: [1, 2], onCheck: () => cancel(),
    });
    cancel = run.cancel;
    const out = await run.done;
    expect(out.cancelled).toBe(true);
    expect(out.unsolved).toEqual([2]);
    expect(freqsOf(out.results)).toEqual([1]);
    expect(out.checks.map((p) => p.frequencyHz)).toEqual([1]);
  });

  it('transfers field arrays when asked', async () => {
    const out = await solveFrequencies(fake({}), [7, 8], { workers: 2, entry: FAKE, keepFields: true }).done;
    const p = out.results.find((r) => r.frequencyHz === 8)!;
    expect(p.field!.re).toBeInstanceOf(Float64Array);
    expect([p.field!.re[0], p.field!.im[0]]).toEqual([8, -8]);
  });
});

describe('worker pool (real worker)', () => {
  const scenario = readScenario(readFileSync(join(ROOT, 'scenarios/kitchen-extract-stub-resonator.json'), 'utf8')).scenario;
  const freqs = [scenario.sweep.frequenciesHz[0], scenario.sweep.frequenciesHz[3]];

  it('solves in worker threads exactly what the main thread solves', async () => {
    const out = await solveFrequencies(scenario, freqs, { workers: 2, keepFields: true }).done;
    expect(out.workers).toBe(2);
    expect(out.failures).toEqual([]);
    const prepared = prepareProblem(scenario);
    for (const f of freqs) {
      const here = prepared.solve(f, () => performance.now(), true) as PointResult & { kind: 'duct' };
      const there = out.results.find((r) => r.frequencyHz === f) as PointResult & { kind: 'duct' };
      expect(there.tlDb).toBe(here.tlDb);
      expect(there.field!.re).toEqual(here.field!.re);
    }
  });

  it('solves in this thread with one worker, and a cancel stops before the next frequency', async () => {
    let cancel = () => undefined as void;
    const run = solveFrequencies(scenario, freqs, { workers: 1, onResult: () => cancel() });
    cancel = run.cancel;
    const out = await run.done;
    expect(out.workers).toBe(0);
    expect(freqsOf(out.results)).toEqual([freqs[0]]);
    expect(out.unsolved).toEqual([freqs[1]]);
    expect(out.cancelled).toBe(true);
  });
});
