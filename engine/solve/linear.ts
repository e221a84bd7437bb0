/**
 * The sparse direct solve as the physics sees it: one analysis per mesh (nested dissection on the node
 * lattice), one factorisation per frequency, and a singular pivot turned into words about the physics.
 */
import { analyze, factor, solveRefined, latticeDissection, SingularSystemError, type Symbolic } from '../linalg/index.ts';
import type { ComplexCsr, ComplexVector, SparsePattern } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';

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

export interface LinearStats { factorSeconds: number; solveSeconds: number; perturbedPivots: number }

export function solveAt(A: ComplexCsr, S: Symbolic, b: ComplexVector, frequencyHz: number, now: () => number): { x: ComplexVector; stats: LinearStats } {
  const t0 = now();
  let N;
  try {
    N = factor(A, S);
  } catch (e) {
    if (e instanceof SingularSystemError) {
      throw new SolverFailure(`the system is singular or nearly so at f = ${frequencyHz.toPrecision(6)} Hz: a resonance of a closed, lossless space (${e.message}). Move the frequency slightly, or add absorption or an open boundary.`, frequencyHz);
    }
    throw e;
  }
  const t1 = now();
  const x = solveRefined(A, N, b, N.perturbed > 0 ? 2 : 0);
  return { x, stats: { factorSeconds: (t1 - t0) / 1000, solveSeconds: (now() - t1) / 1000, perturbedPivots: N.perturbed } };
}
