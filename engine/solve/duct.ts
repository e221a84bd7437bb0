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
import { buildGrid, type GridOpening } from '../grid/grid.ts';
import type { Complex } from '../core/complex.ts';
import { crossSectionArea, maxElementSize, mul, sub, type Box, type CrossSection } from '../core/index.ts';
import { buildMesh, dofCoordinates, type Mesh } from '../grid/mesh.ts';
import { assembleHelmholtz, symbolicAssembly, uniformMaterials, type AssemblyPattern, type Materials } from '../assembly/assemble.ts';
import { layerStretches, type AbsorberKind, type AbsorptionRange } from '../assembly/layers.ts';
import { addSplitLoad } from '../assembly/injection.ts';
import { addSurfaceAdmittance, boundaryFaces } from '../assembly/boundary.ts';
import { zeroVector, type ComplexCsr, type ComplexVector } from '../linalg/sparse.ts';
import { analyzeMesh, solveAt, SweepMemory, type LinearStats } from './linear.ts';
import type { Symbolic } from '../linalg/index.ts';
import { averagePower, cellSpan, samplePlane } from './planes.ts';

/** An equivalent fluid filling a box: 1/ρ and 1/κ, complex for porous media (e^{+jωt}). */
export interface Medium { rhoInv: Complex; kappaInv: Complex }

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
}

export interface DuctPrepared {
  model: DuctModel;
  mesh: Mesh;
  assembly: AssemblyPattern;
  symbolic: Symbolic;
  memory: SweepMemory; // matrix values and factor memory, reused at every frequency solved in this thread
  materials: Materials;
  xyz: Float64Array;
  onTotalSide: Uint8Array;
  outletFaces: { element: number; side: '+x' }[]; // the closed outlet's faces when it has an impedance
  planes: { split: number; reflection: number; inletMics: [number, number]; outletMics: [number, number]; power: number };
}

export interface DuctPoint {
  frequencyHz: number;
  tlDb: number | null; // by the method named in `method`: the active power, valid above cut-on too
  tlIntensityDb: number | null;
  tlDecompositionDb: number | null; // below the ports' first cut-on only
  method: 'intensity' | 'none'; // 'none' with a closed outlet
  inletReflection: number; // |R| of the incident mode
  inletAbsorption: number; // 1 − |R|²
  incidentPower: number;
  transmittedPower: number;
  reflectedPower: number; // summed over every propagating mode, through an inlet cross-section
  energyBalance: number; // |1 − (W_r + W_t)/W_i|
  stats: LinearStats & { assembleSeconds: number };
  field?: ComplexVector;
}

