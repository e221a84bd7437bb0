/**
 * Porous layers as equivalent fluids from one parameter, the static airflow resistivity σ (Pa·s/m²).
 * Time dependence e^{+jωt} (DEVELOPERS.md): a wave e^{−j·kc·x} decays in the material, so Im kc < 0,
 * and the characteristic impedance has Im Zc < 0. Papers written with e^{−iωt} carry the opposite
 * signs; conjugate them before comparing.
 *
 * - 'delany-bazley': the power laws of Delany & Bazley's measurements on fibrous absorbents (Applied
 *   Acoustics 3, 1970, 105–116) in the variable X = ρ₀f/σ, the form of Allard & Champoux (JASA 91,
 *   1992) and of Allard & Atalla, Propagation of Sound in Porous Media, 2nd ed. (2009), ch. 2:
 *   Zc = ρ₀c₀[1 + 0.0571 X^−0.754 − j 0.087 X^−0.732], kc = (ω/c₀)[1 + 0.0978 X^−0.700 − j 0.189 X^−0.595],
 *   fitted for 0.01 ≤ X ≤ 1.
 * - 'miki': Miki's modification (J. Acoust. Soc. Jpn (E) 11(1), 1990, 19–24) in the variable f/σ,
 *   published with (10³f/σ): Zc = ρ₀c₀[1 + 5.50 (10³f/σ)^−0.632 − j 8.43 (10³f/σ)^−0.632],
 *   kc = (ω/c₀)[1 + 7.81 (10³f/σ)^−0.618 − j 11.41 (10³f/σ)^−0.618] (≈ 0.070, 0.107, 0.109, 0.160 in f/σ).
 *   Fitted to the same data (0.01 ≤ f/σ ≤ 1). Its real and imaginary parts share one exponent, so
 *   below the fitted range the surface impedance of a layer stays physically admissible (Re Zs > 0)
 *   far further down than with Delany & Bazley's form, which turns non-physical soon below it (though
 *   not for all f·d: very thin layers at f/σ ≲ 10⁻³ go wrong with either).
 */
import { abs, add, cx, div, mul, scale, sub, type Complex } from '../core/complex.ts';
import type { Medium } from '../core/medium.ts';
import { requirePositive } from './checks.ts';

export type PorousModel = 'delany-bazley' | 'miki';

export interface PorousAir { density: number; soundSpeed: number }

/** Characteristic impedance Zc (Pa·s/m) and complex wavenumber kc (1/m) of the material, e^{+jωt}. */
export interface PorousWave { zc: Complex; kc: Complex }

/** An equivalent fluid as the solver takes it: 1/ρ_eq and 1/K_eq. */
/** A porous material as an equivalent fluid (engine/core's Medium). */
export type PorousMedium = Medium;

interface PowerLaw { c: number; e: number } // c·v^−e

interface ModelLaws {
  /** The model's variable from f (Hz), σ and ρ₀. */
  variable: (frequencyHz: number, sigma: number, density: number) => number;
  /** The frequency at which the variable takes a value. */
  frequencyAt: (value: number, sigma: number, density: number) => number;
  variableName: string;
  /** The power laws take argScale × the variable: 10³ for Miki's published coefficients. */
  argScale: number;
  zRe: PowerLaw; zIm: PowerLaw; kRe: PowerLaw; kIm: PowerLaw;
}

const LAWS: Record<PorousModel, ModelLaws> = {
  'delany-bazley': {
    variable: (f, sigma, rho) => (rho * f) / sigma, frequencyAt: (v, sigma, rho) => (v * sigma) / rho, variableName: 'ρ₀f/σ', argScale: 1,
    zRe: { c: 0.0571, e: 0.754 }, zIm: { c: 0.087, e: 0.732 }, kRe: { c: 0.0978, e: 0.700 }, kIm: { c: 0.189, e: 0.595 },
  },
  miki: {
    variable: (f, sigma) => f / sigma, frequencyAt: (v, sigma) => v * sigma, variableName: 'f/σ', argScale: 1e3,
    zRe: { c: 5.50, e: 0.632 }, zIm: { c: 8.43, e: 0.632 }, kRe: { c: 7.81, e: 0.618 }, kIm: { c: 11.41, e: 0.618 },
  },
};

/** The fitted range of both models' variables (Delany & Bazley 1970; Miki 1990 kept to it). */
export const POROUS_FITTED_RANGE: readonly [number, number] = [0.01, 1];

export const POROUS_MODELS: readonly PorousModel[] = ['delany-bazley', 'miki'];

const law = (p: PowerLaw, v: number) => p.c * v ** -p.e;

/** Zc and kc of a porous material at one frequency. */
export function porousWave(model: PorousModel, frequencyHz: number, flowResistivity: number, air: PorousAir): PorousWave {
  requirePositive('frequencyHz', frequencyHz);
  requirePositive('flowResistivity', flowResistivity);
  const m = LAWS[model], v = m.argScale * m.variable(frequencyHz, flowResistivity, air.density);
  const rhoC = air.density * air.soundSpeed, k = (2 * Math.PI * frequencyHz) / air.soundSpeed;
  return {
    zc: cx(rhoC * (1 + law(m.zRe, v)), -rhoC * law(m.zIm, v)),
    kc: cx(k * (1 + law(m.kRe, v)), -k * law(m.kIm, v)),
  };
}

