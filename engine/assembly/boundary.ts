/**
 * Locally reacting surfaces. With e^{+jωt} and specific impedance Z_s = p/v_n (v_n into the surface),
 * (1/ρ)∂p/∂n = −jω p/Z_s, so the surface adds +jω ∮ (1/Z_s) p v dS to a(p, v): on each element face a
 * 2D Kronecker product of the two in-face 1D mass matrices (Kinsler et al., Fundamentals of Acoustics,
 * 4th ed. 2000, §6.2 for the impedance boundary condition).
 */
import type { ComplexCsr } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';
import type { AssemblyPattern } from './assemble.ts';
import { element1D } from '../fe/element.ts';
import { NO_STRETCH } from '../fe/stretch.ts';
import type { Complex } from '../core/complex.ts';
import { sideAxis, sideSign, type Side } from '../core/space.ts';

export interface SurfaceFace {
  element: number; // index into mesh.elements
  side: Side; // which face of the element
  admittance: Complex; // 1/Z_s, m²·s/kg
}

/** Element faces on the boundary of the air on `side` whose centre satisfies `where`. */
export function boundaryFaces(mesh: Mesh, side: Side, where: (x: number, y: number, z: number) => boolean): { element: number; side: Side }[] {
  const g = mesh.grid, [nx, ny] = g.dims, d = sideAxis(side), s = sideSign(side), out: { element: number; side: Side }[] = [];
  const air = (ijk: number[]) => ijk.every((v, a) => v >= 0 && v < g.dims[a]) && g.air[ijk[0] + nx * (ijk[1] + ny * ijk[2])] === 1;
  for (let e = 0; e < mesh.elements.length; e++) {
    const c = mesh.elements[e], ijk = [c % nx, Math.floor(c / nx) % ny, Math.floor(c / (nx * ny))];
    if (ijk.some((v, a) => g.axes[a].layerSide[v] !== 0)) continue;
    const nb = ijk.slice();
    nb[d] += s;
    if (air(nb)) continue;
    const centre = ijk.map((v, a) => (a === d ? g.axes[a].nodes[v + (s > 0 ? 1 : 0)] : 0.5 * (g.axes[a].nodes[v] + g.axes[a].nodes[v + 1])));
    if (where(centre[0], centre[1], centre[2])) out.push({ element: e, side });
  }
  return out;
}

/** A += jω Σ_faces Y ∮ φ_I φ_J dS, in place on the assembled values. */
export function addSurfaceAdmittance(A: ComplexCsr, mesh: Mesh, sym: AssemblyPattern, omega: number, faces: SurfaceFace[]): void {
  const p = mesh.order, n = p + 1, n3 = n * n * n, g = mesh.grid, [nx, ny] = g.dims;
  for (const f of faces) {
    const c = mesh.elements[f.element], ijk = [c % nx, Math.floor(c / nx) % ny, Math.floor(c / (nx * ny))];
    const d = sideAxis(f.side), fixed = sideSign(f.side) > 0 ? p : 0;
    const [a1, a2] = [0, 1, 2].filter((a) => a !== d);
    const m1 = element1D(p, g.axes[a1].nodes[ijk[a1]], g.axes[a1].nodes[ijk[a1] + 1], NO_STRETCH).mRe;
    const m2 = element1D(p, g.axes[a2].nodes[ijk[a2]], g.axes[a2].nodes[ijk[a2] + 1], NO_STRETCH).mRe;
    const cr = -omega * f.admittance.im, ci = omega * f.admittance.re; // jω·Y
    const local = (u: number, v: number) => { const l = [0, 0, 0]; l[d] = fixed; l[a1] = u; l[a2] = v; return l[0] + n * (l[1] + n * l[2]); };
    for (let v = 0; v < n; v++) for (let u = 0; u < n; u++) for (let v2 = 0; v2 < n; v2++) for (let u2 = 0; u2 < n; u2++) {
      const w = m1[u * n + u2] * m2[v * n + v2];
      if (w === 0) continue;
      const at = sym.scatter[(f.element * n3 + local(u, v)) * n3 + local(u2, v2)];
      A.re[at] += cr * w;
      A.im[at] += ci * w;
    }
  }
}

/** Specific admittance 1/Z_s from a normal-incidence absorption coefficient (real impedance ratio, common practice) or a normalised impedance ζ = Z_s/(ρc). */
export function surfaceAdmittance(spec: { absorption: number } | { impedance: [number, number] }, rhoC: number): Complex {
  let zr: number, zi: number;
  if ('absorption' in spec) {
    const r = Math.sqrt(1 - spec.absorption);
    zr = (1 + r) / (1 - r);
    zi = 0;
  } else {
    [zr, zi] = spec.impedance;
  }
  const m2 = (zr * zr + zi * zi) * rhoC;
  return { re: zr / m2, im: -zi / m2 };
}
