/**
 * Numeric supernodal multifrontal LDLᵀ of a complex symmetric matrix (A = Aᵀ, no conjugation),
 * without pivoting: the order comes from analyze(). Each supernode assembles its front from the
 * entries of A and its children's update matrices (extend-add), factors it densely, and pushes its
 * own update matrix on a stack that, in postorder, always holds the children of the next front on
 * top. Duff & Reid, ACM TOMS 9(3):302–325 (1983); Liu, SIAM Review 34(1):82–109 (1992).
 *
 * Tiny pivots are replaced by a pivot of the threshold's size with the same phase and counted
 * (static pivoting with iterative refinement afterwards: Li & Demmel, "Making sparse Gaussian
 * elimination scalable by static pivoting", Proc. ACM/IEEE SC98, 1998).
 */
import type { ComplexCsr } from './sparse.ts';
import type { Symbolic } from './symbolic.ts';
import { factorFront, type FrontDiagonal, type PivotPolicy } from './frontal.ts';
import { NonFiniteMatrixError, SingularSystemError } from './errors.ts';

export interface FactorOptions {
  /** |d_j| below pivotTolerance · max_k |A_jk| counts as zero and is perturbed. Default 1e-12. */
  pivotTolerance?: number;
  /** More perturbed pivots than this throw SingularSystemError. Default max(8, n/1000). */
  maxPerturbed?: number;
}

export interface PivotRecord {
  permuted: number;
  original: number;
  magnitude: number; // |d| as computed, before any perturbation
  scale: number; // max |A_jk| of its original row
}

export interface Numeric {
  symbolic: Symbolic;
  matrix: ComplexCsr; // the matrix factored, kept (not copied) for the residual check and refinement: leave its values alone while N is in use
  panels: Float64Array; // 2 · storedEntries: supernode panels, see frontal.ts for their layout
  diagonal: FrontDiagonal; // D and 1/D in the factor's numbering
  perturbed: number; // pivots replaced under the tolerance
  smallestPivot: PivotRecord | null; // the pivot smallest relative to its row scale (null when n = 0)
  workspace: FactorWorkspace; // where panels and diagonal live
  generation: number; // the workspace's count when this factor was made: a later factor() in it overwrites this one
}

export const DEFAULT_PIVOT_TOLERANCE = 1e-12;
/** Offsets into the panel and stack arrays are Int32 in the kernels. */
const INDEX_LIMIT = 0x7fffffff;

interface FactorArrays {
  panels: Float64Array; stack: Float64Array; work: Float64Array; map: Int32Array; rel: Int32Array; rowStart: Int32Array; scale: Float64Array; diagonal: FrontDiagonal;
}

/**
 * The memory of a factorisation, kept for the next one of the same pattern. A sweep factors one pattern
 * at every frequency: fresh arrays each time cost page faults, and worker threads sharing one address
 * space then slow each other (bench/RESULTS.md, section 4). Allocated by the first factor() that uses it;
 * each factor() in it overwrites the previous one's panels and diagonal.
 */
export class FactorWorkspace {
  generation = 0;
  private arrays: FactorArrays | null = null;

  constructor(readonly symbolic: Symbolic) {}

  /** The arrays for one more factorisation (allocated once): what an earlier Numeric in it held is invalid from now on. */
  next(): FactorArrays {
    this.generation++;
    return (this.arrays ??= allocate(this.symbolic));
  }
}

function allocate(S: Symbolic): FactorArrays {
  if (2 * Math.max(S.storedEntries, S.stackPeak) > INDEX_LIMIT) {
    throw new RangeError(`factor: ${S.storedEntries} factor entries exceed what 32-bit offsets address; the problem is too large for this solver`);
  }
  const n = S.n;
  return {
    panels: new Float64Array(2 * S.storedEntries), stack: new Float64Array(2 * S.stackPeak), work: new Float64Array(2 * S.workEntries),
    map: new Int32Array(n), rel: new Int32Array(S.maxFront), rowStart: new Int32Array(S.maxFront), scale: new Float64Array(n),
    diagonal: { dRe: new Float64Array(n), dIm: new Float64Array(n), invRe: new Float64Array(n), invIm: new Float64Array(n) },
  };
}

