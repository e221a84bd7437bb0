/**
 * A room (or any box of air) with rigid, open or locally reacting walls, driven by point sources of
 * given volume velocity; the result is the pressure at each receiver. Open walls carry absorbing layers
 * on their face, with edge and corner layers where open walls meet.
 */
import { buildGrid, type GridOpening } from '../grid/grid.ts';
import type { Complex } from '../core/complex.ts';
import { faceRect, maxElementSize, splDb, type Box, type Side } from '../core/index.ts';
import { buildMesh, type Mesh } from '../grid/mesh.ts';
import { assembleHelmholtz, symbolicAssembly, uniformMaterials, type AssemblyPattern, type Materials } from '../assembly/assemble.ts';
import { layerStretches, type AbsorberKind } from '../assembly/layers.ts';
import { addSurfaceAdmittance, boundaryFaces, type SurfaceFace } from '../assembly/boundary.ts';
import { addPointLoad, evaluateAt } from '../assembly/sources.ts';
import { zeroVector, type ComplexCsr, type ComplexVector } from '../linalg/sparse.ts';
import { analyzeMesh, solveAt, SweepMemory, type LinearStats } from './linear.ts';
import type { Symbolic } from '../linalg/index.ts';

export interface RoomModel {
  box: Box;
  open: Side[];
  surfaces: { side: Side; admittance: Complex }[]; // per unit of 1/Z_s
  sources: { name: string; position: [number, number, number]; volumeVelocity: number }[];
  receivers: { name: string; position: [number, number, number] }[];
  soundSpeed: number;
  density: number;
  order: number;
  pointsPerWavelength: number;
  maxFrequencyHz: number;
  absorber: { kind: AbsorberKind; layers: number; thickness?: number };
}

export interface RoomPrepared { model: RoomModel; mesh: Mesh; assembly: AssemblyPattern; symbolic: Symbolic; memory: SweepMemory; materials: Materials; faces: SurfaceFace[] }

export interface RoomPoint {
  frequencyHz: number;
  receivers: { name: string; pressure: Complex; splDb: number }[];
  stats: LinearStats & { assembleSeconds: number };
  field?: ComplexVector;
}

export function prepareRoom(model: RoomModel): RoomPrepared {
  const b = model.box;
  const openings: GridOpening[] = model.open.map((side) => ({ side, rect: faceRect(b, side) }));
  const lambda = model.soundSpeed / model.maxFrequencyHz;
  const grid = buildGrid({
    order: model.order, boxes: [b], openings, maxElementSize: maxElementSize(model.order, lambda, model.pointsPerWavelength),
    layerCount: model.absorber.layers, layerThickness: model.absorber.thickness !== undefined ? model.absorber.thickness / model.absorber.layers : undefined,
  });
  const mesh = buildMesh(grid), assembly = symbolicAssembly(mesh);
  const faces: SurfaceFace[] = model.surfaces.flatMap((s) => boundaryFaces(mesh, s.side, () => true).map((f) => ({ ...f, admittance: s.admittance })));
  const materials = uniformMaterials(mesh.elements.length, model.density, model.density * model.soundSpeed ** 2);
  const symbolic = analyzeMesh(mesh, assembly.pattern);
  return { model, mesh, assembly, symbolic, memory: new SweepMemory(symbolic), materials, faces };
}

/** values: where A's values go (default fresh arrays). */
export function roomSystem(prep: RoomPrepared, frequencyHz: number, values?: ComplexVector): { A: ComplexCsr; b: ComplexVector } {
  const { model, mesh } = prep, omega = 2 * Math.PI * frequencyHz, k = omega / model.soundSpeed;
  const A = assembleHelmholtz(mesh, prep.assembly, omega, layerStretches(mesh.grid, k, { kind: model.absorber.kind }), prep.materials, values);
  addSurfaceAdmittance(A, mesh, prep.assembly, omega, prep.faces);
  const b = zeroVector(A.n);
  // b_i = jωQ φ_i(x₀) for a monopole of volume velocity Q (peak)
  for (const s of model.sources) addPointLoad(mesh, s.position, { re: 0, im: omega * s.volumeVelocity }, b);
  return { A, b };
}

export function roomResults(prep: RoomPrepared, frequencyHz: number, u: ComplexVector): RoomPoint['receivers'] {
  return prep.model.receivers.map((r) => {
    const p = evaluateAt(prep.mesh, u, r.position);
    return { name: r.name, pressure: p, splDb: splDb(Math.hypot(p.re, p.im)) };
  });
}

export function solveRoomAt(prep: RoomPrepared, frequencyHz: number, now: () => number, keepField = false): RoomPoint {
  const t0 = now();
  const { A, b } = roomSystem(prep, frequencyHz, prep.memory.matrixValues());
  const t1 = now();
  const { x: u, stats } = solveAt(A, prep.symbolic, b, frequencyHz, now, prep.memory.factor);
  return { frequencyHz, receivers: roomResults(prep, frequencyHz, u), stats: { ...stats, assembleSeconds: (t1 - t0) / 1000 }, field: keepField ? u : undefined };
}