export function prepareDuct(model: DuctModel): DuctPrepared {
  const { inlet, outlet } = model;
  const lc = inlet.clearTo - inlet.x, lo = outlet.x - outlet.clearFrom;
  if (!(lc > 0) || !(lo > 0)) throw new Error('the inlet and outlet sections need a straight run before and after the first and last discontinuity');
  const planes = {
    reflection: inlet.x + 0.15 * lc,
    split: inlet.x + 0.3 * lc,
    inletMics: [inlet.x + 0.55 * lc, inlet.x + 0.8 * lc] as [number, number],
    outletMics: [outlet.clearFrom + 0.3 * lo, outlet.clearFrom + 0.7 * lo] as [number, number],
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
  const symbolic = analyzeMesh(mesh, assembly.pattern);
  return { model, mesh, assembly, symbolic, memory: new SweepMemory(symbolic), materials, xyz, onTotalSide, outletFaces, planes };
}

/** The material table at one frequency: air in slot 0, each box's medium after it. */
function materialsAt(prep: DuctPrepared, frequencyHz: number): Materials {
  const { model } = prep;
  if (!model.media) return prep.materials;
  const air = { rhoInv: prep.materials.rhoInv[0], kappaInv: prep.materials.kappaInv[0] };
  const media = model.media(frequencyHz).map((m) => m ?? air);
  return { rhoInv: [air.rhoInv, ...media.map((m) => m.rhoInv)], kappaInv: [air.kappaInv, ...media.map((m) => m.kappaInv)], ofElement: prep.materials.ofElement };
}

function modeShape(rect: CrossSection, m: number, n: number): (y: number, z: number) => number {
  const a = rect.y1 - rect.y0, b = rect.z1 - rect.z0;
  return (y, z) => Math.cos((m * Math.PI * (y - rect.y0)) / a) * Math.cos((n * Math.PI * (z - rect.z0)) / b);
}

/** k_x of mode (m, n) in a rigid rectangular duct: real above cut-on, −jκ below (e^{+jωt}). */
export function modeWavenumber(k: number, rect: CrossSection, m: number, n: number): Complex {
  const kt2 = (m * Math.PI / (rect.y1 - rect.y0)) ** 2 + (n * Math.PI / (rect.z1 - rect.z0)) ** 2, d = k * k - kt2;
  return d >= 0 ? { re: Math.sqrt(d), im: 0 } : { re: 0, im: -Math.sqrt(-d) };
}

/** What the port layers must absorb at wavenumber k: the propagating and the least-damped evanescent modes of both ports. */
export function portRange(k: number, rects: CrossSection[]): AbsorptionRange {
  let minProp = 1, minEv = Infinity;
  for (const r of rects) for (let m = 0; m <= 8; m++) for (let n = 0; n <= 8; n++) {
    if (m === 0 && n === 0) continue;
    const kx = modeWavenumber(k, r, m, n);
    if (kx.im === 0) minProp = Math.min(minProp, kx.re / k);
    else minEv = Math.min(minEv, -kx.im / k);
  }
  // geometric steps of 10 % so that neighbouring frequencies share one choice of lengths
  const q = (v: number) => Math.pow(1.1, Math.round(Math.log(v) / Math.log(1.1)));
  const propagating: [number, number] = [Math.max(0.1, q(Math.min(minProp, 0.9))), 1];
  const evanescent: [number, number] = [Math.max(0.1, q(Math.min(minEv, 5))), Math.max(5, q(Math.min(1.5 * minEv, 40)))];
  return { propagating, evanescent };
}

/** The assembled system and right-hand side at one frequency (also what `export-system` writes); values: where A's values go (default fresh arrays). */
export function ductSystem(prep: DuctPrepared, frequencyHz: number, values?: ComplexVector): { A: ComplexCsr; b: ComplexVector } {
  const { model, mesh } = prep, { inlet, outlet } = model;
  const omega = 2 * Math.PI * frequencyHz, k = omega / model.soundSpeed;
  const range = model.absorber.range ?? portRange(k, [inlet.rect, outlet.rect]);
  const A = assembleHelmholtz(mesh, prep.assembly, omega, layerStretches(mesh.grid, k, { kind: model.absorber.kind, range }), materialsAt(prep, frequencyHz), values);
  if (typeof outlet.termination === 'object') {
    const admittance = outlet.termination.admittance;
    addSurfaceAdmittance(A, mesh, prep.assembly, omega, prep.outletFaces.map((f) => ({ ...f, admittance })));
  }
  const [m, n] = model.incident.mode, psi = modeShape(inlet.rect, m, n), kx = modeWavenumber(k, inlet.rect, m, n);
  if (kx.im !== 0) throw new Error(`the incident mode (${m}, ${n}) does not propagate in the inlet at ${frequencyHz} Hz: choose a frequency above its cut-on or the plane wave [0, 0]`);
  const uInc = zeroVector(A.n), amp = model.incident.amplitude;
  for (let i = 0; i < A.n; i++) {
    const x = prep.xyz[3 * i], y = prep.xyz[3 * i + 1], z = prep.xyz[3 * i + 2];
    if (y < inlet.rect.y0 - 1e-9 || y > inlet.rect.y1 + 1e-9 || z < inlet.rect.z0 - 1e-9 || z > inlet.rect.z1 + 1e-9) continue;
    const ph = -kx.re * (x - inlet.x), s = amp * psi(y, z);
    uInc.re[i] = s * Math.cos(ph);
    uInc.im[i] = s * Math.sin(ph);
  }
  const b = zeroVector(A.n);
  addSplitLoad(A, prep.onTotalSide, uInc, b);
  return { A, b };
}

export function solveDuctAt(prep: DuctPrepared, frequencyHz: number, now: () => number, keepField = false): DuctPoint {
  const t0 = now();
  const { A, b } = ductSystem(prep, frequencyHz, prep.memory.matrixValues());
  const t1 = now();
  const { x: u, stats } = solveAt(A, prep.symbolic, b, frequencyHz, now, prep.memory.factor);
  return { ...ductResults(prep, frequencyHz, u), stats: { ...stats, assembleSeconds: (t1 - t0) / 1000 }, field: keepField ? u : undefined };
}

/** Port quantities from a solved field (also used for a solution brought back from an external solver). */
export function ductResults(prep: DuctPrepared, frequencyHz: number, u: ComplexVector): Omit<DuctPoint, 'stats' | 'field'> {
  const { model, mesh, planes } = prep, { inlet, outlet } = model;
  const omega = 2 * Math.PI * frequencyHz, k = omega / model.soundSpeed;
  const [m, n] = model.incident.mode, psi = modeShape(inlet.rect, m, n), kx = modeWavenumber(k, inlet.rect, m, n), amp = model.incident.amplitude;
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
    if (m === 0 && n === 0 && belowCutOn(k, [inlet.rect, outlet.rect])) tlDecompositionDb = decompositionTl(prep, u, k, omega, sIn, sOut);
  }
  const method = tlIntensityDb !== null ? 'intensity' : 'none';
  return {
    frequencyHz, tlDb: tlIntensityDb, tlIntensityDb, tlDecompositionDb, method,
    inletReflection, inletAbsorption: 1 - inletReflection ** 2, incidentPower, transmittedPower, reflectedPower,
    energyBalance: Math.abs(1 - (reflectedPower + transmittedPower) / incidentPower),
  };
}

function belowCutOn(k: number, rects: CrossSection[]): boolean {
  return rects.every((r) => modeWavenumber(k, r, 1, 0).im !== 0 && modeWavenumber(k, r, 0, 1).im !== 0);
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

function decompositionTl(prep: DuctPrepared, u: ComplexVector, k: number, omega: number, sIn: number, sOut: number): number {
  const { mesh, planes, model } = prep, rho = model.density, x0 = model.inlet.x;
  const mean = (x: number, rect: CrossSection) => samplePlane(mesh, u, x, rect, omega, rho).mean;
  const [i1, i2] = planes.inletMics, [o1, o2] = planes.outletMics;
  const A = waveAmplitudes(mean(i1, model.inlet.rect), mean(i2, model.inlet.rect), i1 - x0, i2 - x0, k).fwd;
  const C = waveAmplitudes(mean(o1, model.outlet.rect), mean(o2, model.outlet.rect), o1 - x0, o2 - x0, k).fwd;
  return 20 * Math.log10(Math.hypot(A.re, A.im) / Math.hypot(C.re, C.im)) + 10 * Math.log10(sIn / sOut);
}
