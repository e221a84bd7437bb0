/**
 * The air cells of a grid as elements, their global dof numbers, and the node lattice the solver's
 * nested dissection works on. Lattice node (I, J, K), I ∈ [0, nx·p], has index I + Nx(J + Ny K) with
 * Nx = nx·p + 1; element (i, j, k) holds the lattice nodes I ∈ [i·p, (i+1)·p] (likewise J, K).
 */
import type { Grid } from './grid.ts';
import { numberDofs, type Numbering } from './numbering.ts';
import { lobattoNodes } from '../fe/basis.ts';

export interface Mesh {
  grid: Grid;
  order: number;
  elements: Int32Array; // nElements: the cell index of each air cell
  numbering: Numbering;
  lattice: { dims: [number, number, number]; step: number; dofOf: Int32Array };
  dofLattice: Int32Array; // ndofs: the lattice index of each dof
}

export function buildMesh(grid: Grid): Mesh {
  const [nx, ny, nz] = grid.dims, p = grid.order, n = p + 1;
  const cells: number[] = [];
  for (let c = 0; c < grid.air.length; c++) if (grid.air[c]) cells.push(c);
  const elements = Int32Array.from(cells), nel = elements.length;
  const vx = nx + 1, vy = ny + 1;
  const verts = new Int32Array(8 * nel);
  for (let e = 0; e < nel; e++) {
    const c = elements[e], i = c % nx, j = Math.floor(c / nx) % ny, k = Math.floor(c / (nx * ny));
    for (let v = 0; v < 8; v++) verts[8 * e + v] = i + (v & 1) + vx * (j + ((v >> 1) & 1) + vy * (k + ((v >> 2) & 1)));
  }
  const numbering = numberDofs(verts, vx * vy * (nz + 1), p);
  const L = [nx * p + 1, ny * p + 1, nz * p + 1] as [number, number, number];
  const dofOf = new Int32Array(L[0] * L[1] * L[2]).fill(-1), dofLattice = new Int32Array(numbering.ndofs);
  for (let e = 0; e < nel; e++) {
    const c = elements[e], i = c % nx, j = Math.floor(c / nx) % ny, k = Math.floor(c / (nx * ny));
    for (let I = 0; I < n * n * n; I++) {
      const a = I % n, b = Math.floor(I / n) % n, cc = Math.floor(I / (n * n));
      const l = i * p + a + L[0] * (j * p + b + L[1] * (k * p + cc));
      const dof = numbering.elementDofs[e * n * n * n + I];
      if (dofOf[l] >= 0 && dofOf[l] !== dof) throw new Error(`buildMesh: lattice node ${l} got dofs ${dofOf[l]} and ${dof}`);
      dofOf[l] = dof;
      dofLattice[dof] = l;
    }
  }
  return { grid, order: p, elements, numbering, lattice: { dims: L, step: p, dofOf }, dofLattice };
}

/** Physical coordinates of every dof, as xyz triples. */
export function dofCoordinates(mesh: Mesh): Float64Array {
  const { grid, order: p } = mesh, xi = lobattoNodes(p), L = mesh.lattice.dims;
  const out = new Float64Array(3 * mesh.numbering.ndofs);
  const axisCoord = (d: number, I: number) => {
    const cell = Math.min(Math.floor(I / p), grid.dims[d] - 1), a = I - cell * p;
    const x0 = grid.axes[d].nodes[cell], x1 = grid.axes[d].nodes[cell + 1];
    return x0 + 0.5 * (xi[a] + 1) * (x1 - x0);
  };
  for (let dof = 0; dof < mesh.numbering.ndofs; dof++) {
    const l = mesh.dofLattice[dof], I = l % L[0], J = Math.floor(l / L[0]) % L[1], K = Math.floor(l / (L[0] * L[1]));
    out[3 * dof] = axisCoord(0, I);
    out[3 * dof + 1] = axisCoord(1, J);
    out[3 * dof + 2] = axisCoord(2, K);
  }
  return out;
}
