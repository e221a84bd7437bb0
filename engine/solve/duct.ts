/**
 * A duct section between two anechoic (or closed) ports, one frequency at a time.
 *
 * The incident mode is launched by a total-field / scattered-field split at x_s inside the straight
 * inlet run; the scattered (reflected) field on the inlet side is absorbed by the inlet layers, so the
 * incident power is known exactly and no standing wave forms between source and silencer.
 *
 *   x_in   x_r   x_s    x_m1  x_m2   clearTo … silencer … clearFrom  x_t1  x_w  x_t2   x_out
 *   |layers| S side | T side (total field)                                         |layers|
 *
 * Transmission loss TL = 10 log10(W_i / W_t), W_t the active power through an outlet cross-section
 * (valid with every propagating mode present). Below the ports' first cut-on also by plane-wave
 * decomposition of two cross-section means on each side: TL = 20 log10|A/C| + 10 log10(S_in/S_out)
 * (Chung & Blaser, JASA 68, 1980; ASTM E2611).
 */
import type { Complex, ComplexVector } from '../core/complex.ts';
import { boundsOf, crossSectionArea, maxElementSize, mul, sub, type Box, type CrossSection, type Medium } from '../core/index.ts';
import { buildGrid, type GridOpening } from '../grid/grid.ts';
import { buildMesh, dofCoordinates, type Mesh } from '../grid/mesh.ts';
import { assembleHelmholtz, symbolicAssembly, uniformMaterials, type AssemblyPattern, type Materials } from '../assembly/assemble.ts';
import { layerStretches, type AbsorberKind, type AbsorptionRange } from '../assembly/layers.ts';
import { addSplitLoad } from '../assembly/injection.ts';
import { addSurfaceAdmittance, boundaryFaces } from '../assembly/boundary.ts';
import { zeroVector } from '../linalg/sparse.ts';
import type { Symbolic, WorkspaceOptions } from '../linalg/index.ts';
import { cutOnFrequencies } from '../acoustics/index.ts';
import { analyzeMesh, solveAt, SweepMemory } from './linear.ts';
import { averagePower, cellSpan, samplePlane } from './planes.ts';
import { chooseAbsorber, portRange, portReflections, rectWavenumber } from './absorber.ts';
import { planeWaveAt, planeWaveModel, type DuctLayout, type PlaneWaveModel } from './planewave.ts';
import { ACCURACY_LEGEND, pointAccuracy } from './assess.ts';
import { meshInfo, typedArrayBytes } from './size.ts';
import type { DuctPoint, PointAccuracy, PointResult, SolveStats } from './points.ts';
import type { Absorber, Clock, LinearSystem, MeshInfo, PlaneWaveEstimate, Port, Problem, ProblemDescription, ReflectionEstimate, SectionCutOns } from './problem.ts';

export type { Medium };

export type DuctTermination = 'anechoic' | 'rigid' | { admittance: Complex }; // admittance 1/Z_s, m²·s/kg

export interface DuctModel {
  /** Air boxes; where boxes overlap the one listed first decides the cell's medium (list linings before their section). */
  boxes: Box[];
  /** Per frequency, the medium of each box (null: the air). Absent: air everywhere. */
  media?: (frequencyHz: number) => (Medium | null)[];
  openings: GridOpening[];
  inlet: { x: number; rect: CrossSection; clearTo: number };
  outlet: { x: number; rect: CrossSection; clearFrom: number; termination: DuctTermination };
  soundSpeed: number;
  density: number;
  order: number;
  pointsPerWavelength: number;
  maxFrequencyHz: number;
  /** range: the normal wavenumbers the layers are tuned for; by default the modes of the two ports at each frequency. */
  absorber: { kind: AbsorberKind; layers: number; thickness?: number; range?: AbsorptionRange };
  incident: { mode: [number, number]; amplitude: number };
  /** The sections and branches, for the plane-wave chain, the cut-ons and the branch ports; absent for a bare test duct. */
  layout?: DuctLayout;
}

/** Where the duct measures: x of the reflection plane, the split, the microphone pairs and the power plane. */
interface Planes { split: number; reflection: number; inletMics: [number, number]; outletMics: [number, number]; power: number }

const NO_STATS: SolveStats = { factorSeconds: 0, solveSeconds: 0, perturbedPivots: 0, assembleSeconds: 0, residual: NaN };

