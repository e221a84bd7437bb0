/** The porous-layer formulas of engine/acoustics/porous.ts against hand values, identities and limits. */
import { describe, expect, it } from 'vitest';
import Complex from 'complex.js';
import {
  equivalentFluid, LINING_MATERIALS, normalIncidenceAbsorption, porousFittedFrequencies, porousMedium, porousValidity, porousVariable, porousWave,
  rigidBackedImpedance, type PorousWave,
} from '../../engine/acoustics/index.ts';

const air = { density: 1.2, soundSpeed: 343 }, rhoC = air.density * air.soundSpeed;
const C = (z: { re: number; im: number }) => new Complex(z.re, z.im);
const near = (a: Complex, b: Complex, rel: number) => expect(a.sub(b).abs() / b.abs()).toBeLessThan(rel);

describe('Delany & Bazley', () => {
  it('at X = ρ₀f/σ = 0.1 gives the hand-computed Zc and kc', () => {
    const sigma = 10_000, f = (0.1 * sigma) / air.density, k = (2 * Math.PI * f) / air.soundSpeed, w = porousWave('delany-bazley', f, sigma, air);
    // Source: Delany & Bazley, Applied Acoustics 3 (1970) 105–116, in the ρ₀f/σ form of Allard & Champoux, JASA 91 (1992), e^{+jωt}:
    // 1 + 0.0571·10^0.754 = 1.32407, 0.087·10^0.732 = 0.469374, 1 + 0.0978·10^0.700 = 1.49016, 0.189·10^0.595 = 0.743810
    expect(w.zc.re / rhoC).toBeCloseTo(1.32407, 5);
    expect(w.zc.im / rhoC).toBeCloseTo(-0.469374, 5);
    expect(w.kc.re / k).toBeCloseTo(1.49016, 5);
    expect(w.kc.im / k).toBeCloseTo(-0.743810, 5);
  });

  it('agrees within 3 % with the 1970 coefficients in 10³f/σ over the fitted range', () => {
    for (const fOverSigma of [0.01, 0.03, 0.1, 0.3, 1]) {
      const sigma = 20_000, f = fOverSigma * sigma, v = 1e3 * fOverSigma, rc = rhoC, k = (2 * Math.PI * f) / air.soundSpeed;
      const w = porousWave('delany-bazley', f, sigma, { density: 1.2, soundSpeed: air.soundSpeed });
      // Source: Delany & Bazley, Applied Acoustics 3 (1970) 105–116: Zc/ρ₀c₀ = 1 + 9.08 v^−0.75 − j 11.9 v^−0.73, kc c₀/ω = 1 + 10.8 v^−0.70 − j 10.3 v^−0.59, v = 10³f/σ
      // (as restated in the APMR reference pages of Jaouen, apmr.matelys.com, with ρ₀ = 1.2 kg/m³ for the other form)
      near(C(w.zc), new Complex(rc * (1 + 9.08 * v ** -0.75), -rc * 11.9 * v ** -0.73), 0.03);
      near(C(w.kc), new Complex(k * (1 + 10.8 * v ** -0.7), -k * 10.3 * v ** -0.59), 0.03);
    }
  });
});

describe('Miki', () => {
  it('at f/σ = 0.1 gives the hand-computed Zc and kc', () => {
    const sigma = 10_000, f = 0.1 * sigma, k = (2 * Math.PI * f) / air.soundSpeed, w = porousWave('miki', f, sigma, air);
    // Source: Miki, J. Acoust. Soc. Jpn (E) 11(1) (1990) 19–24, e^{+jωt}, v = 10³f/σ = 100:
    // 1 + 5.50·100^−0.632 = 1.299476, 8.43·100^−0.632 = 0.459016, 1 + 7.81·100^−0.618 = 1.453577, 11.41·100^−0.618 = 0.662652
    expect(w.zc.re / rhoC).toBeCloseTo(1.299476, 5);
    expect(w.zc.im / rhoC).toBeCloseTo(-0.459016, 5);
    expect(w.kc.re / k).toBeCloseTo(1.453577, 5);
    expect(w.kc.im / k).toBeCloseTo(-0.662652, 5);
    // Source: the same coefficients in f/σ: 5.50·10^−1.896 = 0.0699, 8.43·10^−1.896 = 0.107, 7.81·10^−1.854 = 0.109, 11.41·10^−1.854 = 0.160
    expect(w.zc.re / rhoC - 1).toBeCloseTo(0.0699 * 0.1 ** -0.632, 3);
    expect(w.kc.im / k).toBeCloseTo(-0.160 * 0.1 ** -0.618, 2);
  });

  it('keeps Re Zs > 0 well below its fitted range, where Delany & Bazley\'s form already fails', () => {
    let dbNegative = 0;
    for (const f of [20, 50, 100]) for (const d of [0.025, 0.05, 0.1, 0.2]) { // f/σ from 0.001 to 0.005
      // Source: Miki (1990): with Delany & Bazley's laws the real part of a layer's surface impedance can turn negative at low frequencies; the modified laws avoid it
      expect(rigidBackedImpedance(porousWave('miki', f, 20_000, air), d).re).toBeGreaterThan(0);
      if (rigidBackedImpedance(porousWave('delany-bazley', f, 20_000, air), d).re < 0) dbNegative++;
    }
    expect(dbNegative).toBeGreaterThan(0);
  });
});

