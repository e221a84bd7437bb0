/**
 * Every result carries its own accuracy: what the absorbing layers are predicted to reflect, whether power
 * balances, how much the answer moves when the element order is raised, and the plane-wave estimate beside
 * the 3D one. Each figure comes with a flag that fires when it passes a stated threshold.
 *
 * Layer reflection. The discrete kind's reflection is known in closed form (engine/assembly/layers.ts:
 * R = ∏ⱼ[P_p(zⱼ)/P_p(−zⱼ)]², Guddati & Lim, IJNME 66, 2006; arXiv:2308.12255). It is evaluated for the plane
 * wave and for the least-damped higher mode of every port (the one with the smallest |k_x|/k, propagating or
 * evanescent, i.e. the nearest to its cut-on): as k_x → 0 every absorbing layer reflects totally, so just
 * above or below a port's cut-on the estimate climbs towards 1. The 'constant' and 'smooth' kinds have no
 * closed form here: their estimate is null (measure it instead, e.g. with quietgrid verify).
 * A room's open walls see waves at every angle: there the estimate is the formula's worst over the range
 * the layers are tuned for (k_x/k ∈ [0.2, 1], κ/k ∈ [0.2, 5]); more grazing waves reflect more.
 */
import { chooseLengths, DEFAULT_RANGE, padeReflection, worstReflection } from '../assembly/layers.ts';
import type { Complex } from '../core/complex.ts';
import { crossSectionOf, type CrossSection } from '../core/space.ts';
import { modeWavenumber, portRange } from './duct.ts';
import type { NormalisedScenario } from '../scenario/types.ts';
import { solvePoint, type PointResult, type Prepared } from './scenario.ts';
import { planeWaveEstimate } from './planewave.ts';

export type AccuracyFlag = 'layer_reflection' | 'energy' | 'order' | 'plane_wave_invalid';

/** The thresholds above which a flag fires. */
export const THRESHOLDS = { layerReflection: 1e-3, energyBalance: 1e-3, orderCheckDb: 0.5 } as const;

/** What each flag says, and what to do about it; for reports and help texts. */
export const FLAG_MEANINGS: Record<AccuracyFlag, string> = {
  layer_reflection: `the absorbing layers are predicted to reflect more than ${THRESHOLDS.layerReflection} (|R|) of the plane wave or of a port's least-damped higher mode — usually a mode cut-on of a port close to this frequency; avoid the frequency, or add layers (absorber.layers)`,
  energy: `a lossless scenario loses or gains more than ${THRESHOLDS.energyBalance} of the incident power (energy_balance): refine the mesh (mesh.pointsPerWavelength) or add layers`,
  order: `the result changes by more than ${THRESHOLDS.orderCheckDb} dB when the element order is raised by one (order_check_db): the mesh is too coarse here; raise mesh.pointsPerWavelength or mesh.order`,
  plane_wave_invalid: 'the frequency is at or above the first cut-on of a section or branch: tl_plane_db (plane-wave theory) no longer holds there and the 3D result is the one to use',
};

export const ACCURACY_READING =
  'Flags per frequency (empty: none fired): layer_reflection, energy, order, plane_wave_invalid. reflection_estimate is the predicted |R| of the absorbing layers (a duct: the worst of the plane wave and each port\'s least-damped higher mode; a room: the worst over the range the layers are tuned for; blank for the constant and smooth kinds); energy_balance = |1 − (W_r + W_t)/W_i|; order_check_db = |TL(p+1) − TL(p)| (a room: the largest SPL change over the receivers), blank where not run; tl_plane_db is the plane-wave (four-pole) estimate. A flag says where a number deserves less trust and what to change; none fired means these checks passed, not that the model (rigid walls, no flow, linear acoustics) fits the real duct.';

export interface ModeReflection {
  m: number;
  n: number;
  /** k_x/k: real above cut-on, {re: 0, im: −κ/k} below (e^{+jωt}). */
  q: Complex;
  propagating: boolean;
  /** |R| predicted by the Padé formula; null for kinds without a closed form. */
  reflection: number | null;
}

export interface PortReflection {
  port: string;
  planeWave: number | null;
  /** The least-damped higher mode of the port's cross-section (null when it has none below (40, 40)). */
  mode: ModeReflection | null;
}

export interface ReflectionEstimate {
  frequencyHz: number;
  absorberKind: string;
  ports: PortReflection[];
  /** A room's open walls: the worst |R| over the tuned range (null for a duct, and for a room without open walls). */
  tunedRangeWorst: number | null;
  /** reflection_estimate: the largest of the predictions; null for kinds without a closed form and without layers. */
  max: number | null;
}