/** The duct's layered openings: the inlet, an anechoic outlet, each open branch end (in its own cross-section). */
function ductPorts(model: DuctModel): Port[] {
  const ports: Port[] = [{ name: 'inlet', rect: model.inlet.rect }];
  if (model.outlet.termination === 'anechoic') ports.push({ name: 'outlet', rect: model.outlet.rect });
  for (const b of model.layout?.branches ?? []) {
    if (b.end !== 'open') continue;
    // the mode shapes only need the two side lengths: the branch's x extent and its extent across the wall
    const box = b.box, across = b.side[1] === 'y' ? [box.z0, box.z1] : [box.y0, box.y1];
    ports.push({ name: b.name, rect: { y0: box.x0, y1: box.x1, z0: across[0], z1: across[1] } });
  }
  return ports;
}

function whyNoPlaneWave(model: DuctModel): string | null {
  if (model.outlet.termination !== 'anechoic') return 'the outlet is closed: there is no transmitted power';
  if (model.media) return 'the duct is lined: the four-pole chain here has no lining model';
  if (model.incident.mode[0] !== 0 || model.incident.mode[1] !== 0) return 'the incident wave is a higher mode, not the plane wave';
  return null;
}

function modeShape(rect: CrossSection, m: number, n: number): (y: number, z: number) => number {
  const a = rect.y1 - rect.y0, b = rect.z1 - rect.z0;
  return (y, z) => Math.cos((m * Math.PI * (y - rect.y0)) / a) * Math.cos((n * Math.PI * (z - rect.z0)) / b);
}

export class DuctProblem implements Problem<DuctPoint> {
  readonly kind = 'duct' as const;
  readonly mesh: Mesh;
  readonly info: MeshInfo;
  readonly bounds: Box;
  readonly memory: SweepMemory;
  readonly ports: readonly Port[];
  readonly lossless: boolean;
  /** x, y, z of every dof (3 per dof). */
  readonly xyz: Float64Array;
  /** 1 where a dof's unknown is the total field, 0 where it is the scattered field (upstream of the split). */
  readonly onTotalSide: Uint8Array;
  private readonly assembly: AssemblyPattern;
  private readonly symbolic: Symbolic;
  private readonly materials: Materials;
  private readonly outletFaces: { element: number; side: '+x' }[]; // the closed outlet's faces when it has an impedance
  private readonly planes: Planes;
  private readonly plane: PlaneWaveModel;
  private chosen: Absorber | null = null;

  /**
   * finer: how to build this problem one element order higher (default: the same model at order p + 1);
   * workspace: how its kept factor memory factors (engine/linalg: kernels, helper threads).
   */
  constructor(private readonly model: DuctModel, private readonly makeFiner?: () => Problem, workspace?: WorkspaceOptions) {
    const { inlet, outlet } = model;
    const lc = inlet.clearTo - inlet.x, lo = outlet.x - outlet.clearFrom;
    if (!(lc > 0) || !(lo > 0)) throw new Error('the inlet and outlet sections need a straight run before and after the first and last discontinuity');
    const planes: Planes = {
      reflection: inlet.x + 0.15 * lc,
      split: inlet.x + 0.3 * lc,
      inletMics: [inlet.x + 0.55 * lc, inlet.x + 0.8 * lc],
      outletMics: [outlet.clearFrom + 0.3 * lo, outlet.clearFrom + 0.7 * lo],
      power: outlet.clearFrom + 0.5 * lo,
    };
    const lambda = model.soundSpeed / model.maxFrequencyHz;
    const grid = buildGrid({
      order: model.order, boxes: model.boxes, openings: model.openings,
      maxElementSize: maxElementSize(model.order, lambda, model.pointsPerWavelength),
      layerCount: model.absorber.layers,
      layerThickness: model.absorber.thickness !== undefined ? model.absorber.thickness / model.absorber.layers : undefined,
      extraBreakpoints: { x: [planes.reflection, planes.split] },
    });
    const mesh = buildMesh(grid), assembly = symbolicAssembly(mesh), xyz = dofCoordinates(mesh);
    const onTotalSide = new Uint8Array(mesh.numbering.ndofs);
    for (let i = 0; i < onTotalSide.length; i++) onTotalSide[i] = xyz[3 * i] >= planes.split - 1e-9 ? 1 : 0;
    const materials = uniformMaterials(mesh.elements.length, model.density, model.density * model.soundSpeed ** 2);
    if (model.media) {
      // slot 0 is the air, slot 1 + i the medium of box i
      for (let e = 0; e < mesh.elements.length; e++) materials.ofElement[e] = 1 + grid.box[mesh.elements[e]];
    }
    const r = outlet.rect, inRect = (_x: number, y: number, z: number) => y > r.y0 && y < r.y1 && z > r.z0 && z < r.z1;
    const outletFaces = typeof outlet.termination === 'object' ? boundaryFaces(mesh, '+x', inRect).map((f) => ({ element: f.element, side: '+x' as const })) : [];
    const symbolic = analyzeMesh(mesh, assembly.pattern), memory = new SweepMemory(symbolic, workspace);
    this.mesh = mesh; this.assembly = assembly; this.symbolic = symbolic; this.memory = memory; this.materials = materials;
    this.xyz = xyz; this.onTotalSide = onTotalSide; this.outletFaces = outletFaces; this.planes = planes;
    // the arrays this thread keeps for the problem (its sweep memory is not allocated yet)
    const kept = typedArrayBytes({ model, mesh, assembly, symbolic, memory, materials, xyz, onTotalSide, outletFaces, planes });
    this.info = meshInfo(model, mesh, assembly.pattern.colIdx.length, symbolic, kept);
    this.bounds = boundsOf(model.boxes);
    this.ports = ductPorts(model);
    this.lossless = !model.media && (outlet.termination === 'anechoic' || outlet.termination === 'rigid');
    this.plane = planeWaveModel(model.layout, whyNoPlaneWave(model), model.soundSpeed);
  }