/** Factors A in the workspace (by default a fresh one); the result is valid until the next factor() in the same workspace. */
export function factor(A: ComplexCsr, S: Symbolic, opts: FactorOptions = {}, workspace = new FactorWorkspace(S)): Numeric {
  checkPattern(A, S);
  if (workspace.symbolic !== S) throw new RangeError('factor: the workspace was made for another analysis');
  const n = S.n;
  const { panels, stack, work, map, rel, rowStart, scale, diagonal } = workspace.next();
  const guard = new PivotGuard(S, scale, opts.pivotTolerance ?? DEFAULT_PIVOT_TOLERANCE, opts.maxPerturbed ?? Math.max(8, Math.floor(n / 1000)));
  const { superStart, rowPtr, rowIdx, childPtr, child, panelPtr } = S;
  let top = 0; // doubles in use on the stack
  for (let s = 0; s < S.nSuper; s++) {
    const first = superStart[s], ns = superStart[s + 1] - first;
    const r0 = rowPtr[s], m = rowPtr[s + 1] - r0, F = ns + m;
    const off = 2 * panelPtr[s];
    for (let t = 0; t < ns; t++) map[first + t] = t;
    for (let t = 0; t < m; t++) map[rowIdx[r0 + t]] = ns + t;
    const cOff = top, cLen = m * (m + 1);
    stack.fill(0, cOff, cOff + cLen);
    panels.fill(0, off, off + 2 * F * ns); // a reused workspace holds the previous factor here
    assembleColumns(A, S, first, ns, map, panels, off, scale);
    let base = cOff;
    for (let c = childPtr[s + 1] - 1; c >= childPtr[s]; c--) {
      const mc = rowPtr[child[c] + 1] - rowPtr[child[c]];
      base -= mc * (mc + 1);
    }
    let src = base;
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const ch = child[c];
      const mc = rowPtr[ch + 1] - rowPtr[ch];
      extendAdd(stack, src, rowIdx, rowPtr[ch], mc, map, rel, panels, off, ns, cOff);
      src += mc * (mc + 1);
    }
    factorFront(panels, off, F, ns, stack, cOff, work, first, diagonal, guard, rowStart);
    stack.copyWithin(base, cOff, cOff + cLen);
    top = base + cLen;
  }
  return { symbolic: S, matrix: A, panels, diagonal, perturbed: guard.count, smallestPivot: guard.smallest(), workspace, generation: workspace.generation };
}

function checkPattern(A: ComplexCsr, S: Symbolic): void {
  if (A.n !== S.n || A.rowPtr[A.n] !== S.nnzA) {
    throw new RangeError(`factor: matrix (n = ${A.n}, nnz = ${A.rowPtr[A.n]}) does not match the analysed pattern (n = ${S.n}, nnz = ${S.nnzA})`);
  }
}

/** Scatters the lower part (in the factor's order) of A's rows for the front's pivot columns; records row scales. */
function assembleColumns(A: ComplexCsr, S: Symbolic, first: number, ns: number, map: Int32Array, P: Float64Array, off: number, scale: Float64Array): void {
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
      const q = off + 2 * (map[i] * ns + jl);
      P[q] += vr;
      P[q + 1] += vi;
    }
    scale[j] = Math.sqrt(amax);
  }
}

/** Adds a child's packed update matrix into the parent's panel (rows/columns among its pivots) and update matrix. */
function extendAdd(
  stack: Float64Array, src: number, rowIdx: Int32Array, rs: number, mc: number, map: Int32Array,
  rel: Int32Array, P: Float64Array, off: number, ns: number, cOff: number,
): void {
  let q = 0; // child rows that land among the parent's pivot columns come first (rows are sorted)
  for (let a = 0; a < mc; a++) {
    rel[a] = map[rowIdx[rs + a]];
    if (rel[a] < ns) q++;
  }
  for (let a = 0; a < mc; a++) {
    const pa = rel[a];
    const pRow = off + 2 * pa * ns;
    const lim = a < q ? a + 1 : q;
    for (let b = 0; b < lim; b++) {
      const d = pRow + 2 * rel[b];
      P[d] += stack[src];
      P[d + 1] += stack[src + 1];
      src += 2;
    }
    if (a < q) continue;
    const cRow = cOff + (pa - ns) * (pa - ns + 1) - 2 * ns;
    for (let b = q; b <= a; b++) {
      const d = cRow + 2 * rel[b];
      stack[d] += stack[src];
      stack[d + 1] += stack[src + 1];
      src += 2;
    }
  }
}

/** Pivot guard: zero or non-finite pivots throw; tiny ones are perturbed (keeping their phase) and counted. */
class PivotGuard implements PivotPolicy {
  count = 0;
  private minRatio = Infinity; // smallest |d| / scale seen
  private minAt = -1;
  private minMagnitude = 0;

  constructor(
    private readonly S: Symbolic,
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
    return { permuted: j, original: this.S.perm[j] };
  }
}
