// Four-pole (transfer) matrices of one-dimensional acoustics, Munjal,
// Acoustics of Ducts and Mufflers (1987): [p₁; U₁] = T·[p₂; U₂] with acoustic
// pressure p and volume velocity U, upstream state on the left, e^{+jωt}.
import { add, cx, mul, ONE, sub, ZERO, type Complex } from '../core/complex.ts';

export interface FourPole {
  t11: Complex;
  t12: Complex;
  t21: Complex;
  t22: Complex;
}

export const IDENTITY_FOUR_POLE: FourPole = { t11: ONE, t12: ZERO, t21: ZERO, t22: ONE };

/**
 * Uniform duct of length L, characteristic impedance Z = ρc/S:
 * [[cos kL, jZ sin kL], [j sin kL / Z, cos kL]]. For e^{+jωt} and
 * p = A e^{−jkx} + B e^{jkx}, U = (A e^{−jkx} − B e^{jkx})/Z.
 */
export function ductFourPole(k: number, length: number, impedance: number): FourPole {
  const c = Math.cos(k * length);
  const s = Math.sin(k * length);
  return { t11: cx(c), t12: cx(0, impedance * s), t21: cx(0, s / impedance), t22: cx(c) };
}

/** A shunt admittance Y = U_branch / p at one point: p continuous, U₁ = U₂ + Y·p. */
export function shuntFourPole(admittance: Complex): FourPole {
  return { t11: ONE, t12: ZERO, t21: admittance, t22: ONE };
}

/** a·b: element a upstream of element b. */
export function multiplyFourPoles(a: FourPole, b: FourPole): FourPole {
  return {
    t11: add(mul(a.t11, b.t11), mul(a.t12, b.t21)),
    t12: add(mul(a.t11, b.t12), mul(a.t12, b.t22)),
    t21: add(mul(a.t21, b.t11), mul(a.t22, b.t21)),
    t22: add(mul(a.t21, b.t12), mul(a.t22, b.t22)),
  };
}

/** T11·T22 − T12·T21: 1 for any reciprocal system (Munjal 1987). */
export function fourPoleDeterminant(t: FourPole): Complex {
  return sub(mul(t.t11, t.t22), mul(t.t12, t.t21));
}