  private wavenumber(frequencyHz: number): number {
    return (2 * Math.PI * frequencyHz) / this.model.soundSpeed;
  }

  /** The layers at f: tuned to the modes of the two ports, unless the model fixes the range. Chosen once per frequency. */
  absorberAt(frequencyHz: number): Absorber {
    if (this.chosen?.frequencyHz === frequencyHz) return this.chosen;
    const { model } = this, k = this.wavenumber(frequencyHz);
    const range = model.absorber.range ?? portRange(k, [model.inlet.rect, model.outlet.rect]);
    return (this.chosen = chooseAbsorber(frequencyHz, model.absorber, model.order, range));
  }

  reflectionEstimate(frequencyHz: number): ReflectionEstimate {
    const a = this.absorberAt(frequencyHz), ports = portReflections(a, this.model.order, this.wavenumber(frequencyHz), this.ports);
    const values = ports.flatMap((x) => [x.planeWave, x.mode?.reflection ?? null]).filter((v): v is number => v !== null);
    return { frequencyHz, absorberKind: a.kind, ports, tunedRangeWorst: null, max: a.kind === 'discrete' ? Math.max(...values) : null };
  }

  /** The material table at one frequency: air in slot 0, each box's medium after it. */
  private materialsAt(frequencyHz: number): Materials {
    const { model, materials } = this;
    if (!model.media) return materials;
    const air = { rhoInv: materials.rhoInv[0], kappaInv: materials.kappaInv[0] };
    const media = model.media(frequencyHz).map((m) => m ?? air);
    return { rhoInv: [air.rhoInv, ...media.map((m) => m.rhoInv)], kappaInv: [air.kappaInv, ...media.map((m) => m.kappaInv)], ofElement: materials.ofElement };
  }

  /**
   * The incident mode p_inc = A·cos(mπ(y − y0)/a)·cos(nπ(z − z0)/b)·e^{−j k_x (x − x_in)} at every dof inside
   * the inlet's cross-section (the layers included: the split load needs it on both sides of the split plane);
   * null when the mode does not propagate in the inlet at f (it launches no power: the solve refuses it).
   */
  incidentField(frequencyHz: number): ComplexVector | null {
    const { model, xyz } = this, { inlet } = model, [m, n] = model.incident.mode;
    const wave = rectWavenumber(this.wavenumber(frequencyHz), inlet.rect, m, n);
    if (wave.im !== 0) return null;
    const kx = wave.re, psi = modeShape(inlet.rect, m, n), amp = model.incident.amplitude;
    const u = zeroVector(this.mesh.numbering.ndofs);
    for (let i = 0; i < u.re.length; i++) {
      const x = xyz[3 * i], y = xyz[3 * i + 1], z = xyz[3 * i + 2];
      if (y < inlet.rect.y0 - 1e-9 || y > inlet.rect.y1 + 1e-9 || z < inlet.rect.z0 - 1e-9 || z > inlet.rect.z1 + 1e-9) continue;
      const ph = -kx * (x - inlet.x), s = amp * psi(y, z);
      u.re[i] = s * Math.cos(ph);
      u.im[i] = s * Math.sin(ph);
    }
    return u;
  }