/** ρ_eq = Zc·kc/ω and K_eq = Zc·ω/kc, so that kc = ω√(ρ_eq/K_eq) and Zc = √(ρ_eq·K_eq) (Allard & Atalla 2009, ch. 2). */
export function equivalentFluid(wave: PorousWave, omega: number): { density: Complex; bulkModulus: Complex } {
  return { density: scale(mul(wave.zc, wave.kc), 1 / omega), bulkModulus: scale(div(wave.zc, wave.kc), omega) };
}

/** The medium the Helmholtz assembly takes for a porous material at one frequency. */
export function porousMedium(model: PorousModel, frequencyHz: number, flowResistivity: number, air: PorousAir): PorousMedium {
  const omega = 2 * Math.PI * frequencyHz, fluid = equivalentFluid(porousWave(model, frequencyHz, flowResistivity, air), omega);
  return { rhoInv: div(cx(1), fluid.density), kappaInv: div(cx(1), fluid.bulkModulus) };
}

/**
 * cot z, evaluated through e^{∓2jz} with the exponential that does not grow, so thick lossy layers
 * (large |Im z|) do not overflow: cot z = j(1 + e^{−2jz})/(1 − e^{−2jz}) = −j(1 + e^{2jz})/(1 − e^{2jz}).
 */
function cot(z: Complex): Complex {
  const s = z.im <= 0 ? 1 : -1; // e^{−2jz} has modulus e^{2 Im z}: use it when Im z ≤ 0
  const mag = Math.exp(2 * s * z.im), ph = -2 * s * z.re;
  const w = cx(mag * Math.cos(ph), mag * Math.sin(ph));
  return mul(cx(0, s), div(add(cx(1), w), sub(cx(1), w)));
}

/** Normal-incidence surface impedance of a layer of thickness d on a rigid wall: Zs = −j·Zc·cot(kc·d) (Allard & Atalla 2009, ch. 2, e^{+jωt}). */
export function rigidBackedImpedance(wave: PorousWave, thickness: number): Complex {
  requirePositive('thickness', thickness);
  return mul(cx(0, -1), mul(wave.zc, cot(scale(wave.kc, thickness))));
}

/** α = 1 − |(Zs − ρc)/(Zs + ρc)|² at normal incidence. */
export function normalIncidenceAbsorption(surfaceImpedance: Complex, rhoC: number): number {
  const r = div(sub(surfaceImpedance, cx(rhoC)), add(surfaceImpedance, cx(rhoC)));
  return 1 - abs(r) ** 2;
}

/** Where a frequency stands against a model's fitted range. */
export interface PorousValidity {
  model: PorousModel;
  /** 'ρ₀f/σ' (Delany & Bazley) or 'f/σ' (Miki), f in Hz, σ in Pa·s/m², ρ₀ in kg/m³. */
  variable: string;
  /** The variable over the frequencies asked about, lowest and highest. */
  range: [number, number];
  fitted: readonly [number, number];
  /** 'extrapolated': below Miki's fitted range, where his form stays physically admissible far further down than Delany & Bazley's. */
  status: 'in-range' | 'extrapolated' | 'out-of-range';
  warning: string | null;
}

/** The model's variable at one frequency: ρ₀f/σ or f/σ. */
export function porousVariable(model: PorousModel, frequencyHz: number, flowResistivity: number, density: number): number {
  return LAWS[model].variable(frequencyHz, flowResistivity, density);
}

/** The validity of a model from fromHz to toHz (the variables grow with f, so the ends decide). */
export function porousValidity(model: PorousModel, fromHz: number, toHz: number, flowResistivity: number, density: number): PorousValidity {
  const range: [number, number] = [porousVariable(model, fromHz, flowResistivity, density), porousVariable(model, toHz, flowResistivity, density)];
  const [lo, hi] = POROUS_FITTED_RANGE, name = LAWS[model].variableName, fmt = (v: number) => Number(v.toPrecision(3)).toString();
  const below = range[0] < lo, above = range[1] > hi;
  const status = above || (below && model === 'delany-bazley') ? 'out-of-range' : below ? 'extrapolated' : 'in-range';
  const parts: string[] = [];
  if (below) {
    parts.push(model === 'miki'
      ? `${name} falls to ${fmt(range[0])}, below the fitted ${lo}: Miki's form is extrapolated there (it stays physically admissible much further down than Delany & Bazley's, but is unverified)`
      : `${name} falls to ${fmt(range[0])}, below the fitted ${lo}: Delany & Bazley's power laws are extrapolated there and can give a layer a non-physical surface impedance; the "miki" model behaves better at low frequencies`);
  }
  if (above) parts.push(`${name} reaches ${fmt(range[1])}, above the fitted ${hi}: the material is nearly transparent there and the fit is unverified`);
  return { model, variable: name, range, fitted: POROUS_FITTED_RANGE, status, warning: parts.length > 0 ? parts.join('; ') : null };
}

/** The frequencies (Hz) where a model is within its fitted range for this σ and ρ₀. */
export function porousFittedFrequencies(model: PorousModel, flowResistivity: number, density: number): [number, number] {
  const at = (v: number) => LAWS[model].frequencyAt(v, flowResistivity, density);
  return [at(POROUS_FITTED_RANGE[0]), at(POROUS_FITTED_RANGE[1])];
}
