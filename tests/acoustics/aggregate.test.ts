import { describe, expect, it } from 'vitest';
import {
  aWeightedTotal,
  aWeightingDb,
  bandLevel,
  bandsBetween,
  bandTransmissionLoss,
  exactMidbandHz,
  NOTE_NO_POINTS,
  NOTE_NO_TL,
  outletPowerLevels,
  sweepFrequencies,
} from '../../engine/acoustics/index.ts';

describe('bandTransmissionLoss', () => {
  it('returns the point TL when it is the same throughout the band', () => {
    const sweep = sweepFrequencies({ fromHz: 125, toHz: 1000, spacing: 'octave', pointsPerBand: 3 });
    const tl = sweep.frequenciesHz.map((_, i) => 5 + 10 * sweep.bandOfPoint![i]);
    const bands = bandTransmissionLoss(sweep.frequenciesHz, tl, 1);
    expect(bands.map((b) => b.bandHz)).toEqual([125, 250, 500, 1000]);
    bands.forEach((b, i) => {
      expect(b.valueDb).toBeCloseTo(5 + 10 * i, 12);
      expect(b.pointCount).toBe(3);
    });
  });

  it('averages transmitted power, not decibels', () => {
    const [band] = bandsBetween(500, 500, 3);
    const freqs = [band.exactHz * 0.98, band.exactHz * 1.02];
    const [b] = bandTransmissionLoss(freqs, [10, 30], 3);
    // common practice: the band TL is −10·log10 of the mean power transmission coefficient τ = 10^(−TL/10)
    expect(b.valueDb).toBeCloseTo(-10 * Math.log10((0.1 + 0.001) / 2), 12);
    expect(b.valueDb).toBeLessThan(20);
    // A perfect notch (TL = ∞) transmits nothing at its point, so the band keeps half the power of the other point.
    const [notch] = bandTransmissionLoss(freqs, [Infinity, 10], 3);
    expect(notch.valueDb).toBeCloseTo(10 + 10 * Math.log10(2), 12);
  });

  it('leaves out failed points and reports empty bands as NaN with a reason when bands are asked for', () => {
    const bands = bandsBetween(250, 1000, 1);
    const freqs = [bands[0].exactHz, bands[1].exactHz, bands[1].exactHz * 1.1];
    const tl = [12, Number.NaN, 20];
    const implicit = bandTransmissionLoss(freqs, tl, 1);
    expect(implicit.map((b) => [b.bandHz, b.pointCount])).toEqual([[250, 1], [500, 1]]);
    const explicit = bandTransmissionLoss(freqs, tl, 1, bands);
    expect(explicit.map((b) => b.bandHz)).toEqual([250, 500, 1000]);
    expect(explicit[1].valueDb).toBeCloseTo(20, 12);
    expect(explicit[2].valueDb).toBeNaN();
    expect(explicit[2].note).toBe(NOTE_NO_POINTS);
    expect(explicit[0].note).toBeUndefined();
  });

  it('refuses mismatched input', () => {
    expect(() => bandTransmissionLoss([100, 200], [1], 3)).toThrow(RangeError);
    expect(() => bandTransmissionLoss([125], [1], 3, bandsBetween(125, 125, 1))).toThrow(RangeError);
  });
});

describe('bandLevel', () => {
  it('is the energy mean of the levels in the band', () => {
    const f = exactMidbandHz(0, 3);
    // common practice: levels average as energies, 10·log10(mean 10^(L/10))
    expect(bandLevel([f, f * 1.01], [80, 70], 3)[0].valueDb).toBeCloseTo(10 * Math.log10((1e8 + 1e7) / 2), 12);
    expect(bandLevel([f, f * 1.01, f * 0.99], [74, 74, 74], 3)[0].valueDb).toBeCloseTo(74, 12);
  });
});

describe('outletPowerLevels', () => {
  it('subtracts the band TL from the source power, band by band', () => {
    const tl = [
      { bandHz: 125, valueDb: 8 },
      { bandHz: 250, valueDb: 15 },
      { bandHz: 500, valueDb: Number.NaN },
    ];
    const out = outletPowerLevels(
      [
        { bandHz: 125, lwDb: 90 },
        { bandHz: 250, lwDb: 88 },
        { bandHz: 500, lwDb: 85 },
        { bandHz: 1000, lwDb: 80 },
      ],
      tl,
    );
    expect(out[0].outletLwDb).toBe(82);
    expect(out[1].outletLwDb).toBe(73);
    expect(out[1].tlDb).toBe(15);
    expect(out[2].outletLwDb).toBeNaN();
    expect(out[2].note).toBe(NOTE_NO_TL);
    expect(out[3].outletLwDb).toBeNaN();
    expect(out[3].sourceLwDb).toBe(80);
  });
});

describe('aWeightedTotal', () => {
  it('adds A-weighted band energies, weighting nominal bands at their exact midbands', () => {
    // Source: IEC 61672-1:2013, Table 3: A(1 kHz) = 0.0 dB
    expect(aWeightedTotal([{ bandHz: 1000, levelDb: 80 }])).toBeCloseTo(80, 3);
    // common practice: two equal incoherent contributions add 10·log10(2) ≈ 3 dB
    expect(aWeightedTotal([{ bandHz: 1000, levelDb: 80 }, { bandHz: 1000, levelDb: 80 }])).toBeCloseTo(80 + 10 * Math.log10(2), 3);
    // Source: IEC 61672-1:2013, Table 3 (from memory): A(125 Hz) = −16.1 dB, rounded to 0.1 dB
    expect(Math.abs(aWeightedTotal([{ bandHz: 125, levelDb: 80 }]) - 63.9)).toBeLessThanOrEqual(0.05 + 1e-9);
    expect(aWeightedTotal([{ bandHz: 31.5, levelDb: 0 }])).toBeCloseTo(aWeightingDb(1000 * 10 ** -1.5), 12);
    expect(aWeightedTotal([{ bandHz: 1010, levelDb: 0 }])).toBeCloseTo(aWeightingDb(1010), 12);
  });

  it('sums an octave spectrum as the energy sum of L + A', () => {
    const spectrum = [63, 125, 250, 500, 1000, 2000, 4000, 8000].map((bandHz, i) => ({ bandHz, levelDb: 70 + i }));
    const exact = [63, 125, 250, 500, 1000, 2000, 4000, 8000].map((_, i) => exactMidbandHz(3 * (i - 4), 3));
    const byHand = 10 * Math.log10(spectrum.reduce((s, b, i) => s + 10 ** ((b.levelDb + aWeightingDb(exact[i])) / 10), 0));
    expect(aWeightedTotal(spectrum)).toBeCloseTo(byHand, 12);
  });

  it('is NaN when a band is missing and −∞ for no bands', () => {
    expect(aWeightedTotal([{ bandHz: 1000, levelDb: 80 }, { bandHz: 500, levelDb: Number.NaN }])).toBeNaN();
    expect(aWeightedTotal([])).toBe(-Infinity);
  });
});