  /** The total pressure at every dof: upstream of the split the unknowns are the scattered field, so the incident wave is added back there (not in the layers). */
  totalField(frequencyHz: number, u: ComplexVector): ComplexVector {
    const inc = this.incidentField(frequencyHz), x0 = this.model.inlet.x - 1e-9;
    const re = Float64Array.from(u.re), im = Float64Array.from(u.im);
    if (!inc) return { re, im };
    for (let i = 0; i < re.length; i++) {
      if (this.onTotalSide[i] || this.xyz[3 * i] < x0) continue;
      re[i] += inc.re[i];
      im[i] += inc.im[i];
    }
    return { re, im };
  }

  system(frequencyHz: number, values?: ComplexVector): LinearSystem {
    const { model, mesh } = this, omega = 2 * Math.PI * frequencyHz, k = this.wavenumber(frequencyHz), a = this.absorberAt(frequencyHz);
    const stretches = layerStretches(mesh.grid, k, { kind: a.kind, range: a.range, lengths: a.lengths ?? undefined });
    const A = assembleHelmholtz(mesh, this.assembly, omega, stretches, this.materialsAt(frequencyHz), values);
    if (typeof model.outlet.termination === 'object') {
      const admittance = model.outlet.termination.admittance;
      addSurfaceAdmittance(A, mesh, this.assembly, omega, this.outletFaces.map((f) => ({ ...f, admittance })));
    }
    const incident = this.incidentField(frequencyHz), [m, n] = model.incident.mode;
    if (!incident) throw new Error(`the incident mode (${m}, ${n}) does not propagate in the inlet at ${frequencyHz} Hz: choose a frequency above its cut-on or the plane wave [0, 0]`);
    const b = zeroVector(A.n);
    addSplitLoad(A, this.onTotalSide, incident, b);
    return { A, b };
  }

  solve(frequencyHz: number, now: Clock, keepField = false): DuctPoint {
    const t0 = now();
    const { A, b } = this.system(frequencyHz, this.memory.matrixValues());
    const t1 = now();
    const { x: u, stats } = solveAt(A, this.symbolic, b, frequencyHz, now, this.memory.factor);
    return { ...this.results(frequencyHz, u, { ...stats, assembleSeconds: (t1 - t0) / 1000 }), field: keepField ? u : undefined };
  }

  /** Port quantities from a solved field (also from a solution brought back from an external solver). */
  results(frequencyHz: number, u: ComplexVector, stats: SolveStats = NO_STATS): DuctPoint {
    const { model, mesh, planes } = this, { inlet, outlet } = model;
    const omega = 2 * Math.PI * frequencyHz, k = omega / model.soundSpeed;
    const [m, n] = model.incident.mode, psi = modeShape(inlet.rect, m, n), kx = rectWavenumber(k, inlet.rect, m, n), amp = model.incident.amplitude;
    const rho = model.density, sIn = crossSectionArea(inlet.rect), sOut = crossSectionArea(outlet.rect);
    const norm = (m > 0 ? 0.5 : 1) * (n > 0 ? 0.5 : 1);
    const incidentPower = (0.5 * amp * amp * kx.re * sIn * norm) / (omega * rho);
    // the reflection plane is the top of an element lying wholly on the scattered side
    const refl = samplePlane(mesh, u, planes.reflection, inlet.rect, omega, rho, psi);
    const inletReflection = Math.hypot(refl.projection.re, refl.projection.im) / amp;
    const reflectedPower = -averagePower(mesh, u, ...cellSpan(mesh, planes.reflection), inlet.rect, omega, rho);
    let transmittedPower = 0, tlIntensityDb: number | null = null, tlDecompositionDb: number | null = null;
    if (outlet.termination === 'anechoic') {
      // the outlet run is air: a lining there would make the measured power depend on the plane
      transmittedPower = averagePower(mesh, u, ...cellSpan(mesh, planes.power), outlet.rect, omega, rho);
      tlIntensityDb = 10 * Math.log10(incidentPower / transmittedPower);
      if (m === 0 && n === 0 && belowCutOn(k, [inlet.rect, outlet.rect])) tlDecompositionDb = this.decompositionTl(u, k, omega, sIn, sOut);
    }
    const method = tlIntensityDb !== null ? 'intensity' : 'none';
    return {
      kind: 'duct', frequencyHz, tlDb: tlIntensityDb, tlIntensityDb, tlDecompositionDb, method,
      inletReflection, inletAbsorption: 1 - inletReflection ** 2, incidentPower, transmittedPower, reflectedPower,
      energyBalance: Math.abs(1 - (reflectedPower + transmittedPower) / incidentPower), stats,
    };
  }

