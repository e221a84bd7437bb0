import { describe, expect, it } from 'vitest';
import { bandsBetween, OCTAVE_RATIO, pointsInBand, sweepFrequencies } from '../../engine/acoustics/index.ts';

describe('sweepFrequencies', () => {
  it('gives the exact midbands for one point per band', () => {
    const sweep = sweepFrequencies({ fromHz: 50, toHz: 1000, spacing: 'third-octave' });
    const bands = bandsBetween(50, 1000, 3);
    expect(sweep.frequenciesHz).toEqual(bands.map((b) => b.exactHz));
    expect(sweep.bands).toEqual(bands);
    expect(sweep.bandOfPoint).toEqual(bands.map((_, i) => i));
  });

  it('spreads n points evenly in log f, so a sweep over contiguous bands is one geometric series', () => {
    const n = 4;
    const sweep = sweepFrequencies({ fromHz: 63, toHz: 2000, spacing: 'octave', pointsPerBand: n });
    const f = sweep.frequenciesHz;
    expect(f).toHaveLength(6 * n);
    // Each point sits at f_low·(f_high/f_low)^((i + ½)/n) and bands are contiguous (IEC 61260-1:2014 edges),
    // so consecutive points differ by the constant factor G^(1/n).
    for (let i = 1; i < f.length; i++) expect(f[i] / f[i - 1]).toBeCloseTo(OCTAVE_RATIO ** (1 / n), 12);
    sweep.bands!.forEach((band, b) => {
      const inBand = f.filter((_, i) => sweep.bandOfPoint![i] === b);
      expect(inBand).toHaveLength(n);
      for (const x of inBand) expect(x > band.lowHz && x < band.highHz).toBe(true);
      // Their geometric mean is the exact midband.
      const geo = Math.exp(inBand.reduce((s, x) => s + Math.log(x), 0) / n);
      expect(geo).toBeCloseTo(band.exactHz, 9);
    });
  });

  it('places two points per third-octave band at f_m·G^(±1/12)', () => {
    const [band] = bandsBetween(1000, 1000, 3);
    const [lo, hi] = pointsInBand(band, 2);
    expect(lo).toBeCloseTo(1000 * OCTAVE_RATIO ** (-1 / 12), 9);
    expect(hi).toBeCloseTo(1000 * OCTAVE_RATIO ** (1 / 12), 9);
  });

  it('spaces linear and log sweeps between the end points', () => {
    expect(sweepFrequencies({ fromHz: 100, toHz: 500, spacing: 'linear', count: 5 }).frequenciesHz).toEqual([
      100, 200, 300, 400, 500,
    ]);
    const log = sweepFrequencies({ fromHz: 10, toHz: 10000, spacing: 'log', count: 4 }).frequenciesHz;
    [10, 100, 1000, 10000].forEach((f, i) => expect(log[i]).toBeCloseTo(f, 9));
    expect(log[3]).toBe(10000);
    expect(sweepFrequencies({ fromHz: 100, toHz: 400, spacing: 'log', count: 1 }).frequenciesHz[0]).toBeCloseTo(200, 12);
    expect(sweepFrequencies({ fromHz: 100, toHz: 300, spacing: 'linear', count: 1 }).frequenciesHz).toEqual([200]);
  });

  it('sorts an explicit list and drops repeats', () => {
    const sweep = sweepFrequencies({ frequenciesHz: [500, 100, 250, 100] });
    expect(sweep.frequenciesHz).toEqual([100, 250, 500]);
    expect(sweep.bands).toBeUndefined();
  });

  it('refuses bad specs', () => {
    expect(() => sweepFrequencies({ fromHz: 100, toHz: 50, spacing: 'log', count: 3 })).toThrow(RangeError);
    expect(() => sweepFrequencies({ fromHz: 0, toHz: 50, spacing: 'linear', count: 3 })).toThrow(RangeError);
    expect(() => sweepFrequencies({ fromHz: 50, toHz: 500, spacing: 'octave', pointsPerBand: 0 })).toThrow(RangeError);
    expect(() => sweepFrequencies({ fromHz: 50, toHz: 500, spacing: 'linear', count: 2.5 })).toThrow(RangeError);
    expect(() => sweepFrequencies({ frequenciesHz: [100, -1] })).toThrow(RangeError);
  });
});
