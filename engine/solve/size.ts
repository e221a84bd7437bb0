/**
 * How big a scenario's problem will be, known before any grid is allocated: the elements and dofs
 * from the breakpoints and the grading rule alone. A solve that would be far larger than intended (a
 * length typed in millimetres as metres, a room at 20 kHz) is caught here, with the numbers and the
 * levers, instead of exhausting the machine.
 */
import type { NormalisedScenario } from '../scenario/types.ts';
import type { Geometry } from '../scenario/geometry.ts';
import { maxElementSize } from '../core/grading.ts';
import type { Mesh } from '../grid/mesh.ts';
import type { ReportMeshInfo } from '../report/results.ts';

export interface SizeEstimate {
  elements: number;
  dofs: number;
  maxElementSize: number; // m
}

/** Above this many dofs a run asks first (CLI: --yes); the factor of a 3D problem grows faster than its dofs. */
export const LARGE_PROBLEM_DOFS = 250_000;

export class ProblemTooLarge extends Error {
  constructor(readonly estimate: SizeEstimate, readonly limit: number) {
    super(`the scenario implies about ${Math.round(estimate.dofs).toLocaleString('en')} unknowns (${Math.round(estimate.elements).toLocaleString('en')} elements of up to ${(estimate.maxElementSize * 1000).toFixed(0)} mm), above the ${limit.toLocaleString('en')} that run without asking; ` +
      'check the lengths are in metres, or lower mesh.order, mesh.pointsPerWavelength or the sweep\'s top frequency, or split the sweep; to run it anyway, confirm (CLI: --yes)');
    this.name = 'ProblemTooLarge';
  }
}

export function estimateSize(s: NormalisedScenario, g: Geometry): SizeEstimate {
  const p = s.mesh.order, top = Math.max(...s.sweep.frequenciesHz);
  const hmax = maxElementSize(p, s.air.soundSpeed / top, s.mesh.pointsPerWavelength);
  const breaks = [g.breakpoints.x, g.breakpoints.y, g.breakpoints.z];
  const keys = [['x0', 'x1'], ['y0', 'y1'], ['z0', 'z1']] as const;
  // elements along axis d between a and b, counted the way the grid splits each interval — arithmetic only, so an absurd size costs nothing
  const within = (d: number, a: number, b: number) => {
    let n = 0;
    for (let i = 1; i < breaks[d].length; i++) {
      const lo = breaks[d][i - 1], hi = breaks[d][i];
      if (lo >= a - 1e-9 && hi <= b + 1e-9) n += Math.max(1, Math.ceil((hi - lo) / hmax - 1e-9));
    }
    return n;
  };
  let elements = 0, dofs = 0;
  for (const box of g.boxes) {
    const n = [0, 1, 2].map((d) => within(d, box[keys[d][0]], box[keys[d][1]]));
    elements += n[0] * n[1] * n[2];
    dofs += (n[0] * p + 1) * (n[1] * p + 1) * (n[2] * p + 1);
  }
  // absorbing layers: each opening's cross-section, one element per layer
  for (const o of g.openings) {
    const d = o.side[1] === 'x' ? 0 : o.side[1] === 'y' ? 1 : 2, [a, b] = [0, 1, 2].filter((e) => e !== d);
    const na = within(a, o.rect.a0, o.rect.a1), nb = within(b, o.rect.b0, o.rect.b1);
    elements += na * nb * s.absorber.layers;
    dofs += (na * p + 1) * (nb * p + 1) * s.absorber.layers * p;
  }
  return { elements, dofs, maxElementSize: hmax };
}

/** Bytes of every typed array reachable from a value, each buffer counted once (functions are not entered). */
export function typedArrayBytes(v: unknown, seen = new Set<unknown>()): number {
  if (v === null || typeof v !== 'object' || seen.has(v)) return 0;
  seen.add(v);
  if (ArrayBuffer.isView(v)) {
    if (seen.has(v.buffer)) return 0;
    seen.add(v.buffer);
    return v.buffer.byteLength;
  }
  let sum = 0;
  for (const x of Array.isArray(v) ? v : Object.values(v)) sum += typedArrayBytes(x, seen);
  return sum;
}

/** Complex vectors alive at once in a solve: right-hand side, incident field, solution, residual, correction and the solves' own. */
const SOLVE_VECTORS = 8;

/**
 * What one worker holds at its peak while it solves a frequency: the prepared problem's own arrays (mesh,
 * pattern, scatter map, analysis, coordinates: `preparedBytes`), the matrix values (16 bytes an entry),
 * the factorisation's memory (the symbolic estimate) and the solve's vectors. The runtime itself comes on top.
 */
export function workerMemoryBytes(preparedBytes: number, nnz: number, dofs: number, factorBytes: number): number {
  return preparedBytes + 16 * nnz + factorBytes + SOLVE_VECTORS * 16 * dofs;
}


/** What a problem's mesh and factor cost, from its model's settings, its mesh and its analysis (preparedBytes: the arrays it keeps). */
export function meshInfo(
  model: { order: number; pointsPerWavelength: number; maxFrequencyHz: number; absorber: { kind: string; layers: number } },
  mesh: Mesh, nnz: number, sym: { nnzL: number; flops: number; memoryBytes: number }, preparedBytes: number,
): ReportMeshInfo {
  const dofs = mesh.numbering.ndofs;
  return {
    order: model.order, pointsPerWavelength: model.pointsPerWavelength, topFrequencyHz: model.maxFrequencyHz, absorberKind: model.absorber.kind, layers: model.absorber.layers,
    elements: mesh.elements.length, dofs, nnz, factorNonzeros: sym.nnzL, factorFlops: sym.flops, memoryEstimateBytes: sym.memoryBytes,
    workerMemoryBytes: workerMemoryBytes(preparedBytes, nnz, dofs, sym.memoryBytes),
  };
}
