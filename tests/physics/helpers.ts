import { buildGrid, type GridSpec } from '../../engine/grid/grid.ts';
import { buildMesh, type Mesh } from '../../engine/grid/mesh.ts';
import { symbolicAssembly, type AssemblyPattern } from '../../engine/assembly/assemble.ts';
import { analyzeMesh, solveAt } from '../../engine/solve/linear.ts';
import type { ComplexCsr, ComplexVector } from '../../engine/linalg/sparse.ts';
import type { Symbolic } from '../../engine/linalg/index.ts';

export interface Problem { mesh: Mesh; assembly: AssemblyPattern; symbolic: Symbolic }

export function problem(spec: GridSpec): Problem {
  const mesh = buildMesh(buildGrid(spec)), assembly = symbolicAssembly(mesh);
  return { mesh, assembly, symbolic: analyzeMesh(mesh, assembly.pattern) };
}

export function solve(pb: Problem, A: ComplexCsr, b: ComplexVector, f = 0): ComplexVector {
  return solveAt(A, pb.symbolic, b, f, () => performance.now()).x;
}

export const hypot = (z: { re: number; im: number }) => Math.hypot(z.re, z.im);
