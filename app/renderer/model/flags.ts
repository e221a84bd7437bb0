/**
 * Points worth a second look, each with the reason in words: the engine's own accuracy flags
 * (engine/solve/accuracy.ts: layer reflection, energy balance of a lossless duct, the order check) and
 * inlet quantities a passive duct cannot produce. 'plane_wave_invalid' is not a doubt about the 3D
 * result (only about the plane-wave estimate beside it), so it does not mark a point.
 */
import type { PointResult } from '../../../engine/solve/points.ts';
import { formatNumber } from './units.ts';

/** Used only when a point carries no accuracy of its own. */
export const ENERGY_BALANCE_LIMIT = 1e-3;
/** Slack on |R| ≤ 1 and TL ≥ 0 before a point counts as odd (rounding of the power integrals). */
const PASSIVE_SLACK = 1e-3;
const NOT_A_DOUBT = new Set(['plane_wave_invalid']);

export type FlaggablePoint = PointResult & { accuracy?: { flags: readonly string[] } };

export function pointFlags(p: FlaggablePoint, meanings: Readonly<Record<string, string>> = {}): string[] {
  const out = (p.accuracy?.flags ?? []).filter((f) => !NOT_A_DOUBT.has(f)).map((f) => (meanings[f] ? `${f}: ${meanings[f]}` : f));
  if (p.kind === 'duct') {
    if (!p.accuracy && (!Number.isFinite(p.energyBalance) || p.energyBalance > ENERGY_BALANCE_LIMIT)) {
      out.push(`energy balance ${formatNumber(p.energyBalance, 2)} is above ${ENERGY_BALANCE_LIMIT}: refine the mesh (points per wavelength, order) or the absorbing layers`);
    }
    if (!Number.isFinite(p.inletReflection) || p.inletReflection > 1 + PASSIVE_SLACK) {
      out.push(`inlet reflection |R| = ${formatNumber(p.inletReflection, 4)} is above 1, which a passive duct cannot reflect`);
    }
    if (p.tlDb !== null && p.tlDb < -10 * Math.log10(1 + PASSIVE_SLACK)) {
      out.push(`transmission loss ${formatNumber(p.tlDb, 3)} dB is below 0: more power leaves than enters`);
    }
  } else if (p.receivers.some((r) => !Number.isFinite(r.splDb))) {
    out.push('a receiver level is not finite');
  }
  if (p.stats.perturbedPivots > 0) out.push(`${p.stats.perturbedPivots} pivots were perturbed in the factorisation: the system is close to singular (a resonance?)`);
  return out;
}
