/**
 * A room (or any box of air) with rigid, open or locally reacting walls, driven by point sources of
 * given volume velocity; the result is the pressure at each receiver. Open walls carry absorbing layers
 * on their face, with edge and corner layers where open walls meet.
 */
import type { Complex, ComplexVector } from '../core/complex.ts';
import { faceRect, maxElementSize, splDb, type Box, type Side } from '../core/index.ts';
import { buildGrid, type GridOpening } from '../grid/grid.ts';
import { buildMesh, type Mesh } from '../grid/mesh.ts';
import { assembleHelmholtz, symbolicAssembly, uniformMaterials, type AssemblyPattern, type Materials } from '../assembly/assemble.ts';
import { DEFAULT_RANGE, layerStretches, type AbsorberKind } from '../assembly/layers.ts';
import { addSurfaceAdmittance, boundaryFaces, type SurfaceFace } from '../assembly/boundary.ts';
import { addPointLoad, evaluateAt } from '../assembly/sources.ts';
import { zeroVector } from '../linalg/sparse.ts';
import type { Symbolic, WorkspaceOptions } from '../linalg/index.ts';
import { analyzeMesh, solveAt, SweepMemory } from './linear.ts';
import { chooseAbsorber, worstOverRange } from './absorber.ts';
import { ACCURACY_LEGEND, pointAccuracy } from './assess.ts';
import { meshInfo, typedArrayBytes } from './size.ts';
import type { PointAccuracy, PointResult, RoomPoint, SolveStats } from './points.ts';
import type { Absorber, Clock, LinearSystem, MeshInfo, Port, Problem, ProblemDescription, ReflectionEstimate, SectionCutOns } from './problem.ts';

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

const NO_STATS: SolveStats = { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, assembleSeconds: 0, residual: NaN };

export class RoomProblem implements Problem<RoomPoint> {
  readonly kind = 'room' as const;
  readonly mesh: Mesh;
  readonly info: MeshInfo;
  readonly bounds: Box;
  readonly memory: SweepMemory;
  /** A room has open walls, not ports: waves reach them at every angle (see reflectionEstimate). */
  readonly ports: readonly Port[] = [];
  readonly lossless: boolean;
  private readonly assembly: AssemblyPattern;
  private readonly symbolic: Symbolic;
  private readonly materials: Materials;
  private readonly faces: SurfaceFace[];
  private chosen: Absorber | null = null;

  /** As DuctProblem's: finer builds it one order higher, workspace says how its kept factor memory factors. */
  constructor(private readonly model: RoomModel, private readonly makeFiner?: () => Problem, workspace?: WorkspaceOptions) {
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
    const symbolic = analyzeMesh(mesh, assembly.pattern), memory = new SweepMemory(symbolic, workspace);
    this.mesh = mesh; this.assembly = assembly; this.symbolic = symbolic; this.memory = memory; this.materials = materials; this.faces = faces;
    this.info = meshInfo(model, mesh, assembly.pattern.colIdx.length, symbolic, typedArrayBytes({ model, mesh, assembly, symbolic, memory, materials, faces }));
    this.bounds = { x0: b.x0, x1: b.x1, y0: b.y0, y1: b.y1, z0: b.z0, z1: b.z1 };
    this.lossless = model.surfaces.length === 0;
  }

  /** Open walls see waves at every angle: the layers are tuned to the default range at every frequency. */
  absorberAt(frequencyHz: number): Absorber {
    if (this.chosen?.frequencyHz === frequencyHz) return this.chosen;
    return (this.chosen = chooseAbsorber(frequencyHz, this.model.absorber, this.model.order, DEFAULT_RANGE));
  }

  /** The worst |R| over the tuned range at the open walls; more grazing waves reflect more. */
  reflectionEstimate(frequencyHz: number): ReflectionEstimate {
    const a = this.absorberAt(frequencyHz), worst = this.model.open.length > 0 ? worstOverRange(a, this.model.order) : null;
    return { frequencyHz, absorberKind: a.kind, ports: [], tunedRangeWorst: worst, max: worst };
  }

  /** A room launches no incident wave: its sources are loads. */
  incidentField(): null {
    return null;
  }

  totalField(_frequencyHz: number, u: ComplexVector): ComplexVector {
    return u;
  }

  /** values: where A's values go (default fresh arrays). */
  system(frequencyHz: number, values?: ComplexVector): LinearSystem {
    const { model, mesh } = this, omega = 2 * Math.PI * frequencyHz, k = omega / model.soundSpeed, a = this.absorberAt(frequencyHz);
    const stretches = layerStretches(mesh.grid, k, { kind: a.kind, range: a.range, lengths: a.lengths ?? undefined });
    const A = assembleHelmholtz(mesh, this.assembly, omega, stretches, this.materials, values);
    addSurfaceAdmittance(A, mesh, this.assembly, omega, this.faces);
    const b = zeroVector(A.n);
    // b_i = jωQ φ_i(x₀) for a monopole of volume velocity Q (peak)
    for (const s of model.sources) addPointLoad(mesh, s.position, { re: 0, im: omega * s.volumeVelocity }, b);
    return { A, b };
  }

  solve(frequencyHz: number, now: Clock, keepField = false): RoomPoint {
    const t0 = now();
    const { A, b } = this.system(frequencyHz, this.memory.matrixValues());
    const t1 = now();
    const { x: u, stats } = solveAt(A, this.symbolic, b, frequencyHz, now, this.memory.factor);
    return { ...this.results(frequencyHz, u, { ...stats, assembleSeconds: (t1 - t0) / 1000 }), field: keepField ? u : undefined };
  }

  results(frequencyHz: number, u: ComplexVector, stats: SolveStats = NO_STATS): RoomPoint {
    const receivers = this.model.receivers.map((r) => {
      const p = evaluateAt(this.mesh, u, r.position);
      return { name: r.name, pressure: p, splDb: splDb(Math.hypot(p.re, p.im)) };
    });
    return { kind: 'room', frequencyHz, receivers, stats };
  }

  /** A room has no plane-wave chain. */
  planeWave(): null {
    return null;
  }

  cutOns(): SectionCutOns[] {
    return [];
  }

  assess(point: PointResult): PointAccuracy {
    return pointAccuracy({ reflectionEstimate: this.reflectionEstimate(point.frequencyHz).max, lossless: this.lossless, planeWave: null }, point);
  }

  finer(): Problem {
    return this.makeFiner ? this.makeFiner() : new RoomProblem({ ...this.model, order: this.model.order + 1 });
  }

  describe(): ProblemDescription {
    return { kind: 'room', info: this.info, cutOns: [], planeWaveValidBelowHz: null, planeWaveUnavailable: 'a room has no plane-wave chain', accuracy: ACCURACY_LEGEND };
  }
}