  private decompositionTl(u: ComplexVector, k: number, omega: number, sIn: number, sOut: number): number {
    const { mesh, planes, model } = this, rho = model.density, x0 = model.inlet.x;
    const mean = (x: number, rect: CrossSection) => samplePlane(mesh, u, x, rect, omega, rho).mean;
    const [i1, i2] = planes.inletMics, [o1, o2] = planes.outletMics;
    const A = waveAmplitudes(mean(i1, model.inlet.rect), mean(i2, model.inlet.rect), i1 - x0, i2 - x0, k).fwd;
    const C = waveAmplitudes(mean(o1, model.outlet.rect), mean(o2, model.outlet.rect), o1 - x0, o2 - x0, k).fwd;
    return 20 * Math.log10(Math.hypot(A.re, A.im) / Math.hypot(C.re, C.im)) + 10 * Math.log10(sIn / sOut);
  }

  planeWave(frequencyHz: number): PlaneWaveEstimate | null {
    return planeWaveAt(this.plane, frequencyHz, { soundSpeed: this.model.soundSpeed, density: this.model.density });
  }

  /** Cut-on frequencies of every section up to a limit, the first six each (Morse & Ingard, Theoretical Acoustics, 1968). */
  cutOns(maxHz: number): SectionCutOns[] {
    const c = this.model.soundSpeed;
    return (this.model.layout?.sections ?? []).map((s) => ({ section: s.name, modes: cutOnFrequencies(s.width, s.height, c, maxHz).slice(0, 6) }));
  }

  assess(point: PointResult): PointAccuracy {
    const f = point.frequencyHz;
    return pointAccuracy({ reflectionEstimate: this.reflectionEstimate(f).max, lossless: this.lossless, planeWave: this.planeWave(f) }, point);
  }

  finer(): Problem {
    return this.makeFiner ? this.makeFiner() : new DuctProblem({ ...this.model, order: this.model.order + 1 });
  }

  describe(): ProblemDescription {
    return {
      kind: 'duct', info: this.info, cutOns: this.cutOns(this.info.topFrequencyHz), planeWaveValidBelowHz: this.plane.validBelowHz,
      planeWaveUnavailable: this.plane.unavailable, accuracy: ACCURACY_LEGEND,
    };
  }
}

function belowCutOn(k: number, rects: CrossSection[]): boolean {
  return rects.every((r) => rectWavenumber(k, r, 1, 0).im !== 0 && rectWavenumber(k, r, 0, 1).im !== 0);
}

/** Two-microphone decomposition p̄(x) = A e^{−jkξ} + B e^{+jkξ}, ξ = x − x_in, from cross-section means at two planes. */
function waveAmplitudes(p1: Complex, p2: Complex, x1: number, x2: number, k: number): { fwd: Complex } {
  // [e^{−jkx1} e^{jkx1}; e^{−jkx2} e^{jkx2}] [A; B] = [p1; p2]
  const e = (s: number, x: number) => ({ re: Math.cos(s * k * x), im: Math.sin(s * k * x) });
  const a11 = e(-1, x1), a12 = e(1, x1), a21 = e(-1, x2), a22 = e(1, x2);
  const det = sub(mul(a11, a22), mul(a12, a21)), num = sub(mul(p1, a22), mul(a12, p2));
  const d2 = det.re ** 2 + det.im ** 2;
  return { fwd: { re: (num.re * det.re + num.im * det.im) / d2, im: (num.im * det.re - num.re * det.im) / d2 } };
}
