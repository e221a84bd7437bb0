/**
 * A monopole in free field, truncated by absorbing layers on faces, edges and corners. The field is
 * symmetric about every plane through the source, so rigid planes through it are exact: an octant with
 * the source at its corner carries the same field as the whole box at an eighth of the cost. Both the
 * high-side octant (layers on +x, +y, +z) and the low-side one (−x, −y, −z) are run, so every layer side
 * is exercised; each has three face layers, three edge layers and a corner layer.
 *
 * Receivers lie in generic directions: the grid lines through the source are element edges that carry
 * the local error of the point-source singularity (a few per cent there), which is not what this checks.
 */
import { describe, expect, it } from 'vitest';
import { RoomProblem, type RoomModel } from '../../engine/solve/room.ts';
import type { AbsorberKind } from '../../engine/assembly/layers.ts';

const c = 343, rho = 1.2, f = 343, omega = 2 * Math.PI * f, Q = 1e-3, L = 0.8; // λ = 1 m, box 0.8 λ

// Source: Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. (2000), §7.4: |p| = ρω|Q|/(4πr) for a simple source
const analytic = (r: number) => (rho * omega * Q) / (4 * Math.PI * r);

function worstError(lowSide: boolean, ppw: number, layers: number, kind: AbsorberKind = 'discrete'): number {
  const o = lowSide ? L : 0, s = lowSide ? -1 : 1, receivers: RoomModel['receivers'] = [];
  for (const [dx, dy, dz] of [[1, 0.5, 0.2], [0.3, 1, 0.8], [0.7, 0.6, 1], [1, 0.9, 0.1]]) for (const r of [0.55, 0.75]) {
    const n = Math.hypot(dx, dy, dz);
    receivers.push({ name: `r${receivers.length}`, position: [o + (s * r * dx) / n, o + (s * r * dy) / n, o + (s * r * dz) / n] });
  }
  const model: RoomModel = {
    box: { x0: 0, x1: L, y0: 0, y1: L, z0: 0, z1: L }, open: lowSide ? ['-x', '-y', '-z'] : ['+x', '+y', '+z'], surfaces: [],
    sources: [{ name: 'Q', position: [o, o, o], volumeVelocity: Q / 8 }], receivers, // an eighth of the source's volume velocity flows into the octant
    soundSpeed: c, density: rho, order: 4, pointsPerWavelength: ppw, maxFrequencyHz: f, absorber: { kind, layers },
  };
  const r = new RoomProblem(model).solve(f, () => performance.now());
  let worst = 0;
  r.receivers.forEach((rec, i) => {
    const p = receivers[i].position, dist = Math.hypot(p[0] - o, p[1] - o, p[2] - o);
    worst = Math.max(worst, Math.abs(Math.hypot(rec.pressure.re, rec.pressure.im) / analytic(dist) - 1));
  });
  return worst;
}

describe('monopole in free field (face, edge and corner layers)', () => {
  it('|p| within 2 % of ρω|Q|/(4πr) at r > λ/2, layers on the high sides and on the low sides', () => {
    const high = worstError(false, 12, 3), low = worstError(true, 12, 3);
    console.log(`order 4, 12 points per wavelength, 3 discrete layers: worst error ${(100 * high).toFixed(3)} % (high sides), ${(100 * low).toFixed(3)} % (low sides)`);
    // Source: Kinsler et al. (2000), §7.4 — the 2 % tolerance is the acceptance figure
    expect(high).toBeLessThan(0.02);
    expect(low).toBeLessThan(0.02);
  });
  it('the error falls as the mesh is refined and as layers are added', () => {
    const coarse = worstError(false, 8, 3), fine = worstError(false, 12, 3), two = worstError(false, 12, 2), constant = worstError(false, 12, 3, 'constant');
    console.log(`ppw 8 → 12: ${(100 * coarse).toFixed(3)} % → ${(100 * fine).toFixed(3)} %; 2 → 3 discrete layers: ${(100 * two).toFixed(3)} % → ${(100 * fine).toFixed(3)} %; 3 constant layers: ${(100 * constant).toFixed(3)} %`);
    // common practice: a converging discretisation and a better truncation both shrink the error
    expect(fine).toBeLessThan(coarse / 5);
    expect(fine).toBeLessThan(two);
    // Source: arXiv:2308.12255 — reduced integration in the layers beats the full rule at equal complex lengths
    expect(fine).toBeLessThan(constant);
  });
});
