/** Sparse direct solver for complex symmetric systems: analyse once per pattern, factor per frequency. */
export { analyze, type Symbolic } from './symbolic.ts';
export { factor, FactorWorkspace, DEFAULT_PIVOT_TOLERANCE, type Numeric, type FactorOptions, type PivotRecord, type WorkspaceOptions } from './factor.ts';
export { defaultKernel, setDefaultKernel } from './frontArena.ts';
export { serveFactorHelper, type HelperThreads, type HelperSetup } from './parallelFactor.ts';
export { planParallel, type ParallelPlan } from './parallelPlan.ts';
export { simdAvailable } from './simdKernels.ts';
export type { KernelKind } from './denseKernels.ts';
export { solve, solveRefined, solveMany, REFINED_RESIDUAL_LIMIT } from './solve.ts';
export { minimumDegree } from './ordering.ts';
export { latticeDissection, type NodeLattice, type DissectionOptions } from './dissection.ts';
export { eliminationTree, postorder } from './etree.ts';
export { columnCounts } from './colCounts.ts';
export { assertPermutation, invertPermutation, identityPermutation } from './permutation.ts';
export { SingularSystemError, NonFiniteMatrixError, type PivotLocation } from './errors.ts';
export { readMatrixMarket, readMatrixMarketVector, writeMatrixMarket, writeMatrixMarketVector, matrixMarketChunks } from './matrixMarket.ts';
export * from './sparse.ts';
