import { describe, expect, it } from 'vitest';
import {
  bandFromIndex,
  bandOf,
  bandOfNominal,
  bandsBetween,
  exactMidbandHz,
  OCTAVE_RATIO,
} from '../../engine/acoustics/index.ts';

const THIRD_OCTAVE_NOMINAL = [
  25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150,
  4000, 5000, 6300, 8000, 10000, 12500, 16000, 20000,
];
const OCTAVE_NOMINAL = [31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000];

describe('IEC 61260-1 base-10 bands', () => {
  it('labels third-octave bands 25 Hz … 20 kHz with the nominal midband frequencies', () => {
    const nominal = bandsBetween(25, 20000, 3).map((b) => b.nominalHz);
    // Source: IEC 61260-1:2014, Annex E, nominal midband frequencies (from memory; they are the R10 preferred numbers of ISO 266)
    expect(nominal).toEqual(THIRD_OCTAVE_NOMINAL);
  });

  it('labels octave bands 31.5 Hz … 16 kHz, and 16 Hz below them', () => {
    // Source: IEC 61260-1:2014, Annex E, nominal midband frequencies (from memory)
    expect(bandsBetween(31.5, 16000, 1).map((b) => b.nominalHz)).toEqual(OCTAVE_NOMINAL);
    // Source: IEC 61260-1:2014, Annex E (from memory)
    expect(bandsBetween(10, 20, 3).map((b) => b.nominalHz)).toEqual([10, 12.5, 16, 20]);
    // Source: IEC 61260-1:2014, Annex E (from memory)
    expect(bandsBetween(16, 16, 1).map((b) => b.nominalHz)).toEqual([16]);
  });

  it('puts exact midbands at 1000·10^(x/10) (b = 3) and 1000·10^(3x/10) (b = 1)', () => {
    for (let x = -20; x <= 13; x++) {
      // Source: IEC 61260-1:2014, base-10 exact midband frequency f_m = f_r·G^(x/b), G = 10^(3/10), f_r = 1000 Hz
      expect(bandFromIndex(x, 3).exactHz).toBeCloseTo(1000 * 10 ** (x / 10), 9);
    }
    for (let x = -6; x <= 4; x++) {
      // Source: IEC 61260-1:2014, as above with b = 1
      expect(bandFromIndex(x, 1).exactHz).toBeCloseTo(1000 * 10 ** ((3 * x) / 10), 9);
    }
  });

  it('has nominal labels within 3 % of the exact midband', () => {
    for (let x = -20; x <= 13; x++) {
      const b = bandFromIndex(x, 3);
      // common practice: nominal values are rounded exact midbands (31.5 for 31.62 is the largest shift in the list, 160 for 158.5 ~1 %)
      expect(Math.abs(b.nominalHz / b.exactHz - 1)).toBeLessThan(0.03);
    }
  });

  it('places edges at f_m·G^(±1/(2b)), contiguous from band to band', () => {
    for (const fraction of [1, 3] as const) {
      for (let x = -10; x <= 4; x++) {
        const b = bandFromIndex(x, fraction);
        // Source: IEC 61260-1:2014, band-edge frequencies f_1,2 = f_m·G^(∓1/(2b))
        expect(b.highHz / b.lowHz).toBeCloseTo(OCTAVE_RATIO ** (1 / fraction), 12);
        // Source: IEC 61260-1:2014, f_m is the geometric mean of the band edges
        expect(Math.sqrt(b.lowHz * b.highHz)).toBeCloseTo(b.exactHz, 9);
        expect(bandFromIndex(x + 1, fraction).lowHz).toBeCloseTo(b.highHz, 9);
      }
    }
    const k = bandOf(1000, 3);
    // Source: IEC 61260-1:2014, 1 kHz one-third-octave band edges 891.25 Hz and 1122.02 Hz (from memory)
    expect([k.lowHz, k.highHz].map((f) => Math.round(f * 100) / 100)).toEqual([891.25, 1122.02]);
    const o = bandOf(1000, 1);
    // Source: IEC 61260-1:2014, 1 kHz octave band edges 707.95 Hz and 1412.54 Hz (from memory)
    expect([o.lowHz, o.highHz].map((f) => Math.round(f * 100) / 100)).toEqual([707.95, 1412.54]);
  });

  it('includes the end bands of a range given by their nominal centres exactly', () => {
    const bands = bandsBetween(50, 1000, 3);
    expect(bands[0].nominalHz).toBe(50);
    expect(bands[bands.length - 1].nominalHz).toBe(1000);
    expect(bands).toHaveLength(14);
    expect(bandsBetween(51, 999, 3).map((b) => b.nominalHz)).toEqual(THIRD_OCTAVE_NOMINAL.slice(4, 16));
    // 125 Hz (nominal) lies below its exact midband 125.89 Hz; a range from 125 must still include it.
    expect(bandsBetween(125, 125, 1).map((b) => b.nominalHz)).toEqual([125]);
    expect(() => bandsBetween(100, 50, 3)).toThrow(RangeError);
  });

  it('finds the band that contains a frequency', () => {
    for (let x = -12; x <= 13; x++) {
      const b = bandFromIndex(x, 3);
      expect(bandOf(b.exactHz, 3).index).toBe(x);
      expect(bandOf(b.lowHz * 1.0001, 3).index).toBe(x);
      expect(bandOf(b.highHz * 0.9999, 3).index).toBe(x);
      expect(bandOf(b.highHz * 1.0001, 3).index).toBe(x + 1);
      expect(bandOf(b.nominalHz, 3).nominalHz).toBe(b.nominalHz);
    }
    expect(bandOf(700, 1).nominalHz).toBe(500);
    expect(bandOf(720, 1).nominalHz).toBe(1000);
    expect(bandOf(exactMidbandHz(0, 3), 1).fraction).toBe(1);
    expect(() => bandOf(0, 3)).toThrow(RangeError);
  });

  it('recognises nominal centres and nothing else', () => {
    expect(bandOfNominal(31.5, 3)?.index).toBe(-15);
    expect(bandOfNominal(31.5, 1)?.index).toBe(-5);
    expect(bandOfNominal(40, 1)).toBeUndefined();
    expect(bandOfNominal(1010, 3)).toBeUndefined();
  });
});
