/**
 * The structured grid of a duct's cross-section (the y–z plane), with the same order-p Lagrange elements
 * on Gauss–Lobatto nodes as the 3D grid, and its finite-element matrices.
 *
 * A cross-section is the duct's rectangle (rigid walls) holding fills: porous equivalent fluids (linings
 * on any face, baffles) and rigid cores (masked cells, no dofs). Where fills overlap, the one listed
 * first decides. Every box edge is a grid line; each interval is split into equal elements no longer than
 * the size its media allow (graded for the top frequency, as the 3D grid is).
 *
 * dim = 2: cells (i, j), i along y, j along z; lattice node (I, J), I ∈ [0, ny·p], index I + Ly·J,
 *          Ly = ny·p + 1; local node (a, b) has index a + (p+1)·b.
 * dim = 1: a section whose contents do not vary along z is solved per z-order n with ψ = Y(y)·cos(nπ(z−z0)/h)
 *          (separation of variables): the grid is then the y axis alone.
 *
 * Matrices, assembled once per grid, one set per medium slot s (0 air, 1 + i porous fill material i):
 *   K_s = Σ_{cells of s} ∫ ∇φ_I·∇φ_J,   M_s = Σ_{cells of s} ∫ φ_I φ_J,
 * so that at one frequency, with each slot's 1/ρ_s and 1/κ_s,
 *   K_ρ = Σ (1/ρ_s) K_s,  M_κ = Σ (1/κ_s) M_s,  M_ρ = Σ (1/ρ_s) M_s.
 * Continuity of pressure and of normal velocity (1/ρ)∂p/∂n between air and a bulk-reacting porous region is
 * natural in this weak form: the dofs on the interface are shared and no interface term appears (Astley &
 * Cummings, J. Sound Vib. 116 (1987); Kirby, J. Sound Vib. 2003, on dissipative silencers).
 */
import { element1D, type Matrix1D } from '../fe/element.ts';
import { NO_STRETCH } from '../fe/stretch.ts';
import { tabulate } from '../fe/basis.ts';
import { subdivide } from '../grid/grid.ts';
import { analyze, type SparsePattern, type Symbolic } from '../linalg/index.ts';

export interface Rect { y0: number; y1: number; z0: number; z1: number }

/** A rectangle of the cross-section filled with porous material `material` (an index into the section's materials) or rigid. */
export interface Fill { rect: Rect; material: 'rigid' | number }

export interface SectionGridSpec {
  outer: Rect;
  fills: readonly Fill[];
  order: number;
  /** Largest element edge per medium slot (0 air, 1 + i porous material i), m. */
  maxSize: readonly number[];
  dim: 1 | 2;
}

export interface SectionGrid {
  dim: 1 | 2;
  order: number;
  outer: Rect;
  yNodes: Float64Array; // ny + 1 element boundaries
  zNodes: Float64Array; // nz + 1 (dim 1: [z0, z1], one cell)
  ny: number;
  nz: number;
  cellSlot: Int16Array; // ny·nz: −1 rigid, 0 air, 1 + i porous material i; cell (i, j) at i + ny·j
  elements: Int32Array; // nElements: the cell index of each non-rigid cell
  nloc: number; // (p + 1)^dim
  elementDofs: Int32Array; // nElements × nloc
  ndofs: number;
  pattern: SparsePattern;
  slots: number; // 1 + number of porous materials
  stiffness: Float64Array[]; // per slot, nnz: K_s
  mass: Float64Array[]; // per slot, nnz: M_s
  symbolic: Symbolic; // of the pattern, for every frequency's shifted system
  slotArea: Float64Array; // per slot, m (dim 1) or m² (dim 2)
}

const TOL = 1e-9;

function uniqueSorted(v: number[]): number[] {
  const s = v.filter(Number.isFinite).sort((a, b) => a - b), out: number[] = [];
  for (const x of s) if (out.length === 0 || x - out[out.length - 1] > TOL) out.push(x);
  return out;
}

/** The medium slot at a point: the first fill containing it, else air (slot 0). */
export function slotAt(fills: readonly Fill[], y: number, z: number, dim: 1 | 2): number {
  for (const f of fills) {
    if (y > f.rect.y0 && y < f.rect.y1 && (dim === 1 || (z > f.rect.z0 && z < f.rect.z1))) return f.material === 'rigid' ? -1 : 1 + f.material;
  }
  return 0;
}

function axisNodes(breaks: number[], otherBreaks: number[], slotOf: (u: number, v: number) => number, maxSize: readonly number[]): Float64Array {
  const out = [breaks[0]];
  for (let i = 1; i < breaks.length; i++) {
    const u = 0.5 * (breaks[i - 1] + breaks[i]);
    let h = Infinity;
    for (let j = 1; j < otherBreaks.length; j++) {
      const s = slotOf(u, 0.5 * (otherBreaks[j - 1] + otherBreaks[j]));
      if (s >= 0) h = Math.min(h, maxSize[s]);
    }
    if (!Number.isFinite(h)) h = breaks[i] - breaks[i - 1]; // rigid all across: one element
    const piece = subdivide([breaks[i - 1], breaks[i]], h);
    for (let k = 1; k < piece.length; k++) out.push(piece[k]);
  }
  return Float64Array.from(out);
}

