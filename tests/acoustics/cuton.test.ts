import { describe, expect, it } from 'vitest';
import { axialWavenumber, cutOnFrequencies, cutOnFrequency, firstCutOn } from '../../engine/acoustics/index.ts';

const C = 343;

describe('rigid rectangular duct modes', () => {
  it('lists cut-on frequencies f_mn = (c/2)·√((m/a)² + (n/b)²) in ascending order, without the plane wave', () => {
    const a = 0.6;
    const b = 0.25;
    const modes = cutOnFrequencies(a, b, C, 2000);
    // Source: Morse & Ingard, Theoretical Acoustics (1968), rigid rectangular duct, f_mn = (c/2)·√((m/a)² + (n/b)²)
    expect(modes.slice(0, 3).map((m) => [m.m, m.n, m.frequencyHz])).toEqual([
      [1, 0, C / (2 * a)],
      [2, 0, C / a],
      [0, 1, C / (2 * b)],
    ]);
    expect(modes.some((m) => m.m === 0 && m.n === 0)).toBe(false);
    for (let i = 1; i < modes.length; i++) expect(modes[i].frequencyHz).toBeGreaterThanOrEqual(modes[i - 1].frequencyHz);
    // Every pair (m, n) with f_mn ≤ 2 kHz is there, counted by brute force.
    let count = 0;
    for (let m = 0; m < 50; m++) for (let n = 0; n < 50; n++) if ((m || n) && cutOnFrequency(a, b, C, m, n) <= 2000) count++;
    expect(modes).toHaveLength(count);
    expect(modes[modes.length - 1].frequencyHz).toBeLessThanOrEqual(2000);
  });

  it('lists degenerate modes of a square duct side by side', () => {
    const [first, second] = cutOnFrequencies(0.4, 0.4, C, 1000);
    expect([first.m, first.n, second.m, second.n]).toEqual([0, 1, 1, 0]);
    expect(first.frequencyHz).toBe(second.frequencyHz);
  });

  it('puts the first cut-on at c/(2·max(a, b))', () => {
    // Source: Morse & Ingard, Theoretical Acoustics (1968): the (1,0) mode across the larger side cuts on first
    expect(firstCutOn(0.3, 0.5, C)).toBeCloseTo(C, 12);
    expect(firstCutOn(0.3, 0.5, C)).toBe(cutOnFrequencies(0.3, 0.5, C)[0].frequencyHz);
  });

  it('refuses a request that would list an unreasonable number of modes', () => {
    expect(() => cutOnFrequencies(20, 20, C)).toThrow(RangeError);
    expect(() => cutOnFrequencies(0, 1, C)).toThrow(RangeError);
  });
});

describe('axialWavenumber', () => {
  const a = 0.5;
  const b = 0.3;

  it('is real above cut-on, zero at cut-on and −jκ below', () => {
    const f11 = cutOnFrequency(a, b, C, 1, 1);
    const kAt = (f: number) => (2 * Math.PI * f) / C;
    const at = axialWavenumber(kAt(f11), a, b, 1, 1);
    // Source: Morse & Ingard (1968): k_x² = k² − (mπ/a)² − (nπ/b)² vanishes at f = f_mn
    expect(Math.hypot(at.re, at.im)).toBeLessThan(1e-6);
    const above = axialWavenumber(kAt(1.5 * f11), a, b, 1, 1);
    expect(above.im).toBe(0);
    // Source: Morse & Ingard (1968), as above
    expect(above.re).toBeCloseTo(kAt(f11) * Math.sqrt(1.5 ** 2 - 1), 9);
    const below = axialWavenumber(kAt(0.5 * f11), a, b, 1, 1);
    expect(below.re).toBe(0);
    // Source: Morse & Ingard (1968), as above, κ = √((mπ/a)² + (nπ/b)² − k²)
    expect(below.im).toBeCloseTo(-kAt(f11) * Math.sqrt(1 - 0.5 ** 2), 9);
  });

  it('makes a mode below cut-on decay along +x as e^{−κx} under e^{+jωt}', () => {
    const kx = axialWavenumber(5, a, b, 1, 0);
    // Field factor e^{−j·kx·x} = e^{(kx.im)·x}·e^{−j·kx.re·x}; its modulus at x = 0.1 m:
    const modulus = Math.exp(kx.im * 0.1);
    // common practice: an evanescent mode carries no power and decays away from its source
    expect(modulus).toBeLessThan(1);
    expect(modulus).toBeCloseTo(Math.exp(-Math.sqrt((Math.PI / a) ** 2 - 25) * 0.1), 12);
  });

  it('is k for the plane wave', () => {
    expect(axialWavenumber(7, a, b, 0, 0)).toEqual({ re: 7, im: 0 });
    expect(() => axialWavenumber(7, a, b, -1, 0)).toThrow(RangeError);
  });
});
