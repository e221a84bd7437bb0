/**
 * The numeric sweep over fronts, shared by the sequential factorisation (factor.ts) and each thread of
 * the parallel one (parallelFactor.ts): assemble a front from A and its children's update matrices
 * (extend-add), factor it in the arena, copy its panel out to the factor, push its update matrix.
 */
import type { ComplexCsr } from './sparse.ts';
import type { Symbolic } from './symbolic.ts';
import { factorFront, type FrontDiagonal, type PivotPolicy } from './frontal.ts';
import type { FrontArena } from './frontArena.ts';
import { NonFiniteMatrixError, SingularSystemError } from './errors.ts';

export interface PivotRecord {
  permuted: number;
  original: number;
  magnitude: number; // |d| as computed, before any perturbation
  scale: number; // max |A_jk| of its original row
}

/** The parts of the analysis the numeric sweep reads (plain typed arrays: threads receive them in shared memory). */
export type FrontStructure = Pick<Symbolic, 'n' | 'nSuper' | 'perm' | 'pinv' | 'superStart' | 'rowPtr' | 'rowIdx' | 'childPtr' | 'child' | 'panelPtr'>;

/** Update matrices that cross threads: a subtree root computed by one thread leaves its update matrix here for its parent's. */
export interface Handoff {
  at: Float64Array; // nSuper: offset (doubles) of s's update matrix in buf, −1 where it goes on the computing thread's stack
  buf: Float64Array; // Σ over the roots handed off of m(m+1): their packed lower triangles
}

/** Everything one thread needs to factor a sequence of fronts. */
export interface FrontJob {
  A: ComplexCsr; S: FrontStructure; panels: Float64Array; map: Int32Array; scale: Float64Array; diagonal: FrontDiagonal; arena: FrontArena;
  guard: PivotPolicy; handoff: Handoff | null;
}

/**
 * Assembles, factors and stores the fronts list[from..to) (or the supernodes from..to-1 when list is null) in that order, which
 * must put every child before its parent: the update matrices of children computed here are on this arena's stack in
 * postorder, those of children computed by another thread in the handoff.
 */
export function factorFronts(job: FrontJob, list: Int32Array | null, from: number, to: number): void {
  const { A, S, panels, map, scale, diagonal, arena, guard, handoff } = job;
  const { superStart, rowPtr, rowIdx, childPtr, child, panelPtr } = S;
  const M = arena.f64, I = arena.i32, L = arena.layout, K = arena.kernels, fo = L.front;
  const away = (c: number): boolean => handoff !== null && handoff.at[c] >= 0;
  let top = 0; // doubles in use on the stack
  for (let q = from; q < to; q++) {
    const s = list === null ? q : list[q];
    const first = superStart[s], ns = superStart[s + 1] - first;
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, F = ns + m, fs = 2 * F;
    for (let t = 0; t < ns; t++) map[first + t] = t;
    for (let t = 0; t < m; t++) map[rowIdx[r0 + t]] = ns + t;
    // the lower triangle, the pivot block whole and one more column below it: every entry the kernels write, so no value outlives its front
    for (let i = 0; i < F; i++) M.fill(0, fo + i * fs, fo + i * fs + 2 * Math.min(F, i < ns ? ns : i + 2));
    assembleColumns(A, S, first, ns, map, M, fo, fs, scale);
    let base = top;
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const mc = rowPtr[child[c] + 1] - rowPtr[child[c]];
      if (!away(child[c])) base -= mc * (mc + 1);
    }
    let src = base;
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const ch = child[c], rs = rowPtr[ch], mc = rowPtr[ch + 1] - rs;
      for (let a = 0; a < mc; a++) I[L.rel + a] = map[rowIdx[rs + a]];
      if (away(ch)) {
        // above the stack's top: the stack of this thread never holds this child's matrix and its siblings' together
        const h = handoff!.at[ch];
        M.set(handoff!.buf.subarray(h, h + mc * (mc + 1)), L.stack + top);
        K.extendAdd(L.stack + top, L.rel, mc, fo, fs);
      } else {
        K.extendAdd(L.stack + src, L.rel, mc, fo, fs);
        src += mc * (mc + 1);
      }
    }
    factorFront(arena, F, ns, first, diagonal, guard);
    const off = 2 * panelPtr[s];
    // entry by entry: a subarray per row costs more than its copy (most rows are short)
    for (let i = 0; i < F; i++) {
      const r = fo + i * fs, d = off + 2 * i * ns, len = 2 * Math.min(i + 1, ns);
      for (let q = 0; q < len; q++) panels[d + q] = M[r + q];
    }
    for (let a = 0; a < m; a++) {
      const from = fo + (ns + a) * fs + 2 * ns;
      const dest = away(s) ? handoff!.buf : M, to = away(s) ? handoff!.at[s] + a * (a + 1) : L.stack + base + a * (a + 1);
      for (let q = 0; q < 2 * (a + 1); q++) dest[to + q] = M[from + q];
    }
    top = away(s) ? base : base + m * (m + 1);
  }
}

