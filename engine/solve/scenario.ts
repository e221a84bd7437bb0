/**
 * One scenario: from the validated file to a prepared problem (mesh, pattern, analysis: once per
 * geometry) and results per frequency. The mesh is graded for the top frequency of the scenario's whole
 * sweep, never of a subset, so that parts of one sweep solved apart (other machines, other workers) are
 * the same computation and their results can be merged.
 */
import type { NormalisedScenario, WallKey } from '../scenario/types.ts';
import { buildGeometry, type Geometry } from '../scenario/geometry.ts';
import { liningMedia } from '../scenario/linings.ts';
import { cutOnFrequencies, type DuctMode } from '../acoustics/index.ts';
import type { ComplexCsr, ComplexVector } from '../linalg/sparse.ts';
import { crossSectionOf, wallSide } from '../core/space.ts';
import { surfaceAdmittance } from '../assembly/boundary.ts';
import { ductResults, ductSystem, prepareDuct, solveDuctAt, type DuctPoint, type DuctPrepared } from './duct.ts';
import { prepareRoom, roomResults, roomSystem, solveRoomAt, type RoomPoint, type RoomPrepared } from './room.ts';
import type { Mesh } from '../grid/mesh.ts';
import type { ReportMeshInfo } from '../report/results.ts';
import type { PointAccuracy } from './accuracy.ts';
import { estimateSize, LARGE_PROBLEM_DOFS, ProblemTooLarge, typedArrayBytes, workerMemoryBytes } from './size.ts';

/** What the mesh and its factor cost, as reports print it (the report layer owns the shape). */
export type MeshInfo = ReportMeshInfo;

export type Prepared =
  | { kind: 'duct'; scenario: NormalisedScenario; geometry: Geometry; duct: DuctPrepared; info: MeshInfo }
  | { kind: 'room'; scenario: NormalisedScenario; geometry: Geometry; room: RoomPrepared; info: MeshInfo };

/** accuracy: the figures that need no other solve, when the thread that solved the point added them (engine/solve/accuracy.ts). */
export type PointResult = (({ kind: 'duct' } & DuctPoint) | ({ kind: 'room' } & RoomPoint)) & { accuracy?: PointAccuracy };

export interface PrepareOptions {
  /** Refuse (ProblemTooLarge) above this many estimated dofs; Infinity when the user confirmed a large run. */
  maxDofs?: number;
}

export function prepareScenario(s: NormalisedScenario, opts: PrepareOptions = {}): Prepared {
  const geometry = buildGeometry(s), top = Math.max(...s.sweep.frequenciesHz);
  const size = estimateSize(s, geometry), limit = opts.maxDofs ?? LARGE_PROBLEM_DOFS;
  if (!(size.dofs <= limit)) throw new ProblemTooLarge(size, limit);
  const common = {
    soundSpeed: s.air.soundSpeed, density: s.air.density, order: s.mesh.order, pointsPerWavelength: s.mesh.pointsPerWavelength,
    maxFrequencyHz: top, absorber: { kind: s.absorber.kind, layers: s.absorber.layers, thickness: s.absorber.thickness ?? undefined },
  };
  if (s.kind === 'duct') {
    const ports = geometry.duct!, t = ports.outlet.termination, rhoC = s.air.density * s.air.soundSpeed;
    const term = typeof t === 'string' ? t : { admittance: surfaceAdmittance(t, rhoC) };
    const duct = prepareDuct({
      ...common, boxes: geometry.boxes, openings: geometry.openings, media: liningMedia(geometry, s.air),
      inlet: { x: ports.inlet.x, rect: crossSectionOf(ports.inlet.rect), clearTo: ports.inlet.clearTo },
      outlet: { x: ports.outlet.x, rect: crossSectionOf(ports.outlet.rect), clearFrom: ports.outlet.clearFrom, termination: term },
      incident: { mode: s.duct.incident.mode, amplitude: s.duct.incident.amplitudePa },
    });
    return { kind: 'duct', scenario: s, geometry, duct, info: info(s, duct.mesh, duct.assembly.pattern.colIdx.length, duct.symbolic, top, typedArrayBytes(duct)) };
  }
  const layout = geometry.room!, rhoC = s.air.density * s.air.soundSpeed;
  const walls = Object.entries(layout.walls);
  const room = prepareRoom({
    ...common, box: geometry.bounds,
    open: walls.filter(([, w]) => w === 'open').map(([k]) => wallSide(k as WallKey)),
    surfaces: walls.filter(([, w]) => typeof w === 'object').map(([k, w]) => ({ side: wallSide(k as WallKey), admittance: surfaceAdmittance(w as { absorption: number } | { impedance: [number, number] }, rhoC) })),
    sources: layout.sources, receivers: layout.receivers,
  });
  return { kind: 'room', scenario: s, geometry, room, info: info(s, room.mesh, room.assembly.pattern.colIdx.length, room.symbolic, top, typedArrayBytes(room)) };
}

/** preparedBytes: the typed arrays the prepared problem keeps (its sweep memory is not allocated yet). */
function info(s: NormalisedScenario, mesh: Mesh, nnz: number, sym: { nnzL: number; flops: number; memoryBytes: number }, top: number, preparedBytes: number): MeshInfo {
  const dofs = mesh.numbering.ndofs;
  return {
    order: s.mesh.order, pointsPerWavelength: s.mesh.pointsPerWavelength, topFrequencyHz: top, absorberKind: s.absorber.kind, layers: s.absorber.layers,
    elements: mesh.elements.length, dofs, nnz, factorNonzeros: sym.nnzL, factorFlops: sym.flops, memoryEstimateBytes: sym.memoryBytes,
    workerMemoryBytes: workerMemoryBytes(preparedBytes, nnz, dofs, sym.memoryBytes),
  };
}

export function meshOf(p: Prepared): Mesh {
  return p.kind === 'duct' ? p.duct.mesh : p.room.mesh;
}

export function solvePoint(p: Prepared, frequencyHz: number, now: () => number, keepField = false): PointResult {
  return p.kind === 'duct' ? { kind: 'duct', ...solveDuctAt(p.duct, frequencyHz, now, keepField) } : { kind: 'room', ...solveRoomAt(p.room, frequencyHz, now, keepField) };
}

/** The assembled system at one frequency, for an external solver. */
export function systemAt(p: Prepared, frequencyHz: number): { A: ComplexCsr; b: ComplexVector } {
  return p.kind === 'duct' ? ductSystem(p.duct, frequencyHz) : roomSystem(p.room, frequencyHz);
}

/** Results from a solution vector computed elsewhere (an external solver's answer to `systemAt`). */
export function resultsFromSolution(p: Prepared, frequencyHz: number, u: ComplexVector): PointResult {
  const stats = { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, assembleSeconds: 0, residual: NaN }; // solved elsewhere
  if (p.kind === 'duct') return { kind: 'duct', ...ductResults(p.duct, frequencyHz, u), stats };
  return { kind: 'room', frequencyHz, receivers: roomResults(p.room, frequencyHz, u), stats };
}

/** Cut-on frequencies of every duct section up to a limit (Morse & Ingard, Theoretical Acoustics, 1968). */
export function sectionCutOns(p: Prepared, maxHz: number): { section: string; modes: DuctMode[] }[] {
  if (p.kind !== 'duct') return [];
  const c = p.scenario.air.soundSpeed;
  return p.geometry.duct!.sections.map((s) => ({ section: s.name, modes: cutOnFrequencies(s.width, s.height, c, maxHz).slice(0, 6) }));
}
