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
import { createArena, defaultKernel, type FrontArena } from './frontArena.ts';
import type { KernelKind } from './denseKernels.ts';
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
  panels: Float64Array; // 2 · storedEntries: supernode panels, row-major F × ns each (row i: L[i, 0..ns), D on the diagonal, strict upper part zero)
  diagonal: FrontDiagonal; // D and 1/D in the factor's numbering
  perturbed: number; // pivots replaced under the tolerance
  smallestPivot: PivotRecord | null; // the pivot smallest relative to its row scale (null when n = 0)
  workspace: FactorWorkspace; // where panels and diagonal live
  generation: number; // the workspace's count when this factor was made: a later factor() in it overwrites this one
  kernel: KernelKind; // the dense kernels that computed it
}

export const DEFAULT_PIVOT_TOLERANCE = 1e-12;
/** Offsets into the panels are Int32-safe doubles in the solves. */
const INDEX_LIMIT = 0x7fffffff;

interface FactorArrays {
  panels: Float64Array; map: Int32Array; scale: Float64Array; diagonal: FrontDiagonal; arena: FrontArena;
}

export interface WorkspaceOptions {
  /** The dense kernels: 'simd' (WebAssembly, the default where the runtime has it) or 'js'. */
  kernel?: KernelKind;
}

/**
 * The memory of a factorisation, kept for the next one of the same pattern. A sweep factors one pattern
 * at every frequency: fresh arrays each time cost page faults, and worker threads sharing one address
 * space then slow each other (bench/RESULTS.md, section 4). Allocated by the first factor() that uses it;
 * each factor() in it overwrites the previous one's panels and diagonal.
 */
export class FactorWorkspace {
  generation = 0;
  readonly kernel: KernelKind;
  private arrays: FactorArrays | null = null;

  constructor(readonly symbolic: Symbolic, opts: WorkspaceOptions = {}) {
    this.kernel = opts.kernel ?? defaultKernel();
  }

  /** The arrays for one more factorisation (allocated once): what an earlier Numeric in it held is invalid from now on. */
  next(): FactorArrays {
    this.generation++;
    return (this.arrays ??= allocate(this.symbolic, this.kernel));
  }
}

function allocate(S: Symbolic, kernel: KernelKind): FactorArrays {
  if (2 * S.storedEntries > 2 ** 53 || 2 * S.maxFront * S.maxFront > INDEX_LIMIT) {
    throw new RangeError(`factor: fronts of order ${S.maxFront} (${S.storedEntries} factor entries) are too large for this solver`);
  }
  const n = S.n;
  return {
    panels: new Float64Array(2 * S.storedEntries), map: new Int32Array(n), scale: new Float64Array(n),
    diagonal: { dRe: new Float64Array(n), dIm: new Float64Array(n), invRe: new Float64Array(n), invIm: new Float64Array(n) },
    arena: createArena(S.arena, kernel),
  };
}

/** Factors A in the workspace (by default a fresh one); the result is valid until the next factor() in the same workspace. */
export function factor(A: ComplexCsr, S: Symbolic, opts: FactorOptions = {}, workspace = new FactorWorkspace(S)): Numeric {
  checkPattern(A, S);
  if (workspace.symbolic !== S) throw new RangeError('factor: the workspace was made for another analysis');
  const n = S.n;
  const { panels, map, scale, diagonal, arena } = workspace.next();
  const guard = new PivotGuard(S, scale, opts.pivotTolerance ?? DEFAULT_PIVOT_TOLERANCE, opts.maxPerturbed ?? Math.max(8, Math.floor(n / 1000)));
  const { superStart, rowPtr, rowIdx, childPtr, child, panelPtr } = S;
  const M = arena.f64, I = arena.i32, L = arena.layout, K = arena.kernels, fo = L.front;
  let top = 0; // doubles in use on the stack
  for (let s = 0; s < S.nSuper; s++) {
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
      base -= mc * (mc + 1);
    }
    let src = base;
    for (let c = childPtr[s]; c < childPtr[s + 1]; c++) {
      const ch = child[c], rs = rowPtr[ch], mc = rowPtr[ch + 1] - rs;
      for (let a = 0; a < mc; a++) I[L.rel + a] = map[rowIdx[rs + a]];
      K.extendAdd(L.stack + src, L.rel, mc, fo, fs);
      src += mc * (mc + 1);
    }
    factorFront(arena, F, ns, first, diagonal, guard);
    const off = 2 * panelPtr[s];
    for (let i = 0; i < F; i++) panels.set(M.subarray(fo + i * fs, fo + i * fs + 2 * Math.min(i + 1, ns)), off + 2 * i * ns);
    for (let a = 0; a < m; a++) {
      const from = fo + (ns + a) * fs + 2 * ns;
      M.copyWithin(L.stack + base + a * (a + 1), from, from + 2 * (a + 1));
    }
    top = base + m * (m + 1);
  }
  return { symbolic: S, matrix: A, panels, diagonal, perturbed: guard.count, smallestPivot: guard.smallest(), workspace, generation: workspace.generation, kernel: arena.kernels.kind };
}

function checkPattern(A: ComplexCsr, S: Symbolic): void {
  if (A.n !== S.n || A.rowPtr[A.n] !== S.nnzA) {
    throw new RangeError(`factor: matrix (n = ${A.n}, nnz = ${A.rowPtr[A.n]}) does not match the analysed pattern (n = ${S.n}, nnz = ${S.nnzA})`);
  }
}

/** Scatters the lower part (in the factor's order) of A's rows for the front's pivot columns into the front (row stride fs); records row scales. */
function assembleColumns(A: ComplexCsr, S: Symbolic, first: number, ns: number, map: Int32Array, M: Float64Array, fo: number, fs: number, scale: Float64Array): void {
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
