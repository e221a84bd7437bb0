/**
 * What one solved frequency is: a point of the spectrum, of one problem kind, with the cost of its solve
 * and, once assessed, its own accuracy figures and flags (engine/solve/assess.ts). Plain data: points
 * cross from worker threads to the host by structured clone, their fields by transfer.
 */
import type { Complex, ComplexVector } from '../core/complex.ts';
import type { LinearStats } from './linear.ts';

export type ProblemKind = 'duct' | 'room';

/** The cost of one solve: the linear solve's figures (its relative residual among them) and the assembly's seconds. */
export type SolveStats = LinearStats & { assembleSeconds: number };

export type AccuracyFlag = 'layer_reflection' | 'energy' | 'order' | 'plane_wave_invalid' | 'not_passive' | 'not_finite' | 'near_singular';

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

export interface DuctPoint {
  kind: 'duct';
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
  stats: SolveStats;
  field?: ComplexVector;
  accuracy?: PointAccuracy;
}

export interface ReceiverResult { name: string; pressure: Complex; splDb: number }

export interface RoomPoint {
  kind: 'room';
  frequencyHz: number;
  receivers: ReceiverResult[];
  stats: SolveStats;
  field?: ComplexVector;
  accuracy?: PointAccuracy;
}

export type PointResult = DuctPoint | RoomPoint;

/** A point with its accuracy figures, as the thread that solved it assessed it. */
export type AssessedPoint = PointResult & { accuracy: PointAccuracy };

/** The quantities of a point without its solve's cost, field or assessment: what a solution vector determines. */
export type PointQuantities<P extends PointResult> = Omit<P, 'stats' | 'field' | 'accuracy'>;