describe('both models', () => {
  const models = ['delany-bazley', 'miki'] as const;

  it('decay in the material with e^{+jωt}: Im kc < 0, Im Zc < 0, Re parts above the air values', () => {
    for (const model of models) for (const f of [50, 200, 1000, 4000]) {
      const w = porousWave(model, f, 15_000, air), k = (2 * Math.PI * f) / air.soundSpeed;
      // common practice: e^{−j kc x} decays along +x when Im kc < 0 (DEVELOPERS.md convention)
      expect(w.kc.im).toBeLessThan(0);
      expect(w.zc.im).toBeLessThan(0);
      expect(w.kc.re).toBeGreaterThan(k);
      expect(w.zc.re).toBeGreaterThan(rhoC);
    }
  });

  it('tend to the air as σ → 0', () => {
    for (const model of models) {
      const f = 500, w = porousWave(model, f, 1e-3, air), k = (2 * Math.PI * f) / air.soundSpeed;
      // common practice: a material without flow resistance is the air itself
      near(C(w.zc), new Complex(rhoC, 0), 1e-4);
      near(C(w.kc), new Complex(k, 0), 1e-3);
    }
  });

  it('give an equivalent fluid with kc = ω√(ρ/K) and Zc = √(ρK), and the solver medium 1/ρ, 1/K', () => {
    for (const model of models) for (const f of [80, 630, 3150]) {
      const omega = 2 * Math.PI * f, w = porousWave(model, f, 12_000, air), fluid = equivalentFluid(w, omega);
      const rho = C(fluid.density), K = C(fluid.bulkModulus);
      // Source: Allard & Atalla, Propagation of Sound in Porous Media, 2nd ed. (2009), ch. 2: k = ω(ρ/K)^½, Zc = (ρK)^½
      near(rho.div(K).sqrt().mul(omega), C(w.kc), 1e-12);
      near(rho.mul(K).sqrt(), C(w.zc), 1e-12);
      // common practice: a lossy fluid with e^{+jωt} has Im ρ < 0 (ρ = ρ∞ + σ/(jω) for a rigid frame)
      expect(fluid.density.im).toBeLessThan(0);
      const m = porousMedium(model, f, 12_000, air);
      near(C(m.rhoInv), rho.inverse(), 1e-12);
      near(C(m.kappaInv), K.inverse(), 1e-12);
    }
  });
});

