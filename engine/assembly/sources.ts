/**
 * Right-hand sides. With e^{+jωt} a point source of volume velocity Q obeys
 * ∇·((1/ρ)∇p) + (ω²/κ)p = −jωQ δ(x − x₀), so b_i = jωQ φ_i(x₀) and the free-field solution is
 * p = jωρQ e^{−jkr}/(4πr) (Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. 2000, §7.4).
 */
import type { ComplexVector } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';
import { tabulate } from '../fe/basis.ts';
import { gaussLegendre } from '../fe/quadrature.ts';
import type { Complex } from '../core/complex.ts';

/** The air element holding a point, with the point's reference coordinates in it; null if in no air cell. */
export function locate(mesh: Mesh, x: number, y: number, z: number): { element: number; xi: [number, number, number] } | null {
  const g = mesh.grid, pt = [x, y, z], idx = [0, 0, 0], xi: [number, number, number] = [0, 0, 0];
  const candidates: number[][] = [];
  for (let d = 0; d < 3; d++) {
    const nodes = g.axes[d].nodes, list: number[] = [];
    for (let i = 0; i < nodes.length - 1; i++) if (pt[d] >= nodes[i] - 1e-12 && pt[d] <= nodes[i + 1] + 1e-12) list.push(i);
    if (list.length === 0) return null;
    candidates.push(list);
  }
  const elementOfCell = new Map<number, number>();
  for (let e = 0; e < mesh.elements.length; e++) elementOfCell.set(mesh.elements[e], e);
  for (const i of candidates[0]) for (const j of candidates[1]) for (const k of candidates[2]) {
    const e = elementOfCell.get(i + g.dims[0] * (j + g.dims[1] * k));
    if (e === undefined) continue;
    idx[0] = i; idx[1] = j; idx[2] = k;
    for (let d = 0; d < 3; d++) {
      const a = g.axes[d].nodes[idx[d]], b = g.axes[d].nodes[idx[d] + 1];
      xi[d] = Math.min(1, Math.max(-1, (2 * (pt[d] - a)) / (b - a) - 1));
    }
    return { element: e, xi };
  }
  return null;
}

/** Values of the element's (p+1)³ basis functions at reference point xi. */
export function basisAt(p: number, xi: [number, number, number]): Float64Array {
  const n = p + 1, tx = tabulate(p, [xi[0]]), ty = tabulate(p, [xi[1]]), tz = tabulate(p, [xi[2]]);
  const out = new Float64Array(n * n * n);
  for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) for (let a = 0; a < n; a++) out[a + n * (b + n * c)] = tx.values[a] * ty.values[b] * tz.values[c];
  return out;
}

/** Adds amplitude·φ_i(x₀) to b (amplitude = jωQ for a monopole of volume velocity Q). */
export function addPointLoad(mesh: Mesh, point: [number, number, number], amplitude: Complex, b: ComplexVector): void {
  const hit = locate(mesh, ...point);
  if (!hit) throw new Error(`the point (${point.join(', ')}) m lies in no air cell`);
  const phi = basisAt(mesh.order, hit.xi), n3 = phi.length, dofs = mesh.numbering.elementDofs;
  for (let I = 0; I < n3; I++) {
    const d = dofs[hit.element * n3 + I];
    b.re[d] += amplitude.re * phi[I];
    b.im[d] += amplitude.im * phi[I];
  }
}

/** Interpolates a nodal field at a point. */
export function evaluateAt(mesh: Mesh, u: ComplexVector, point: [number, number, number]): Complex {
  const hit = locate(mesh, ...point);
  if (!hit) throw new Error(`the point (${point.join(', ')}) m lies in no air cell`);
  const phi = basisAt(mesh.order, hit.xi), n3 = phi.length, dofs = mesh.numbering.elementDofs;
  let re = 0, im = 0;
  for (let I = 0; I < n3; I++) {
    const d = dofs[hit.element * n3 + I];
    re += u.re[d] * phi[I];
    im += u.im[d] * phi[I];
  }
  return { re, im };
}

/**
 * ∫ f φ_i dV over the given elements (all by default), f real or complex, with a (p+2)-point Gauss rule per
 * axis; `integrate` also returns ∫ g(u_h, x) dV for error norms when given.
 */
export function addBodyLoad(mesh: Mesh, f: (x: number, y: number, z: number) => Complex, b: ComplexVector): void {
  forEachQuadraturePoint(mesh, (e, x, y, z, wt, phi) => {
    const v = f(x, y, z), n3 = phi.length, dofs = mesh.numbering.elementDofs;
    for (let I = 0; I < n3; I++) {
      const d = dofs[e * n3 + I];
      b.re[d] += wt * v.re * phi[I];
      b.im[d] += wt * v.im * phi[I];
    }
  });
}

/** Calls back at every quadrature point of every physical (non-layer) element with weight·|J| and basis values. */
export function forEachQuadraturePoint(mesh: Mesh, visit: (element: number, x: number, y: number, z: number, weight: number, phi: Float64Array) => void, extra = 1): void {
  const p = mesh.order, n = p + 1, rule = gaussLegendre(p + 1 + extra), tab = tabulate(p, rule.points), nq = rule.points.length;
  const g = mesh.grid, [nx, ny] = g.dims, phi = new Float64Array(n * n * n);
  for (let e = 0; e < mesh.elements.length; e++) {
    const c = mesh.elements[e], ijk = [c % nx, Math.floor(c / nx) % ny, Math.floor(c / (nx * ny))];
    if (ijk.some((v, d) => g.axes[d].layerSide[v] !== 0)) continue;
    const lo = ijk.map((v, d) => g.axes[d].nodes[v]), h = ijk.map((v, d) => g.axes[d].nodes[v + 1] - g.axes[d].nodes[v]);
    const jac = (h[0] * h[1] * h[2]) / 8;
    for (let qz = 0; qz < nq; qz++) for (let qy = 0; qy < nq; qy++) for (let qx = 0; qx < nq; qx++) {
      for (let cc = 0; cc < n; cc++) for (let b = 0; b < n; b++) for (let a = 0; a < n; a++) phi[a + n * (b + n * cc)] = tab.values[qx * n + a] * tab.values[qy * n + b] * tab.values[qz * n + cc];
      const x = lo[0] + 0.5 * h[0] * (rule.points[qx] + 1), y = lo[1] + 0.5 * h[1] * (rule.points[qy] + 1), z = lo[2] + 0.5 * h[2] * (rule.points[qz] + 1);
      visit(e, x, y, z, rule.weights[qx] * rule.weights[qy] * rule.weights[qz] * jac, phi);
    }
  }
}
