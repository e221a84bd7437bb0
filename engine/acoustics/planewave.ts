// Plane-wave (one-dimensional) model of a duct silencer as a chain of
// four-poles, Munjal, Acoustics of Ducts and Mufflers (1987). Valid below the
// first cut-on frequency (cuton.ts); the 3D solver is the reference above it.
import { requireNonNegative, requirePositive } from './checks.ts';
import { abs, add, cx, div, mul, scale, sub, type Complex } from '../core/complex.ts';
import {
  ductFourPole,
  IDENTITY_FOUR_POLE,
  multiplyFourPoles,
  shuntFourPole,
  type FourPole,
} from './fourpole.ts';

/**
 * How a side branch ends: 'closed' is a rigid end; 'open' is an anechoic
 * (infinitely long) branch, so its length does not matter; 'pressure-release'
 * is an open pipe end idealised as p = 0 at length + endCorrection.
 */
export type BranchEnd = 'closed' | 'open' | 'pressure-release';

export type ChainElement =
  | { kind: 'duct'; length: number; area: number }
  | { kind: 'branch'; area: number; length: number; end: BranchEnd; endCorrection?: number };

/** Elements from inlet to outlet. */
export type Chain = readonly ChainElement[];

export interface PlaneWaveMedium {
  soundSpeed: number;
  density: number;
}

export interface PlaneWaveOptions {
  frequencyHz: number;
  air: PlaneWaveMedium;
  /** Defaults to the area of the first duct in the chain. */
  inletArea?: number;
  /** Defaults to the area of the last duct in the chain. */
  outletArea?: number;
}

export type Termination = 'anechoic' | 'rigid';

/**
 * Branch input admittance Y_b = U_b/p at the junction. For a rigid end at
 * y = L: p = C·cos k(L − y), and Euler's jωρu = −∂p/∂y gives
 * u(0) = j·C·sin(kL)/(ρc), so Y_b = j(S_b/ρc)·tan kL — infinite at kL = π/2,
 * where the branch forces p = 0 at the junction (the quarter-wave stub).
 * With p = C·sin k(L − y) instead, Y_b = −j(S_b/ρc)·cot kL.
 */
export function branchAdmittance(
  branch: Extract<ChainElement, { kind: 'branch' }>,
  k: number,
  rhoC: number,
): Complex {
  requirePositive('branch area', branch.area);
  const y0 = branch.area / rhoC;
  if (branch.end === 'open') return cx(y0);
  const endCorrection = branch.endCorrection ?? 0;
  requireNonNegative('branch length', branch.length);
  requireNonNegative('branch endCorrection', endCorrection);
  const kl = k * (branch.length + endCorrection);
  return branch.end === 'closed' ? cx(0, y0 * Math.tan(kl)) : cx(0, -y0 / Math.tan(kl));
}

export function elementFourPole(element: ChainElement, k: number, rhoC: number): FourPole {
  if (element.kind === 'branch') return shuntFourPole(branchAdmittance(element, k, rhoC));
  requireNonNegative('duct length', element.length);
  requirePositive('duct area', element.area);
  return ductFourPole(k, element.length, rhoC / element.area);
}

/** T = T₁·T₂·…·Tₙ, inlet first. */
export function chainFourPole(chain: Chain, k: number, rhoC: number): FourPole {
  return chain.reduce((t, e) => multiplyFourPoles(t, elementFourPole(e, k, rhoC)), IDENTITY_FOUR_POLE);
}

/**
 * Transmission loss with an anechoic outlet:
 * TL = 20·log10|(T11 + T12/Z_o + Z_i·T21 + Z_i·T22/Z_o)/2| + 10·log10(S_i/S_o),
 * the ratio of incident power at the inlet to power leaving the outlet.
 */
export function planeWaveTl(chain: Chain, options: PlaneWaveOptions): number {
  const { t, zi, zo, inletArea, outletArea } = evaluate(chain, options);
  const ratio = scale(add(add(t.t11, scale(t.t12, 1 / zo)), scale(add(t.t21, scale(t.t22, 1 / zo)), zi)), 0.5);
  return 20 * Math.log10(abs(ratio)) + 10 * Math.log10(inletArea / outletArea);
}

/**
 * Pressure reflection coefficient B/A at the inlet plane, p = A e^{−jkx} + B e^{jkx},
 * for an anechoic or a rigid (U = 0) outlet.
 */
export function inletReflection(chain: Chain, options: PlaneWaveOptions & { termination: Termination }): Complex {
  const { t, zi, zo } = evaluate(chain, options);
  // Outlet state up to a common factor: anechoic p₂ = Z_o·U₂; rigid U₂ = 0.
  const [p2, u2] = options.termination === 'anechoic' ? [zo, 1] : [1, 0];
  const p1 = add(scale(t.t11, p2), scale(t.t12, u2));
  const ziU1 = scale(add(scale(t.t21, p2), scale(t.t22, u2)), zi);
  return div(sub(p1, ziU1), add(p1, ziU1));
}

/** Input impedance p₁/U₁ of the chain with an anechoic outlet. */
export function inletImpedance(chain: Chain, options: PlaneWaveOptions): Complex {
  const { t, zo } = evaluate(chain, options);
  return div(add(mul(t.t11, cx(zo)), t.t12), add(mul(t.t21, cx(zo)), t.t22));
}

function evaluate(chain: Chain, options: PlaneWaveOptions) {
  requirePositive('frequencyHz', options.frequencyHz);
  requirePositive('soundSpeed', options.air.soundSpeed);
  requirePositive('density', options.air.density);
  const rhoC = options.air.density * options.air.soundSpeed;
  const k = (2 * Math.PI * options.frequencyHz) / options.air.soundSpeed;
  const ducts = chain.filter((e) => e.kind === 'duct');
  const inletArea = options.inletArea ?? ducts[0]?.area;
  const outletArea = options.outletArea ?? ducts[ducts.length - 1]?.area;
  if (inletArea === undefined || outletArea === undefined) {
    throw new RangeError('a chain without ducts needs inletArea and outletArea');
  }
  requirePositive('inletArea', inletArea);
  requirePositive('outletArea', outletArea);
  return { t: chainFourPole(chain, k, rhoC), zi: rhoC / inletArea, zo: rhoC / outletArea, inletArea, outletArea };
}

/**
 * Complex transmission ratio p_t/p_i with an anechoic outlet: the outlet's forward wave over the
 * inlet's incident wave, 2/(T11 + T12/Z_o + Z_i·T21 + Z_i·T22/Z_o). The transmitted power ratio is
 * |p_t/p_i|²·S_o/S_i, so planeWaveTl = −10·log10 of it.
 */
export function planeWaveTransmission(chain: Chain, options: PlaneWaveOptions): Complex {
  const { t, zi, zo } = evaluate(chain, options);
  const ratio = scale(add(add(t.t11, scale(t.t12, 1 / zo)), scale(add(t.t21, scale(t.t22, 1 / zo)), zi)), 0.5);
  return div(cx(1), ratio);
}
