import { describe, expect, it } from 'vitest';
import { bandsBetween, OCTAVE_RATIO } from '../../engine/acoustics/index.ts';
import { mergeSamples, pressureLevelQuantity, sampleTable, samplingPolicy, transmissionLossQuantity, type Sample } from '../../engine/spectrum/index.ts';
import { chainSolver, chamberChain, runPolicy } from './helpers.ts';

const TL = transmissionLossQuantity([{ channel: 0 }]);
const THIRDS = bandsBetween(63, 250, 3);

describe('the sampling policy as the scheduler sees it', () => {
  it('starts from every band edge and points at most 1/6 octave apart, nothing in gaps no band spans', () => {
    const bands = [...bandsBetween(63, 80, 3), ...bandsBetween(500, 500, 1)];
    const initial = samplingPolicy({ bands, quantities: [TL] }).initial();
    for (const b of bands) {
      expect(initial.some((f) => Math.abs(f - b.lowHz) < 1e-9 * f)).toBe(true);
      expect(initial.some((f) => Math.abs(f - b.highHz) < 1e-9 * f)).toBe(true);
    }
    for (let i = 1; i < initial.length; i++) {
      expect(initial[i]).toBeGreaterThan(initial[i - 1]);
      const inBand = bands.some((b) => initial[i - 1] >= b.lowHz * (1 - 1e-9) && initial[i] <= b.highHz * (1 + 1e-9));
      if (inBand) expect(initial[i] / initial[i - 1]).toBeLessThanOrEqual(OCTAVE_RATIO ** (1 / 6) * (1 + 1e-12));
    }
    // nothing between the 80 Hz third (up to 89 Hz) and the 500 Hz octave (from 355 Hz)
    expect(initial.filter((f) => f > 90 && f < 350)).toEqual([]);
  });

  it('proposes at most a batch, never a solved, busy or failed frequency, and stops on its budget', () => {
    const policy = samplingPolicy({ bands: THIRDS, quantities: [TL], batch: 3, maxSolves: 20 });
    const solver = chainSolver(chamberChain(4, 1));
    const samples: Sample[] = [];
    const busy: number[] = [], failed: number[] = [];
    for (let step = 0; !policy.done(samples, busy, failed); step++) {
      const next = policy.next(samples, busy, failed);
      expect(next.length).toBeLessThanOrEqual(3);
      for (const f of next) {
        expect([...samples.map((s) => s.frequencyHz), ...busy, ...failed].some((g) => Math.abs(g - f) < 1e-9 * f)).toBe(false);
      }
      // one of each batch stays busy a round, every fifth fails
      busy.splice(0).forEach((f) => samples.push(solver.solve(f)));
      next.forEach((f, i) => (i === 0 ? busy.push(f) : step % 5 === 4 && i === 1 ? failed.push(f) : samples.push(solver.solve(f))));
      expect(step).toBeLessThan(100);
    }
    expect(samples.length + failed.length).toBeLessThanOrEqual(20 + 3);
  });

  it('replaces a band edge whose solve failed by a point just beyond it', () => {
    const policy = samplingPolicy({ bands: THIRDS, quantities: [TL] });
    const solver = chainSolver(chamberChain(4, 1));
    const edge = THIRDS[1].lowHz; // shared by the 63 and 80 Hz bands
    const samples = policy.initial().filter((f) => f !== edge).map(solver.solve);
    const next = policy.next(samples, [], [edge]);
    expect(next).toEqual([edge * 0.995, edge / 0.995]);
    samples.push(...next.map(solver.solve));
    const done = runPolicy({ ...policy, next: (s) => policy.next(s, [], [edge]), done: (s) => policy.done(s, [], [edge]) }, solver.solve);
    const all = mergeSamples([samples, done]);
    expect(policy.bands(all).every((b) => b.status === 'ok')).toBe(true);
  });

  it('gives the same bands for the same points in any order, and one result per band and quantity', () => {
    const policy = samplingPolicy({ bands: THIRDS, quantities: [TL, { ...TL, name: 'tl-again' }] });
    const samples = runPolicy(policy, chainSolver(chamberChain(3, 0.7)).solve);
    const shuffled = samples.map((s, i) => ({ s, k: (i * 7919) % samples.length })).sort((a, b) => a.k - b.k).map((x) => x.s);
    const results = policy.bands(samples);
    expect(policy.bands(shuffled)).toEqual(results);
    expect(results.map((r) => `${r.band.nominalHz}:${r.quantity}`)).toEqual(THIRDS.flatMap((b) => [`${b.nominalHz}:tl`, `${b.nominalHz}:tl-again`]));
  });

  it('forms sound pressure levels re 20 µPa from complex peak pressures', () => {
    const p = 2e-3; // a flat 2 mPa peak: mean square p²/2, level 20·log10(p/√2/20 µPa)
    const policy = samplingPolicy({ bands: THIRDS, quantities: [pressureLevelQuantity(0, 'receiver')] });
    const samples = runPolicy(policy, (f) => ({ frequencyHz: f, re: [p], im: [0] }));
    for (const r of policy.bands(samples)) {
      // common practice: SPL = 20·log10(p_rms/20 µPa) with p_rms = |p̂|/√2 (ISO 1683 reference)
      expect(r.valueDb).toBeCloseTo(20 * Math.log10(p / Math.SQRT2 / 20e-6), 9);
    }
  });
});

describe('samples', () => {
  it('refuse two different results for one frequency, naming it', () => {
    const a = { frequencyHz: 125, re: [1], im: [0] }, b = { frequencyHz: 125, re: [1.5], im: [0] };
    expect(() => sampleTable([a, b])).toThrow(/125 Hz was solved twice with different results/);
    expect(sampleTable([a, { ...a }]).frequencyHz).toEqual(Float64Array.of(125));
    expect(() => sampleTable([{ frequencyHz: -1, re: [0], im: [0] }])).toThrow(/frequencyHz must be a positive/);
    expect(() => sampleTable([{ frequencyHz: 10, re: [NaN], im: [0] }])).toThrow(/leave failed solves out/);
  });
});
