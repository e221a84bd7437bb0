import { describe, expect, it } from 'vitest';
import { aWeightingDb, bandsBetween, cWeightingDb } from '../../engine/acoustics/index.ts';

// Source: IEC 61672-1:2013, Table 3, frequency weightings A and C at the nominal frequencies 10 Hz … 20 kHz,
// rounded to 0.1 dB (from memory; agrees with secondary tabulations of the standard).
const TABLE: [nominalHz: number, aDb: number, cDb: number][] = [
  [10, -70.4, -14.3], [12.5, -63.4, -11.2], [16, -56.7, -8.5], [20, -50.5, -6.2], [25, -44.7, -4.4],
  [31.5, -39.4, -3.0], [40, -34.6, -2.0], [50, -30.2, -1.3], [63, -26.2, -0.8], [80, -22.5, -0.5],
  [100, -19.1, -0.3], [125, -16.1, -0.2], [160, -13.4, -0.1], [200, -10.9, 0.0], [250, -8.6, 0.0],
  [315, -6.6, 0.0], [400, -4.8, 0.0], [500, -3.2, 0.0], [630, -1.9, 0.0], [800, -0.8, 0.0],
  [1000, 0.0, 0.0], [1250, 0.6, 0.0], [1600, 1.0, -0.1], [2000, 1.2, -0.2], [2500, 1.3, -0.3],
  [3150, 1.2, -0.5], [4000, 1.0, -0.8], [5000, 0.5, -1.3], [6300, -0.1, -2.0], [8000, -1.1, -3.0],
  [10000, -2.5, -4.4], [12500, -4.3, -6.2], [16000, -6.6, -8.5], [20000, -9.3, -11.2],
];
// Half the table's rounding step, plus 0.001 dB: the formula gives A(158.49 Hz) = −13.34996 dB, on the
// rounding boundary, and the table prints −13.4.
const ROUNDING = 0.051;

describe('frequency weightings', () => {
  const bands = bandsBetween(10, 20000, 3);

  it('covers the table with one band per row', () => {
    expect(bands.map((b) => b.nominalHz)).toEqual(TABLE.map((r) => r[0]));
  });

  it('reproduces the tabulated A-weighting at the exact base-10 midbands', () => {
    TABLE.forEach(([, a], i) => {
      // Source: IEC 61672-1:2013, Table 3 (from memory), tabulated A(f) at f = 1000·10^(x/10), rounded to 0.1 dB
      expect(Math.abs(aWeightingDb(bands[i].exactHz) - a)).toBeLessThanOrEqual(ROUNDING);
    });
  });

  it('reproduces the tabulated C-weighting at the exact base-10 midbands', () => {
    TABLE.forEach(([, , c], i) => {
      // Source: IEC 61672-1:2013, Table 3 (from memory), tabulated C(f) at f = 1000·10^(x/10), rounded to 0.1 dB
      expect(Math.abs(cWeightingDb(bands[i].exactHz) - c)).toBeLessThanOrEqual(ROUNDING);
    });
  });

  it('is normalised to 0 dB at 1 kHz', () => {
    // Source: IEC 61672-1:2013, analytic weightings with A1000 = −2.000 dB and C1000 = −0.062 dB normalise to 0 dB at 1 kHz
    expect(Math.abs(aWeightingDb(1000))).toBeLessThan(1e-3);
    // Source: as above
    expect(Math.abs(cWeightingDb(1000))).toBeLessThan(1e-3);
  });

  it('falls off as f⁴ (A) and f² (C) far below the lowest pole', () => {
    // common practice: four zeros at f = 0 in A, two in C → 80 and 40 dB per decade
    expect(aWeightingDb(0.2) - aWeightingDb(0.02)).toBeCloseTo(80, 1);
    expect(cWeightingDb(0.2) - cWeightingDb(0.02)).toBeCloseTo(40, 1);
    expect(aWeightingDb(0)).toBe(-Infinity);
  });
});