interface Port { name: string; rect: CrossSection }

/** Every opening that carries layers: the inlet, an anechoic outlet, each open branch end (its own cross-section). */
function ductPorts(p: Extract<Prepared, { kind: 'duct' }>): Port[] {
  const d = p.geometry.duct!, ports: Port[] = [{ name: 'inlet', rect: crossSectionOf(d.inlet.rect) }];
  if (d.outlet.termination === 'anechoic') ports.push({ name: 'outlet', rect: crossSectionOf(d.outlet.rect) });
  for (const b of d.branches) {
    if (b.end !== 'open') continue;
    // the mode shapes only need the two side lengths: the branch's x extent and its extent across the wall
    const box = b.box, across = b.side[1] === 'y' ? [box.z0, box.z1] : [box.y0, box.y1];
    ports.push({ name: b.name, rect: { y0: box.x0, y1: box.x1, z0: across[0], z1: across[1] } });
  }
  return ports;
}

/** The mode (m, n) ≠ (0, 0) of a rigid rectangle whose |k_x|/k is smallest at wavenumber k. */
export function leastDampedMode(k: number, rect: CrossSection): { m: number; n: number; q: Complex } | null {
  const a = rect.y1 - rect.y0, b = rect.z1 - rect.z0;
  // kt = k is crossed before mπ/a exceeds 2k; scan a little beyond
  const mMax = Math.min(40, Math.ceil((2 * k * a) / Math.PI) + 1), nMax = Math.min(40, Math.ceil((2 * k * b) / Math.PI) + 1);
  let best: { m: number; n: number; q: Complex } | null = null, bestAbs = Infinity;
  for (let m = 0; m <= mMax; m++) for (let n = 0; n <= nMax; n++) {
    if (m === 0 && n === 0) continue;
    const kx = modeWavenumber(k, rect, m, n), abs = Math.hypot(kx.re, kx.im) / k;
    if (abs < bestAbs) { bestAbs = abs; best = { m, n, q: { re: kx.re / k, im: kx.im / k } }; }
  }
  return best;
}

/** The predicted reflection of the layers a duct scenario uses at frequency f (engine/solve/duct.ts picks the same lengths). */
export function reflectionEstimate(p: Prepared, frequencyHz: number): ReflectionEstimate {
  if (p.kind !== 'duct') {
    const m = p.room.model, open = m.open.length > 0 && m.absorber.kind === 'discrete';
    const worst = open ? worstReflection(m.order, chooseLengths(m.order, m.absorber.layers, DEFAULT_RANGE), DEFAULT_RANGE) : null;
    return { frequencyHz, absorberKind: m.absorber.kind, ports: [], tunedRangeWorst: worst, max: worst };
  }
  const model = p.duct.model, k = (2 * Math.PI * frequencyHz) / model.soundSpeed;
  const closed = model.absorber.kind === 'discrete';
  const range = model.absorber.range ?? portRange(k, [model.inlet.rect, model.outlet.rect]);
  const lengths = closed ? chooseLengths(model.order, model.absorber.layers, range) : [];
  const predict = (q: Complex) => {
    if (!closed) return null;
    const R = padeReflection(model.order, lengths, q);
    return Math.hypot(R.re, R.im);
  };
  const plane = predict({ re: 1, im: 0 });
  const ports = ductPorts(p).map((port): PortReflection => {
    const mode = leastDampedMode(k, port.rect);
    return { port: port.name, planeWave: plane, mode: mode && { ...mode, propagating: mode.q.im === 0, reflection: predict(mode.q) } };
  });
  const values = ports.flatMap((x) => [x.planeWave, x.mode?.reflection ?? null]).filter((v): v is number => v !== null);
  return { frequencyHz, absorberKind: model.absorber.kind, ports, tunedRangeWorst: null, max: closed ? Math.max(...values) : null };
}

/** No linings and no impedance surfaces: then W_r + W_t = W_i must hold. */
export function isLossless(s: NormalisedScenario): boolean {
  if (s.kind === 'duct') return s.linings.length === 0 && (s.duct.outlet === 'anechoic' || s.duct.outlet === 'rigid');
  return Object.values(s.room.walls).every((w) => w === 'rigid' || w === 'open');
}

