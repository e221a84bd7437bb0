/**
 * Every result carries its own accuracy: what the absorbing layers are predicted to reflect, whether power
 * balances, how much the answer moves when the element order is raised, the plane-wave estimate beside the
 * 3D one, and whether the result is one a passive, well-posed problem can give. Each figure comes with a
 * flag that fires when it passes a stated threshold. The CLI and the app show these flags and no others.
 *
 * A problem assesses its own points (Problem.assess, with the absorber it chose at that frequency); the
 * order check is added when the same frequency solved one element order higher comes back (withOrderCheck).
 */
import type { AccuracyFlag, PointAccuracy, PointResult } from './points.ts';
import type { AccuracyLegend, PlaneWaveEstimate } from './problem.ts';

/** The thresholds above which a flag fires. */
export const THRESHOLDS = { layerReflection: 1e-3, energyBalance: 1e-3, orderCheckDb: 0.5, passiveSlack: 1e-3 } as const;

/** What each flag says, and what to do about it; for reports and help texts. */
export const FLAG_MEANINGS: Record<AccuracyFlag, string> = {
  layer_reflection: `the absorbing layers are predicted to reflect more than ${THRESHOLDS.layerReflection} (|R|) of the plane wave or of a port's least-damped higher mode — usually a mode cut-on of a port close to this frequency; avoid the frequency, or add layers (absorber.layers)`,
  energy: `a lossless scenario loses or gains more than ${THRESHOLDS.energyBalance} of the incident power (energy_balance): refine the mesh (mesh.pointsPerWavelength) or add layers`,
  order: `the result changes by more than ${THRESHOLDS.orderCheckDb} dB when the element order is raised by one (order_check_db): the mesh is too coarse here; raise mesh.pointsPerWavelength or mesh.order`,
  plane_wave_invalid: 'the frequency is at or above the first cut-on of a section or branch: tl_plane_db (plane-wave theory) no longer holds there and the 3D result is the one to use',
  not_passive: `the duct reflects more than it receives (|R| above 1 + ${THRESHOLDS.passiveSlack}) or transmits more than it receives (TL below 0 by more than that share), which no passive duct does: refine the mesh or add layers, and check the scenario`,
  not_finite: 'a result is not a finite number (a receiver at a pressure node, or a failed integral): move the receiver or the frequency slightly',
  near_singular: 'pivots were perturbed in the factorisation: the system is close to singular, a resonance of a closed, lossless space; the residual was checked, but move the frequency slightly or add absorption before relying on it',
};

/** The order flags are listed in: the CSV's flags column reads the same however the figures were gathered. */
const FLAG_ORDER: readonly AccuracyFlag[] = ['layer_reflection', 'energy', 'order', 'plane_wave_invalid', 'not_passive', 'not_finite', 'near_singular'];

export const ACCURACY_READING =
  `Flags per frequency (empty: none fired): ${FLAG_ORDER.join(', ')}. reflection_estimate is the predicted |R| of the absorbing layers (a duct: the worst of the plane wave and each port's least-damped higher mode; a room: the worst over the range the layers are tuned for; blank for the constant and smooth kinds); energy_balance = |1 − (W_r + W_t)/W_i|; order_check_db = |TL(p+1) − TL(p)| (a room: the largest SPL change over the receivers), blank where not run; tl_plane_db is the plane-wave (four-pole) estimate; residual is the solve's ‖Ax − b‖/‖b‖. A flag says where a number deserves less trust and what to change; none fired means these checks passed, not that the model (rigid walls, no flow, linear acoustics) fits the real duct.`;

export const ACCURACY_LEGEND: AccuracyLegend = { reading: ACCURACY_READING, flagMeanings: { ...FLAG_MEANINGS }, thresholds: { ...THRESHOLDS } };

/** What a problem knows of one frequency that its point's flags need. */
export interface PointFacts {
  reflectionEstimate: number | null;
  lossless: boolean;
  planeWave: PlaneWaveEstimate | null;
}

function ordered(fired: ReadonlySet<AccuracyFlag>): AccuracyFlag[] {
  return FLAG_ORDER.filter((x) => fired.has(x));
}

/** The figures and flags that need no other solve. */
export function pointAccuracy(facts: PointFacts, point: PointResult): PointAccuracy {
  const fired = new Set<AccuracyFlag>(), reflection = facts.reflectionEstimate, plane = facts.planeWave;
  const energy = point.kind === 'duct' ? point.energyBalance : null;
  if (reflection !== null && reflection > THRESHOLDS.layerReflection) fired.add('layer_reflection');
  if (energy !== null && facts.lossless && !(energy <= THRESHOLDS.energyBalance)) fired.add('energy');
  if (plane && !plane.valid) fired.add('plane_wave_invalid');
  if (point.kind === 'duct') {
    const slack = THRESHOLDS.passiveSlack;
    if (point.inletReflection > 1 + slack || (point.tlDb !== null && point.tlDb < -10 * Math.log10(1 + slack))) fired.add('not_passive');
    if (!Number.isFinite(point.inletReflection) || !Number.isFinite(point.energyBalance) || (point.tlDb !== null && !Number.isFinite(point.tlDb))) fired.add('not_finite');
  } else if (point.receivers.some((r) => !Number.isFinite(r.splDb))) fired.add('not_finite');
  if (point.stats.perturbedPivots > 0) fired.add('near_singular');
  return {
    frequencyHz: point.frequencyHz, reflectionEstimate: reflection, energyBalance: energy, orderCheckDb: null,
    tlPlaneDb: plane?.tlDb ?? null, planeWaveValid: plane?.valid ?? null, flags: ordered(fired),
  };
}

/** |ΔTL| between the point and the same frequency at order p + 1 (a closed outlet: the inlet reflection level; a room: the worst receiver). */
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

/** Figures from pointAccuracy with the order check added: `finer` is the same frequency solved at order p + 1. */
export function withOrderCheck(a: PointAccuracy, point: PointResult, finer: PointResult): PointAccuracy {
  const order = orderCheckDb(point, finer);
  const fired = new Set<AccuracyFlag>(a.flags.filter((x) => x !== 'order'));
  if (order !== null && !(order <= THRESHOLDS.orderCheckDb)) fired.add('order');
  return { ...a, orderCheckDb: order, flags: ordered(fired) };
}
