/**
 * The sparse direct solve as the physics sees it: one analysis per mesh (nested dissection on the node
 * lattice), one factorisation per frequency in memory kept from the last one, every solution's residual
 * checked (and refined when it is not at round-off or pivots were perturbed), and a singular or
 * ill-conditioned system turned into words about the physics instead of a silent wrong answer.
 */
import { analyze, factor, solve, latticeDissection, SingularSystemError, FactorWorkspace, type Symbolic, type WorkspaceOptions } from '../linalg/index.ts';
import { relativeResidual, zeroVector, type ComplexCsr, type ComplexVector, type SparsePattern } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';

/** A solution is accepted when ‖Ax − b‖/‖b‖ is below this after refinement. */
export const ACCEPTED_RESIDUAL = 1e-8;

export class SolverFailure extends Error {
  constructor(message: string, readonly frequencyHz: number) {
    super(message);
    this.name = 'SolverFailure';
  }
}

export function analyzeMesh(mesh: Mesh, pattern: SparsePattern): Symbolic {
  const perm = latticeDissection(mesh.lattice, mesh.numbering.ndofs);
  return analyze(pattern, perm);
}

export interface LinearStats { factorSeconds: number; solveSeconds: number; perturbedPivots: number; residual: number }

function singular(frequencyHz: number, detail: string): SolverFailure {
  return new SolverFailure(`the system is singular or nearly so at f = ${frequencyHz.toPrecision(6)} Hz: a resonance of a closed, lossless space (${detail}). Move the frequency slightly, or add absorption or an open boundary.`, frequencyHz);
}

/**
 * What one thread keeps from one frequency of a sweep to the next: the matrix values and the factor's
 * memory. A sweep then allocates its large arrays once instead of once per frequency; the matrix and
 * factor of the previous frequency are overwritten, so nothing may hold on to them.
 */
export class SweepMemory {
  readonly factor: FactorWorkspace;
  private values: ComplexVector | null = null;

  /** opts.threads: helper threads for each factorisation (a sweep's last frequencies, or a single one); close() ends them. */
  constructor(symbolic: Symbolic, opts: WorkspaceOptions = {}) {
    this.factor = new FactorWorkspace(symbolic, opts);
  }

  close(): void {
    this.factor.close();
  }

  /** Room for the matrix values (nnzA entries), allocated at the first call; the caller overwrites every entry. */
  matrixValues(): ComplexVector {
    return (this.values ??= zeroVector(this.factor.symbolic.nnzA));
  }
}

/** workspace: the factor's memory, kept between frequencies (SweepMemory.factor); a fresh one by default. */
export function solveAt(A: ComplexCsr, S: Symbolic, b: ComplexVector, frequencyHz: number, now: () => number, workspace = new FactorWorkspace(S)): { x: ComplexVector; stats: LinearStats } {
  const t0 = now();
  let N, x;
  try {
    N = factor(A, S, {}, workspace);
  } catch (e) {
    if (e instanceof SingularSystemError) throw singular(frequencyHz, e.message);
    throw e;
  }
  const t1 = now();
  try {
    x = solve(N, b);
  } catch (e) {
    if (e instanceof SingularSystemError) throw singular(frequencyHz, e.message);
    throw e;
  }
  const residual = relativeResidual(A, x, b);
  if (!(residual <= ACCEPTED_RESIDUAL)) throw singular(frequencyHz, `relative residual ${residual.toExponential(2)} after refinement`);
  return { x, stats: { factorSeconds: (t1 - t0) / 1000, solveSeconds: (now() - t1) / 1000, perturbedPivots: N.perturbed, residual } };
}