export function buildSectionGrid(spec: SectionGridSpec): SectionGrid {
  const { outer, fills, order: p, dim } = spec;
  if (!(outer.y1 > outer.y0) || (dim === 2 && !(outer.z1 > outer.z0))) throw new RangeError('buildSectionGrid: the outer rectangle is empty');
  const clip = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));
  const yBreaks = uniqueSorted([outer.y0, outer.y1, ...fills.flatMap((f) => [clip(f.rect.y0, outer.y0, outer.y1), clip(f.rect.y1, outer.y0, outer.y1)])]);
  const zBreaks = dim === 1 ? [outer.z0, outer.z1] : uniqueSorted([outer.z0, outer.z1, ...fills.flatMap((f) => [clip(f.rect.z0, outer.z0, outer.z1), clip(f.rect.z1, outer.z0, outer.z1)])]);
  const slots = 1 + fills.reduce((m, f) => (f.material === 'rigid' ? m : Math.max(m, f.material + 1)), 0);
  if (spec.maxSize.length < slots) throw new RangeError(`buildSectionGrid: maxSize has ${spec.maxSize.length} entries, the fills need ${slots}`);
  const yNodes = axisNodes(yBreaks, zBreaks, (y, z) => slotAt(fills, y, z, dim), spec.maxSize);
  const zNodes = dim === 1 ? Float64Array.from(zBreaks) : axisNodes(zBreaks, yBreaks, (z, y) => slotAt(fills, y, z, dim), spec.maxSize);
  const ny = yNodes.length - 1, nz = dim === 1 ? 1 : zNodes.length - 1;
  const cellSlot = new Int16Array(ny * nz), els: number[] = [];
  for (let j = 0; j < nz; j++) for (let i = 0; i < ny; i++) {
    const s = slotAt(fills, 0.5 * (yNodes[i] + yNodes[i + 1]), 0.5 * (zNodes[j] + zNodes[j + 1]), dim);
    cellSlot[i + ny * j] = s;
    if (s >= 0) els.push(i + ny * j);
  }
  if (els.length === 0) throw new RangeError('buildSectionGrid: the cross-section is rigid everywhere');
  const elements = Int32Array.from(els), n = p + 1, nloc = dim === 1 ? n : n * n;
  // number the lattice nodes that touch a non-rigid cell, in lattice order
  const Ly = ny * p + 1, Lz = dim === 1 ? 1 : nz * p + 1, lattice = new Int32Array(Ly * Lz).fill(-1);
  const elementDofs = new Int32Array(elements.length * nloc);
  for (const c of elements) {
    const i = c % ny, j = Math.floor(c / ny);
    for (let l = 0; l < nloc; l++) lattice[i * p + (l % n) + Ly * (dim === 1 ? 0 : j * p + Math.floor(l / n))] = 0;
  }
  let ndofs = 0;
  for (let l = 0; l < lattice.length; l++) if (lattice[l] === 0) lattice[l] = ndofs++;
  elements.forEach((c, e) => {
    const i = c % ny, j = Math.floor(c / ny);
    for (let l = 0; l < nloc; l++) elementDofs[e * nloc + l] = lattice[i * p + (l % n) + Ly * (dim === 1 ? 0 : j * p + Math.floor(l / n))];
  });
  const { pattern, position } = assemblePattern(ndofs, elementDofs, nloc);
  const stiffness = Array.from({ length: slots }, () => new Float64Array(pattern.colIdx.length));
  const mass = Array.from({ length: slots }, () => new Float64Array(pattern.colIdx.length));
  const slotArea = new Float64Array(slots);
  const kLoc = new Float64Array(nloc * nloc), mLoc = new Float64Array(nloc * nloc);
  const unitZ: Matrix1D = { n: 1, kRe: new Float64Array(1), kIm: new Float64Array(1), mRe: new Float64Array([1]), mIm: new Float64Array(1) };
  elements.forEach((c, e) => {
    const i = c % ny, j = Math.floor(c / ny), s = cellSlot[c];
    const Y = element1D(p, yNodes[i], yNodes[i + 1], NO_STRETCH), Z = dim === 1 ? unitZ : element1D(p, zNodes[j], zNodes[j + 1], NO_STRETCH);
    slotArea[s] += (yNodes[i + 1] - yNodes[i]) * (dim === 1 ? 1 : zNodes[j + 1] - zNodes[j]);
    localMatrices(Y, Z, n, dim, kLoc, mLoc);
    const K = stiffness[s], M = mass[s], base = e * nloc * nloc;
    for (let q = 0; q < nloc * nloc; q++) {
      K[position[base + q]] += kLoc[q];
      M[position[base + q]] += mLoc[q];
    }
  });
  return { dim, order: p, outer, yNodes, zNodes, ny, nz, cellSlot, elements, nloc, elementDofs, ndofs, pattern, slots, stiffness, mass, symbolic: analyze(pattern), slotArea };
}

