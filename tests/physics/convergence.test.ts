/** A manufactured smooth solution on a rigid box: the L2 error falls as h^(p+1). */
import { describe, expect, it } from 'vitest';
import { assembleHelmholtz, uniformMaterials } from '../../engine/assembly/assemble.ts';
import { addBodyLoad, forEachQuadraturePoint } from '../../engine/assembly/sources.ts';
import { zeroVector } from '../../engine/linalg/sparse.ts';
import { layerStretches } from '../../engine/assembly/layers.ts';
import { problem, solve } from './helpers.ts';

const [Lx, Ly, Lz] = [1, 0.75, 0.5], k = 2; // every h below divides all three sides, so h halves on every axis
// u = cos(πx/Lx)cos(πy/Ly)cos(πz/Lz) has ∂u/∂n = 0 on every face of the box: rigid walls hold exactly
const exact = (x: number, y: number, z: number) => Math.cos((Math.PI * x) / Lx) * Math.cos((Math.PI * y) / Ly) * Math.cos((Math.PI * z) / Lz);
const lambda = Math.PI ** 2 * (1 / Lx ** 2 + 1 / Ly ** 2 + 1 / Lz ** 2);

function l2Error(order: number, h: number): number {
  const pb = problem({ order, boxes: [{ x0: 0, x1: Lx, y0: 0, y1: Ly, z0: 0, z1: Lz }], openings: [], maxElementSize: h, layerCount: 0 });
  // −∇²u − k²u = f: ρ = 1, ω²/κ = k²
  const A = assembleHelmholtz(pb.mesh, pb.assembly, k, layerStretches(pb.mesh.grid, k, { kind: 'discrete' }), uniformMaterials(pb.mesh.elements.length, 1, 1));
  const b = zeroVector(A.n);
  addBodyLoad(pb.mesh, (x, y, z) => ({ re: (lambda - k * k) * exact(x, y, z), im: 0 }), b);
  const u = solve(pb, A, b);
  let err = 0;
  const n3 = (order + 1) ** 3, dofs = pb.mesh.numbering.elementDofs;
  forEachQuadraturePoint(pb.mesh, (e, x, y, z, w, phi) => {
    let uh = 0;
    for (let I = 0; I < n3; I++) uh += u.re[dofs[e * n3 + I]] * phi[I];
    err += w * (uh - exact(x, y, z)) ** 2;
  }, 2);
  return Math.sqrt(err);
}

describe('convergence on a manufactured solution', () => {
  const sizes: Record<number, [number, number]> = { 1: [1 / 8, 1 / 16], 2: [1 / 4, 1 / 8], 3: [1 / 4, 1 / 8], 4: [1 / 4, 1 / 8] };
  for (const p of [1, 2, 3, 4]) {
    it(`p = ${p}: L2 error rate within 0.3 of p + 1`, () => {
      const [h1, h2] = sizes[p], e1 = l2Error(p, h1), e2 = l2Error(p, h2), rate = Math.log(e1 / e2) / Math.log(h1 / h2);
      console.log(`p=${p}: e(${h1.toFixed(3)}) = ${e1.toExponential(3)}, e(${h2.toFixed(3)}) = ${e2.toExponential(3)}, rate ${rate.toFixed(2)}`);
      // Source: Ciarlet, The Finite Element Method for Elliptic Problems (1978), Thm 3.2.5 with the Aubin–Nitsche argument: ‖u − u_h‖_L2 = O(h^{p+1}).
      expect(Math.abs(rate - (p + 1))).toBeLessThan(0.3);
    });
  }
});