/** The same scenario one element order higher at the same points per wavelength: a finer discretisation. */
export function finerScenario(s: NormalisedScenario): NormalisedScenario {
  return { ...s, mesh: { ...s.mesh, order: s.mesh.order + 1 } };
}

/**
 * |TL(p+1) − TL(p)| for a duct (with a closed outlet, the change of the inlet reflection level, dB);
 * for a room, the largest |SPL(p+1) − SPL(p)| over the receivers.
 */
export function orderCheckDb(base: PointResult, finer: PointResult): number | null {
  if (base.kind === 'duct' && finer.kind === 'duct') {
    if (base.tlDb !== null && finer.tlDb !== null) return Math.abs(finer.tlDb - base.tlDb);
    return Math.abs(20 * Math.log10(finer.inletReflection / base.inletReflection));
  }
  if (base.kind === 'room' && finer.kind === 'room') {
    let worst = 0;
    for (const r of base.receivers) {
      const f = finer.receivers.find((x) => x.name === r.name);
      if (f) worst = Math.max(worst, Math.abs(f.splDb - r.splDb));
    }
    return worst;
  }
  return null;
}

/** The default frequencies of the order check: the top of the sweep and two more spread over it (at most 3). */
export function defaultOrderCheckFrequencies(frequenciesHz: readonly number[]): number[] {
  const f = [...frequenciesHz].sort((a, b) => a - b), n = f.length;
  if (n === 0) return [];
  return [...new Set([f[n - 1], f[Math.round((2 * (n - 1)) / 3)], f[Math.round((n - 1) / 3)]])].sort((a, b) => a - b);
}

export interface PointAccuracy {
  frequencyHz: number;
  reflectionEstimate: number | null;
  /** Duct only; null for a room. */
  energyBalance: number | null;
  orderCheckDb: number | null;
  tlPlaneDb: number | null;
  /** Whether tl_plane_db holds at this frequency (null without a plane-wave estimate). */
  planeWaveValid: boolean | null;
  flags: AccuracyFlag[];
}

/** The order flags are listed in: the CSV's flags column reads the same however the figures were gathered. */
const FLAG_ORDER: readonly AccuracyFlag[] = ['layer_reflection', 'energy', 'order', 'plane_wave_invalid'];

/** The accuracy figures and flags of one solved point; `finer` is the same frequency solved at order p + 1, when it was. */
export function assessPoint(p: Prepared, point: PointResult, finer?: PointResult): PointAccuracy {
  const a = pointAccuracy(p, point);
  return finer ? withOrderCheck(a, point, finer) : a;
}

/**
 * The figures that need no other solve. Worth computing where the point was solved: the layer lengths
 * of its frequency are chosen (and cached) there already, and another thread would choose them again.
 */
export function pointAccuracy(p: Prepared, point: PointResult): PointAccuracy {
  const f = point.frequencyHz, flags: AccuracyFlag[] = [];
  const reflection = reflectionEstimate(p, f).max;
  const energy = point.kind === 'duct' ? point.energyBalance : null;
  const plane = planeWaveEstimate(p, f);
  if (reflection !== null && reflection > THRESHOLDS.layerReflection) flags.push('layer_reflection');
  if (energy !== null && isLossless(p.scenario) && !(energy <= THRESHOLDS.energyBalance)) flags.push('energy');
  if (plane && !plane.valid) flags.push('plane_wave_invalid');
  return { frequencyHz: f, reflectionEstimate: reflection, energyBalance: energy, orderCheckDb: null, tlPlaneDb: plane?.tlDb ?? null, planeWaveValid: plane?.valid ?? null, flags };
}

/** Figures from pointAccuracy with the order check added: `finer` is the same frequency solved at order p + 1. */
export function withOrderCheck(a: PointAccuracy, point: PointResult, finer: PointResult): PointAccuracy {
  const order = orderCheckDb(point, finer);
  const fired = new Set<AccuracyFlag>(a.flags.filter((x) => x !== 'order'));
  if (order !== null && !(order <= THRESHOLDS.orderCheckDb)) fired.add('order');
  return { ...a, orderCheckDb: order, flags: FLAG_ORDER.filter((x) => fired.has(x)) };
}

/** One frequency solved and assessed in this thread (the figures that need no other solve). */
export function solveAssessed(p: Prepared, frequencyHz: number, now: () => number, keepField = false): PointResult & { accuracy: PointAccuracy } {
  const point = solvePoint(p, frequencyHz, now, keepField);
  return { ...point, accuracy: pointAccuracy(p, point) };
}