/** K = Ky⊗Mz + My⊗Kz and M = My⊗Mz at local index a + n·b (dim 1: Ky and My). */
function localMatrices(Y: Matrix1D, Z: Matrix1D, n: number, dim: 1 | 2, K: Float64Array, M: Float64Array): void {
  if (dim === 1) {
    K.set(Y.kRe);
    M.set(Y.mRe);
    return;
  }
  const nl = n * n;
  for (let b = 0; b < n; b++) for (let a = 0; a < n; a++) for (let b2 = 0; b2 < n; b2++) for (let a2 = 0; a2 < n; a2++) {
    const I = a + n * b, J = a2 + n * b2, y = a * n + a2, z = b * n + b2;
    K[I * nl + J] = Y.kRe[y] * Z.mRe[z] + Y.mRe[y] * Z.kRe[z];
    M[I * nl + J] = Y.mRe[y] * Z.mRe[z];
  }
}

/** CSR pattern of the assembled matrix (both triangles, sorted, diagonal present) and where each element entry lands. */
function assemblePattern(ndofs: number, elementDofs: Int32Array, nloc: number): { pattern: SparsePattern; position: Int32Array } {
  const nel = elementDofs.length / nloc;
  const rows: Set<number>[] = Array.from({ length: ndofs }, () => new Set<number>());
  for (let e = 0; e < nel; e++) for (let a = 0; a < nloc; a++) {
    const r = rows[elementDofs[e * nloc + a]];
    for (let b = 0; b < nloc; b++) r.add(elementDofs[e * nloc + b]);
  }
  const rowPtr = new Int32Array(ndofs + 1);
  for (let i = 0; i < ndofs; i++) rowPtr[i + 1] = rowPtr[i] + rows[i].size;
  const colIdx = new Int32Array(rowPtr[ndofs]);
  for (let i = 0; i < ndofs; i++) colIdx.set(Int32Array.from(rows[i]).sort(), rowPtr[i]);
  const position = new Int32Array(nel * nloc * nloc);
  for (let e = 0; e < nel; e++) for (let a = 0; a < nloc; a++) {
    const row = elementDofs[e * nloc + a];
    for (let b = 0; b < nloc; b++) {
      const col = elementDofs[e * nloc + b];
      let lo = rowPtr[row], hi = rowPtr[row + 1] - 1;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (colIdx[mid] < col) lo = mid + 1; else hi = mid;
      }
      position[(e * nloc + a) * nloc + b] = lo;
    }
  }
  return { pattern: { n: ndofs, rowPtr, colIdx }, position };
}

/** Rows of an interpolation matrix: the value of a field at (ys[q], zs[q]) is Σ w[k]·field[idx[k]], k ∈ [ptr[q], ptr[q+1]); rigid cells give empty rows. */
export interface Interpolation { ptr: Int32Array; idx: Int32Array; w: Float64Array }

function locate(nodes: Float64Array, x: number): number {
  let lo = 0, hi = nodes.length - 2;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (nodes[mid] <= x) lo = mid; else hi = mid - 1;
  }
  return lo;
}

export function interpolation(g: SectionGrid, ys: ArrayLike<number>, zs: ArrayLike<number>): Interpolation {
  const nq = ys.length, p = g.order, n = p + 1, nloc = g.nloc;
  const cellElement = new Int32Array(g.ny * g.nz).fill(-1);
  g.elements.forEach((c, e) => { cellElement[c] = e; });
  const ptr = new Int32Array(nq + 1), idx = new Int32Array(nq * nloc), w = new Float64Array(nq * nloc);
  let k = 0;
  for (let q = 0; q < nq; q++) {
    const y = ys[q], z = g.dim === 1 ? g.zNodes[0] : zs[q];
    const outside = y < g.outer.y0 - TOL || y > g.outer.y1 + TOL || (g.dim === 2 && (z < g.outer.z0 - TOL || z > g.outer.z1 + TOL));
    const i = locate(g.yNodes, y), j = g.dim === 1 ? 0 : locate(g.zNodes, z), e = outside ? -1 : cellElement[i + g.ny * j];
    if (e >= 0) {
      const ty = tabulate(p, [2 * (y - g.yNodes[i]) / (g.yNodes[i + 1] - g.yNodes[i]) - 1]);
      const tz = g.dim === 1 ? null : tabulate(p, [2 * (z - g.zNodes[j]) / (g.zNodes[j + 1] - g.zNodes[j]) - 1]);
      for (let l = 0; l < nloc; l++) {
        const v = ty.values[l % n] * (tz ? tz.values[Math.floor(l / n)] : 1);
        if (v === 0) continue;
        idx[k] = g.elementDofs[e * nloc + l];
        w[k++] = v;
      }
    }
    ptr[q + 1] = k;
  }
  return { ptr, idx: idx.slice(0, k), w: w.slice(0, k) };
}
