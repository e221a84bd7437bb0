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
import type { FrontDiagonal } from './frontal.ts';
import { createArena, defaultKernel, type FrontArena } from './frontArena.ts';
import type { KernelKind } from './denseKernels.ts';
import { SingularSystemError } from './errors.ts';
import { ParallelState, type HelperThreads } from './parallelFactor.ts';
import { factorFronts, PivotGuard, type PivotRecord } from './fronts.ts';

export type { PivotRecord } from './fronts.ts';

export interface FactorOptions {
  /** |d_j| below pivotTolerance · max_k |A_jk| counts as zero and is perturbed. Default 1e-12. */
  pivotTolerance?: number;
  /** More perturbed pivots than this throw SingularSystemError. Default max(8, n/1000). */
  maxPerturbed?: number;
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
  panels: Float64Array; map: Int32Array; scale: Float64Array; diagonal: FrontDiagonal; arena: FrontArena; parallel: ParallelState | null;
}

export interface WorkspaceOptions {
  /** The dense kernels: 'simd' (WebAssembly, the default where the runtime has it) or 'js'. */
  kernel?: KernelKind;
  /** Helper threads that factor subtrees alongside the caller (parallelFactor.ts); none by default. */
  threads?: HelperThreads;
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
  private readonly threads: HelperThreads | null;
  private arrays: FactorArrays | null = null;

  constructor(readonly symbolic: Symbolic, opts: WorkspaceOptions = {}) {
    this.kernel = opts.kernel ?? defaultKernel();
    this.threads = opts.threads && opts.threads.size > 0 ? opts.threads : null;
  }

  /** The arrays for one more factorisation of A's pattern (allocated once): what an earlier Numeric in it held is invalid from now on. */
  next(A: ComplexCsr): FactorArrays {
    this.generation++;
    return (this.arrays ??= allocate(this.symbolic, A, this.kernel, this.threads));
  }

  /** Ends the helper threads, if any (a workspace without threads needs no closing). */
  close(): void {
    this.arrays?.parallel?.close();
  }
}

function allocate(S: Symbolic, A: ComplexCsr, kernel: KernelKind, threads: HelperThreads | null): FactorArrays {
  if (2 * S.storedEntries > 2 ** 53 || 2 * S.maxFront * S.maxFront > INDEX_LIMIT) {
    throw new RangeError(`factor: fronts of order ${S.maxFront} (${S.storedEntries} factor entries) are too large for this solver`);
  }
  const n = S.n, arena = createArena(S.arena, kernel), map = new Int32Array(n);
  if (threads) {
    const p = new ParallelState(S, A, threads, kernel);
    return { panels: p.panels, map, scale: p.scale, diagonal: p.diagonal, arena, parallel: p };
  }
  return {
    panels: new Float64Array(2 * S.storedEntries), map, scale: new Float64Array(n),
    diagonal: { dRe: new Float64Array(n), dIm: new Float64Array(n), invRe: new Float64Array(n), invIm: new Float64Array(n) },
    arena, parallel: null,
  };
}

/** Factors A in the workspace (by default a fresh one); the result is valid until the next factor() in the same workspace. */
export function factor(A: ComplexCsr, S: Symbolic, opts: FactorOptions = {}, workspace = new FactorWorkspace(S)): Numeric {
  checkPattern(A, S);
  if (workspace.symbolic !== S) throw new RangeError('factor: the workspace was made for another analysis');
  const n = S.n;
  const { panels, map, scale, diagonal, arena, parallel } = workspace.next(A);
  const tolerance = opts.pivotTolerance ?? DEFAULT_PIVOT_TOLERANCE, limit = opts.maxPerturbed ?? Math.max(8, Math.floor(n / 1000));
  const guard = new PivotGuard(S.perm, scale, tolerance, limit);
  if (parallel) {
    const job = { A, S, panels, map, scale, diagonal, arena, guard, handoff: parallel.handoff };
    parallel.start(A, tolerance, limit);
    let mine: unknown = null;
    try {
      factorFronts(job, parallel.plan.lists[0], 0, parallel.plan.lists[0].length);
    } catch (e) {
      mine = e;
    }
    parallel.join(guard); // always: the helpers must be idle before the workspace is used again
    if (mine) throw mine;
    if (guard.count > limit) throw new SingularSystemError({ permuted: guard.minAt, original: S.perm[guard.minAt] }, guard.minMagnitude, scale[guard.minAt], `${guard.count} pivots fell below ${tolerance} of their row's largest entry`);
    factorFronts(job, parallel.plan.top, 0, parallel.plan.top.length);
  } else {
    factorFronts({ A, S, panels, map, scale, diagonal, arena, guard, handoff: null }, null, 0, S.nSuper);
  }
  return { symbolic: S, matrix: A, panels, diagonal, perturbed: guard.count, smallestPivot: guard.smallest(), workspace, generation: workspace.generation, kernel: arena.kernels.kind };
}

function checkPattern(A: ComplexCsr, S: Symbolic): void {
  if (A.n !== S.n || A.rowPtr[A.n] !== S.nnzA) {
    throw new RangeError(`factor: matrix (n = ${A.n}, nnz = ${A.rowPtr[A.n]}) does not match the analysed pattern (n = ${S.n}, nnz = ${S.nnzA})`);
  }
}

