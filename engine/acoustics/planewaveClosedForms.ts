// Closed-form plane-wave transmission losses: quick estimates for users and
// oracles for the four-pole chain (planewave.ts) and the 3D solver.
import { requirePositive } from './checks.ts';

/**
 * Single expansion chamber of area ratio m = S_chamber/S_pipe and length L
 * between equal anechoic pipes: TL = 10·log10[1 + ¼(m − 1/m)²·sin²(kL)].
 * Davis, Stokes, Moore & Stevens, NACA Report 1192 (1954).
 */
export function expansionChamberTl(m: number, k: number, length: number): number {
  requirePositive('area ratio m', m);
  const s = Math.sin(k * length);
  return 10 * Math.log10(1 + 0.25 * (m - 1 / m) ** 2 * s * s);
}

/**
 * Closed side branch (quarter-wave resonator) of area S_b and length L_b on a
 * uniform duct of area S: TL = 10·log10[1 + ((S_b/(2S))·tan kL_b)²].
 * From the shunt four-pole with Y_b = j(S_b/ρc)·tan kL_b between two anechoic
 * pipes: A/p₂ = 1 + Z·Y_b/2 = 1 + j(S_b/(2S))·tan kL_b (Munjal 1987).
 */
export function closedSideBranchTl(ductArea: number, branchArea: number, k: number, branchLength: number): number {
  requirePositive('ductArea', ductArea);
  requirePositive('branchArea', branchArea);
  const x = (branchArea / (2 * ductArea)) * Math.tan(k * branchLength);
  return 10 * Math.log10(1 + x * x);
}

/**
 * Sudden area change S₁ → S₂ (p and U continuous), anechoic outlet: the power
 * transmission coefficient is 4S₁S₂/(S₁ + S₂)², so TL = 10·log10[(S₁ + S₂)²/(4S₁S₂)]
 * (Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed., 2000).
 */
export function areaChangeTl(inletArea: number, outletArea: number): number {
  requirePositive('inletArea', inletArea);
  requirePositive('outletArea', outletArea);
  return 10 * Math.log10((inletArea + outletArea) ** 2 / (4 * inletArea * outletArea));
}