describe('rigid-backed layer', () => {
  const airLayer: PorousWave = { zc: { re: rhoC, im: 0 }, kc: { re: 1, im: 0 } };

  it('of air is a lossless reactance, −jρc·cot(kd): zero at a quarter wavelength', () => {
    for (const kd of [0.3, Math.PI / 4, 1.2]) {
      const zs = rigidBackedImpedance(airLayer, kd);
      // Source: Kinsler et al., Fundamentals of Acoustics, 4th ed. (2000): a closed tube of length d has Z = −jρc cot(kd) at its mouth (e^{+jωt})
      expect(zs.re).toBeCloseTo(0, 9);
      expect(zs.im / rhoC).toBeCloseTo(-1 / Math.tan(kd), 9);
      expect(normalIncidenceAbsorption(zs, rhoC)).toBeCloseTo(0, 12);
    }
    expect(Math.hypot(rigidBackedImpedance(airLayer, Math.PI / 2).re, rigidBackedImpedance(airLayer, Math.PI / 2).im)).toBeLessThan(1e-9 * rhoC);
  });

  it('tends to the characteristic impedance when thick, without overflow', () => {
    for (const model of ['delany-bazley', 'miki'] as const) {
      const w = porousWave(model, 1000, 20_000, air);
      // Source: Allard & Atalla (2009), ch. 2: cot(kc d) → j as Im(kc d) → −∞, so Zs → Zc for a semi-infinite layer
      near(C(rigidBackedImpedance(w, 2)), C(w.zc), 1e-9);
      const far = rigidBackedImpedance(w, 1e4);
      expect(Number.isFinite(far.re) && Number.isFinite(far.im)).toBe(true);
      near(C(far), C(w.zc), 1e-12);
    }
  });

  it('absorbs α = 1 − |R|² with R = (Zs − ρc)/(Zs + ρc): ρc itself absorbs fully, a wall not at all', () => {
    // Source: Kinsler et al., Fundamentals of Acoustics, 4th ed. (2000), §6.2: R = (Zs − ρc)/(Zs + ρc) at normal incidence
    expect(normalIncidenceAbsorption({ re: rhoC, im: 0 }, rhoC)).toBeCloseTo(1, 12);
    expect(normalIncidenceAbsorption({ re: 3 * rhoC, im: 0 }, rhoC)).toBeCloseTo(0.75, 12);
    expect(normalIncidenceAbsorption({ re: 1e12, im: 0 }, rhoC)).toBeCloseTo(0, 6);
  });
});

describe('fitted ranges', () => {
  it('use ρ₀f/σ for Delany & Bazley and f/σ for Miki, 0.01 to 1', () => {
    expect(porousVariable('delany-bazley', 500, 10_000, 1.2)).toBeCloseTo(0.06, 12);
    expect(porousVariable('miki', 500, 10_000, 1.2)).toBeCloseTo(0.05, 12);
    // Source: Delany & Bazley (1970): fitted for 0.01 < f/σ < 1 (SI); the ρ₀f/σ form keeps 0.01 < ρ₀f/σ < 1 (Allard & Champoux 1992)
    expect(porousFittedFrequencies('miki', 10_000, 1.2)).toEqual([100, 10_000]);
    const [lo, hi] = porousFittedFrequencies('delany-bazley', 10_000, 1.2);
    expect(lo).toBeCloseTo(83.333, 3);
    expect(hi).toBeCloseTo(8333.33, 2);
  });

  it('say in range, extrapolated (Miki below) or out of range, with a warning only when not in range', () => {
    expect(porousValidity('miki', 125, 2000, 10_000, 1.2)).toMatchObject({ status: 'in-range', warning: null, range: [0.0125, 0.2] });
    const below = porousValidity('miki', 50, 2000, 10_000, 1.2);
    expect(below.status).toBe('extrapolated');
    expect(below.warning).toContain('below the fitted 0.01');
    const dbBelow = porousValidity('delany-bazley', 50, 2000, 10_000, 1.2);
    expect(dbBelow.status).toBe('out-of-range');
    expect(dbBelow.warning).toContain('"miki"');
    const above = porousValidity('miki', 1000, 8000, 5_000, 1.2);
    expect(above.status).toBe('out-of-range');
    expect(above.warning).toContain('above the fitted 1');
  });
});

describe('material library', () => {
  it('holds a few invented typical figures, each labelled with its own σ', () => {
    expect(LINING_MATERIALS.length).toBeGreaterThanOrEqual(5);
    expect(new Set(LINING_MATERIALS.map((m) => m.id)).size).toBe(LINING_MATERIALS.length);
    for (const m of LINING_MATERIALS) {
      expect(m.typical).toBe(true);
      expect(m.id).toMatch(/^[a-z]+(-[a-z]+)*$/);
      expect(m.label).toContain(`typical σ ≈ ${m.flowResistivity / 1000} kPa·s/m²`);
      // common practice: fibrous duct linings lie between a few and some tens of kPa·s/m²
      expect(m.flowResistivity).toBeGreaterThanOrEqual(2_000);
      expect(m.flowResistivity).toBeLessThanOrEqual(100_000);
    }
  });
});
