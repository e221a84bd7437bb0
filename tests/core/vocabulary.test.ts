// The engine's small shapes (engine/core): levels against their references, the sides and wall keys of a
// box, face rectangles, cross-sections, the grading rule.
import { describe, expect, it } from 'vitest';
import { crossSectionArea, crossSectionOf, faceRect, lwDb, maxElementSize, P_REF, planeAxes, sideAxis, sideSign, SIDES, splDb, W_REF, WALL_KEYS, wallSide } from '../../engine/core/index.ts';

describe('levels', () => {
  it('are zero at their references and step 20 dB (pressure) and 10 dB (power) per decade', () => {
    // Source: ISO 1683:2015, reference values: 20 µPa for sound pressure in air, 1 pW for sound power
    expect([P_REF, W_REF]).toEqual([20e-6, 1e-12]);
    // common practice: levels use the RMS value, |p̂|/√2 of a peak amplitude
    expect(splDb(Math.SQRT2 * P_REF)).toBeCloseTo(0, 12);
    expect(splDb(10 * Math.SQRT2 * P_REF)).toBeCloseTo(20, 12);
    expect(lwDb(W_REF)).toBeCloseTo(0, 12);
    expect(lwDb(1)).toBeCloseTo(120, 12);
  });
});

describe('sides, walls and rectangles', () => {
  const box = { x0: 0, x1: 2, y0: -1, y1: 1, z0: 0.5, z1: 1.5 };
  it('name a side by its outward normal and a wall by axis then end', () => {
    expect(SIDES.map((s) => [sideAxis(s), sideSign(s)])).toEqual([[0, -1], [0, 1], [1, -1], [1, 1], [2, -1], [2, 1]]);
    expect(WALL_KEYS.map(wallSide)).toEqual(['-x', '+x', '-y', '+y', '-z', '+z']);
  });
  it('span a face in the two other axes, in x, y, z order', () => {
    expect(faceRect(box, '+x')).toEqual({ a0: -1, a1: 1, b0: 0.5, b1: 1.5 });
    expect(faceRect(box, '-y')).toEqual({ a0: 0, a1: 2, b0: 0.5, b1: 1.5 });
    expect(faceRect(box, '+z')).toEqual({ a0: 0, a1: 2, b0: -1, b1: 1 });
    expect([0, 1, 2].map((a) => planeAxes(a as 0 | 1 | 2))).toEqual([[1, 2], [0, 2], [0, 1]]);
  });
  it('take a cross-section as a plain rectangle', () => {
    const section = { ...box, name: 'chamber', width: 2, height: 1 };
    expect(crossSectionOf(section)).toEqual({ y0: -1, y1: 1, z0: 0.5, z1: 1.5 });
    expect(crossSectionArea(section)).toBe(2);
  });
});

describe('the grading rule', () => {
  it('gives an element of order p the length that carries ppw nodes per wavelength', () => {
    // common practice: an element of order p spans p node intervals, so p·λ/ppw carries ppw nodes per λ
    expect(maxElementSize(4, 0.5, 8)).toBeCloseTo(0.25, 15);
    expect(maxElementSize(1, 1, 10)).toBeCloseTo(0.1, 15);
  });
});
