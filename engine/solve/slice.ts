/**
 * Samples a solved field on a regular grid of one plane: the fast path behind the app's field-slice view.
 * It finds each sample's cell by binary search on the grid's axis nodes and sums the element's
 * tensor-product basis, with the 1D basis values tabulated once per sample row and column; the result
 * matches engine/assembly/sources.ts evaluateAt point by point (tests/app/sampler.test.ts).
 *
 * Only the physical region is sampled (the absorbing layers are left out); points in solid cells are NaN.
 */
import type { ComplexVector } from '../core/complex.ts';
import { planeAxes, type AxisIndex, type Box } from '../core/space.ts';
import type { Mesh } from '../grid/mesh.ts';
import { tabulate } from '../fe/basis.ts';

export interface SliceRequest {
  /** The plane's normal. */
  axis: AxisIndex;
  /** Coordinate of the plane along its normal, m. */
  position: number;
  /** Samples along the longer in-plane side; the shorter side gets as many as keep the cells square. */
  maxSamples: number;
}

/**
 * A field slice sampled on a regular grid of the plane: value k = i + nu·j lies at (u[i], v[j]), where
 * (u, v) are the plane's axes in x, y, z order (planeAxes). re and im are the complex peak pressure, Pa;
 * NaN where the point is solid.
 */
export interface Slice {
  frequencyHz: number;
  axis: AxisIndex;
  position: number;
  u: Float64Array;
  v: Float64Array;
  re: Float64Array;
  im: Float64Array;
}

const lo = (b: Box, d: AxisIndex) => (d === 0 ? b.x0 : d === 1 ? b.y0 : b.z0);
const hi = (b: Box, d: AxisIndex) => (d === 0 ? b.x1 : d === 1 ? b.y1 : b.z1);

/** Cell-centred sample coordinates over [a, b]. */
function samples(a: number, b: number, n: number): Float64Array {
  const out = new Float64Array(n), h = (b - a) / n;
  for (let i = 0; i < n; i++) out[i] = a + (i + 0.5) * h;
  return out;
}

/** The cells of `nodes` (restricted to [first, last)) that contain x: one, or two when x is on a node. */
function cellsAt(nodes: Float64Array, first: number, last: number, x: number): number[] {
  const tol = 1e-12 * Math.max(1, Math.abs(x));
  if (x < nodes[first] - tol || x > nodes[last] + tol) return [];
  let a = first, b = last; // invariant: nodes[a] ≤ x ≤ nodes[b]
  while (b - a > 1) {
    const m = (a + b) >> 1;
    if (nodes[m] <= x) a = m;
    else b = m;
  }
  const out = [a];
  if (Math.abs(x - nodes[a]) <= tol && a > first) out.push(a - 1);
  if (Math.abs(x - nodes[a + 1]) <= tol && a + 1 < last) out.push(a + 1);
  return out;
}

interface AxisSamples { cells: number[][]; basis: Float64Array[] /* per sample per candidate cell: p + 1 values */ }

function axisSamples(mesh: Mesh, d: AxisIndex, coords: ArrayLike<number>): AxisSamples {
  const ax = mesh.grid.axes[d], p = mesh.order, cells: number[][] = [], basis: Float64Array[] = [];
  for (let i = 0; i < coords.length; i++) {
    const x = coords[i], list = cellsAt(ax.nodes, ax.physLo, ax.physHi, x);
    cells.push(list);
    for (const c of list) {
      const a = ax.nodes[c], b = ax.nodes[c + 1], xi = Math.min(1, Math.max(-1, (2 * (x - a)) / (b - a) - 1));
      basis.push(tabulate(p, [xi]).values);
    }
  }
  return { cells, basis };
}

/** Element index of every grid cell, −1 for solid cells. */
export function elementOfCell(mesh: Mesh): Int32Array {
  const [nx, ny, nz] = mesh.grid.dims, map = new Int32Array(nx * ny * nz).fill(-1);
  for (let e = 0; e < mesh.elements.length; e++) map[mesh.elements[e]] = e;
  return map;
}

/** Sample counts for a plane of extents (du, dv): the longer side gets maxSamples, cells stay square. */
export function sampleCounts(du: number, dv: number, maxSamples: number): [number, number] {
  const n = Math.max(2, Math.round(maxSamples));
  if (du >= dv) return [n, Math.max(2, Math.round((n * dv) / du))];
  return [Math.max(2, Math.round((n * du) / dv)), n];
}

export function sampleSlice(mesh: Mesh, cellElements: Int32Array, u: ComplexVector, bounds: Box, frequencyHz: number, request: SliceRequest): Slice {
  const { axis } = request, [ua, va] = planeAxes(axis), p = mesh.order, n = p + 1, n3 = n * n * n;
  const position = Math.min(hi(bounds, axis), Math.max(lo(bounds, axis), request.position));
  const [nu, nv] = sampleCounts(hi(bounds, ua) - lo(bounds, ua), hi(bounds, va) - lo(bounds, va), request.maxSamples);
  const us = samples(lo(bounds, ua), hi(bounds, ua), nu), vs = samples(lo(bounds, va), hi(bounds, va), nv);
  const U = axisSamples(mesh, ua, us), V = axisSamples(mesh, va, vs), W = axisSamples(mesh, axis, [position]);
  const re = new Float64Array(nu * nv).fill(NaN), im = new Float64Array(nu * nv).fill(NaN);
  const [nx, ny] = mesh.grid.dims, dofs = mesh.numbering.elementDofs;
  const uStart = offsets(U.cells), vStart = offsets(V.cells);
  const ijk = [0, 0, 0], phi: Float64Array[] = [new Float64Array(0), new Float64Array(0), new Float64Array(0)];
  for (let j = 0; j < nv; j++) for (let i = 0; i < nu; i++) {
    search: for (let cu = 0; cu < U.cells[i].length; cu++) for (let cv = 0; cv < V.cells[j].length; cv++) for (let cw = 0; cw < W.cells[0].length; cw++) {
      ijk[ua] = U.cells[i][cu]; ijk[va] = V.cells[j][cv]; ijk[axis] = W.cells[0][cw];
      const e = cellElements[ijk[0] + nx * (ijk[1] + ny * ijk[2])];
      if (e < 0) continue;
      phi[ua] = U.basis[uStart[i] + cu]; phi[va] = V.basis[vStart[j] + cv]; phi[axis] = W.basis[cw];
      let sr = 0, si = 0;
      const base = e * n3, px = phi[0], py = phi[1], pz = phi[2];
      for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) {
        const w = py[b] * pz[c], row = base + n * (b + n * c);
        for (let a = 0; a < n; a++) {
          const d = dofs[row + a], f = px[a] * w;
          sr += u.re[d] * f;
          si += u.im[d] * f;
        }
      }
      re[i + nu * j] = sr;
      im[i + nu * j] = si;
      break search;
    }
  }
  return { frequencyHz, axis, position, u: us, v: vs, re, im };
}

function offsets(cells: number[][]): number[] {
  const out: number[] = [];
  let k = 0;
  for (const c of cells) { out.push(k); k += c.length; }
  return out;
}
