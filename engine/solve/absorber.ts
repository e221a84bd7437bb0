/**
 * The absorbing layers at one frequency, chosen once: the range of normal wavenumbers they must absorb,
 * the complex lengths of their elements, and what those lengths are predicted to reflect.
 *
 * Layer reflection. The discrete kind's reflection is known in closed form (engine/assembly/layers.ts:
 * R = ∏ⱼ[P_p(zⱼ)/P_p(−zⱼ)]², Guddati & Lim, IJNME 66, 2006; arXiv:2308.12255). It is evaluated for the plane
 * wave and for the least-damped higher mode of every port (the one with the smallest |k_x|/k, propagating or
 * evanescent, i.e. the nearest to its cut-on): as k_x → 0 every absorbing layer reflects totally, so just
 * above or below a port's cut-on the estimate climbs towards 1. The 'constant' and 'smooth' kinds have no
 * closed form here: their estimate is null (measure it instead, e.g. with quietgrid verify).
 * A room's open walls see waves at every angle: there the estimate is the formula's worst over the range
 * the layers are tuned for (k_x/k ∈ [0.2, 1], κ/k ∈ [0.2, 5]); more grazing waves reflect more.
 */
import type { Complex } from '../core/complex.ts';
import type { CrossSection } from '../core/space.ts';
import { axialWavenumber } from '../acoustics/cuton.ts';
import { chooseLengths, padeReflection, worstReflection, type AbsorberKind, type AbsorptionRange } from '../assembly/layers.ts';
import type { Absorber, ModeReflection, Port, PortReflection } from './problem.ts';

/** k_x of mode (m, n) of a rigid rectangle at wavenumber k (engine/acoustics/cuton.ts: real above cut-on, −jκ below). */
export function rectWavenumber(k: number, rect: CrossSection, m: number, n: number): Complex {
  return axialWavenumber(k, rect.y1 - rect.y0, rect.z1 - rect.z0, m, n);
}

/** What the port layers must absorb at wavenumber k: the propagating and the least-damped evanescent modes of the ports. */
export function portRange(k: number, rects: readonly CrossSection[]): AbsorptionRange {
  let minProp = 1, minEv = Infinity;
  for (const r of rects) for (let m = 0; m <= 8; m++) for (let n = 0; n <= 8; n++) {
    if (m === 0 && n === 0) continue;
    const kx = rectWavenumber(k, r, m, n);
    if (kx.im === 0) minProp = Math.min(minProp, kx.re / k);
    else minEv = Math.min(minEv, -kx.im / k);
  }
  // geometric steps of 10 % so that neighbouring frequencies share one choice of lengths
  const q = (v: number) => Math.pow(1.1, Math.round(Math.log(v) / Math.log(1.1)));
  const propagating: [number, number] = [Math.max(0.1, q(Math.min(minProp, 0.9))), 1];
  const evanescent: [number, number] = [Math.max(0.1, q(Math.min(minEv, 5))), Math.max(5, q(Math.min(1.5 * minEv, 40)))];
  return { propagating, evanescent };
}

/** The layers at one frequency: lengths for the range (the smooth profile has none: it is graded, not tuned). */
export function chooseAbsorber(frequencyHz: number, spec: { kind: AbsorberKind; layers: number }, order: number, range: AbsorptionRange): Absorber {
  return { frequencyHz, kind: spec.kind, layers: spec.layers, range, lengths: spec.kind === 'smooth' ? null : chooseLengths(order, spec.layers, range) };
}

/** |R| the Padé formula predicts for k_x/k = q; null where the kind has no closed form (only the discrete kind has). */
export function predictedReflection(a: Absorber, order: number, q: Complex): number | null {
  if (a.kind !== 'discrete' || a.lengths === null) return null;
  const R = padeReflection(order, a.lengths, q);
  return Math.hypot(R.re, R.im);
}

/** The worst |R| over the range the layers are tuned for; null without a closed form. */
export function worstOverRange(a: Absorber, order: number): number | null {
  return a.kind === 'discrete' && a.lengths !== null ? worstReflection(order, a.lengths, a.range) : null;
}

/** The mode (m, n) ≠ (0, 0) of a rigid rectangle whose |k_x|/k is smallest at wavenumber k. */
export function leastDampedMode(k: number, rect: CrossSection): { m: number; n: number; q: Complex } | null {
  const a = rect.y1 - rect.y0, b = rect.z1 - rect.z0;
  // kt = k is crossed before mπ/a exceeds 2k; scan a little beyond
  const mMax = Math.min(40, Math.ceil((2 * k * a) / Math.PI) + 1), nMax = Math.min(40, Math.ceil((2 * k * b) / Math.PI) + 1);
  let best: { m: number; n: number; q: Complex } | null = null, bestAbs = Infinity;
  for (let m = 0; m <= mMax; m++) for (let n = 0; n <= nMax; n++) {
    if (m === 0 && n === 0) continue;
    const kx = rectWavenumber(k, rect, m, n), abs = Math.hypot(kx.re, kx.im) / k;
    if (abs < bestAbs) { bestAbs = abs; best = { m, n, q: { re: kx.re / k, im: kx.im / k } }; }
  }
  return best;
}

/** Each port's predicted reflection: the plane wave and its least-damped higher mode. */
export function portReflections(a: Absorber, order: number, k: number, ports: readonly Port[]): PortReflection[] {
  const plane = predictedReflection(a, order, { re: 1, im: 0 });
  return ports.map((port) => {
    const mode = leastDampedMode(k, port.rect);
    const reflection: ModeReflection | null = mode && { ...mode, propagating: mode.q.im === 0, reflection: predictedReflection(a, order, mode.q) };
    return { port: port.name, planeWave: plane, mode: reflection };
  });
}