/** Scatters the lower part (in the factor's order) of A's rows for the front's pivot columns into the front (row stride fs); records row scales. */
function assembleColumns(A: ComplexCsr, S: FrontStructure, first: number, ns: number, map: Int32Array, M: Float64Array, fo: number, fs: number, scale: Float64Array): void {
  const { rowPtr, colIdx, re, im } = A;
  const { perm, pinv } = S;
  for (let jl = 0; jl < ns; jl++) {
    const j = first + jl, row = perm[j];
    let amax = 0;
    for (let k = rowPtr[row]; k < rowPtr[row + 1]; k++) {
      const vr = re[k], vi = im[k];
      if (vr - vr !== 0 || vi - vi !== 0) throw new NonFiniteMatrixError(row, colIdx[k]);
      const mag2 = vr * vr + vi * vi;
      if (mag2 > amax) amax = mag2;
      const i = pinv[colIdx[k]];
      if (i < j) continue;
      const q = fo + map[i] * fs + 2 * jl;
      M[q] += vr;
      M[q + 1] += vi;
    }
    scale[j] = Math.sqrt(amax);
  }
}

/** Pivot guard: zero or non-finite pivots throw; tiny ones are perturbed (keeping their phase) and counted. */
export class PivotGuard implements PivotPolicy {
  count = 0;
  minRatio = Infinity; // smallest |d| / scale seen
  minAt = -1;
  minMagnitude = 0;

  constructor(
    private readonly perm: Int32Array,
    private readonly scale: Float64Array,
    private readonly tolerance: number,
    private readonly limit: number,
  ) {}

  accept(j: number, dr: number, di: number, out: Float64Array): void {
    const mag = Math.sqrt(dr * dr + di * di);
    const scale = this.scale[j];
    if (!(mag > 0) || mag === Infinity) throw new SingularSystemError(this.where(j), mag, scale);
    if (mag / scale < this.minRatio) {
      this.minRatio = mag / scale;
      this.minAt = j;
      this.minMagnitude = mag;
    }
    const floor = this.tolerance * scale;
    if (mag < floor) {
      this.count++;
      if (this.count > this.limit) {
        throw new SingularSystemError(this.where(j), mag, scale, `${this.count} pivots fell below ${this.tolerance} of their row's largest entry`);
      }
      dr *= floor / mag;
      di *= floor / mag;
    }
    out[0] = dr;
    out[1] = di;
  }

  smallest(): PivotRecord | null {
    if (this.minAt === -1) return null;
    return { ...this.where(this.minAt), magnitude: this.minMagnitude, scale: this.scale[this.minAt] };
  }

  private where(j: number): { permuted: number; original: number } {
    return { permuted: j, original: this.perm[j] };
  }
}
