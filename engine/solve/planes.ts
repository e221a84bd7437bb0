/**
 * Integrals over a cross-section x = x₀ of the air: ∫ p dS, ∫ p ψ dS for a weight ψ(y, z), and the
 * active power ½ Re ∫ p v_x* dS with v_x = −(1/(jωρ)) ∂p/∂x (e^{+jωt}, peak amplitudes). Each element
 * column cut by the plane is integrated with a (p+1)-point Gauss rule in y and z; the element on the
 * low-x side of the plane is used when x₀ falls on an element boundary.
 */
import type { Complex, ComplexVector } from '../core/complex.ts';
import type { CrossSection } from '../core/space.ts';
import type { Mesh } from '../grid/mesh.ts';
import { tabulate } from '../fe/basis.ts';
import { gaussLegendre } from '../fe/quadrature.ts';

export interface PlaneSample {
  area: number;
  mean: Complex; // ∫p dS / area
  projection: Complex; // ∫p ψ dS / ∫ψ² dS
  power: number; // ½ Re ∫ p v_x* dS, W, positive towards +x
}

function cellOf(nodes: Float64Array, x: number, lowSide: boolean): number {
  for (let i = 0; i < nodes.length - 1; i++) {
    if (lowSide ? x > nodes[i] + 1e-12 && x <= nodes[i + 1] + 1e-12 : x >= nodes[i] - 1e-12 && x < nodes[i + 1] - 1e-12) return i;
  }
  return -1;
}

export function samplePlane(mesh: Mesh, u: ComplexVector, x0: number, rect: CrossSection, omega: number, density: number, psi: (y: number, z: number) => number = () => 1): PlaneSample {
  const g = mesh.grid, p = mesh.order, n = p + 1, n3 = n * n * n, [nx, ny] = g.dims;
  const i = cellOf(g.axes[0].nodes, x0, true);
  if (i < 0) throw new Error(`samplePlane: x = ${x0} m is outside the grid`);
  const xa = g.axes[0].nodes[i], xb = g.axes[0].nodes[i + 1], hx = xb - xa;
  const tx = tabulate(p, [(2 * (x0 - xa)) / hx - 1]);
  const rule = gaussLegendre(n), tq = tabulate(p, rule.points);
  const elementOfCell = new Map<number, number>();
  for (let e = 0; e < mesh.elements.length; e++) elementOfCell.set(mesh.elements[e], e);
  let area = 0, sr = 0, si = 0, pr = 0, pi = 0, psi2 = 0, power = 0;
  for (let k = 0; k < g.dims[2]; k++) for (let j = 0; j < ny; j++) {
    const e = elementOfCell.get(i + nx * (j + ny * k));
    if (e === undefined || g.axes[1].layerSide[j] !== 0 || g.axes[2].layerSide[k] !== 0) continue;
    const ya = g.axes[1].nodes[j], yb = g.axes[1].nodes[j + 1], za = g.axes[2].nodes[k], zb = g.axes[2].nodes[k + 1];
    const yc = 0.5 * (ya + yb), zc = 0.5 * (za + zb);
    if (yc < rect.y0 || yc > rect.y1 || zc < rect.z0 || zc > rect.z1) continue;
    const jac = ((yb - ya) * (zb - za)) / 4;
    for (let qz = 0; qz < n; qz++) for (let qy = 0; qy < n; qy++) {
      const w = rule.weights[qy] * rule.weights[qz] * jac;
      const y = ya + 0.5 * (yb - ya) * (rule.points[qy] + 1), z = za + 0.5 * (zb - za) * (rule.points[qz] + 1);
      let vr = 0, vi = 0, dr = 0, di = 0;
      for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) {
        const yz = tq.values[qy * n + b] * tq.values[qz * n + c];
        for (let a = 0; a < n; a++) {
          const d = mesh.numbering.elementDofs[e * n3 + a + n * (b + n * c)];
          const phi = tx.values[a] * yz, dphi = (tx.slopes[a] * 2 * yz) / hx;
          vr += u.re[d] * phi; vi += u.im[d] * phi;
          dr += u.re[d] * dphi; di += u.im[d] * dphi;
        }
      }
      const wpsi = psi(y, z);
      area += w;
      sr += w * vr; si += w * vi;
      pr += w * wpsi * vr; pi += w * wpsi * vi;
      psi2 += w * wpsi * wpsi;
      // v = −∂p/∂x / (jωρ), so ½Re(p v*) = ½(Im p · Re ∂p/∂x − Re p · Im ∂p/∂x) / (ωρ)
      power += (0.5 * w * (vi * dr - vr * di)) / (omega * density);
    }
  }
  if (area === 0) throw new Error(`samplePlane: no air in the cross-section at x = ${x0} m`);
  return { area, mean: { re: sr / area, im: si / area }, projection: { re: pr / psi2, im: pi / psi2 }, power };
}

/**
 * Active power averaged over x ∈ [x0, x1] by a Gauss rule: in a straight lossless run the exact power is
 * the same through every cross-section, and the average is far more accurate than one plane's, whose
 * ∂p/∂x carries the element's O(h^p) error.
 */
export function averagePower(mesh: Mesh, u: ComplexVector, x0: number, x1: number, rect: CrossSection, omega: number, density: number): number {
  const rule = gaussLegendre(mesh.order + 1);
  let w = 0;
  for (let q = 0; q < rule.points.length; q++) {
    const x = x0 + 0.5 * (x1 - x0) * (rule.points[q] + 1);
    w += 0.5 * rule.weights[q] * samplePlane(mesh, u, x, rect, omega, density).power;
  }
  return w;
}

/** The grid cell [x_a, x_b] along x that contains x (low side on a boundary). */
export function cellSpan(mesh: Mesh, x: number): [number, number] {
  const nodes = mesh.grid.axes[0].nodes, i = cellOf(nodes, x, true);
  return [nodes[i], nodes[i + 1]];
}
