/**
 * A problem: one prepared acoustic problem (mesh, matrix pattern and analysis built once) that owns every
 * decision taken per frequency. Whoever solves a sweep — the worker job (engine/sweep/job.ts), the
 * verification suite, a test — asks the problem, never its parts:
 *
 *   system(f)          the assembled A and b at f (what export-system writes)
 *   solve(f)           system, factor and solve in this thread's kept memory, then results
 *   results(f, u)      the point's quantities from a solution computed anywhere
 *   absorberAt(f)      the absorbing layers at f: range and lengths chosen once, used by the assembly and by
 *                      the reflection estimate alike
 *   incidentField(f)   the wave the problem launches (null where it launches none), and
 *   totalField(f, u)   the pressure a person would measure, built from the solver's unknowns
 *   ports              the layered openings whose modes the reflection estimate looks at
 *   planeWave(f)       the plane-wave (four-pole) estimate and whether it holds
 *   cutOns(maxHz)      the cross-modes of each section
 *   assess(point)      the accuracy figures and flags that need no other solve
 *   finer()            the same problem one element order higher, for the order check
 *   describe()         a plain, serialisable description for the report
 *
 * Duct and room are the two kinds today (engine/solve/duct.ts, room.ts); a later kind (a duct with
 * waveguide sections, a duct discharging into a room) is one more class implementing this interface,
 * with its own point type added to PointResult.
 */
import type { ComplexVector, Complex } from '../core/complex.ts';
import type { Box, CrossSection } from '../core/space.ts';
import type { ComplexCsr } from '../linalg/sparse.ts';
import type { Mesh } from '../grid/mesh.ts';
import type { AbsorberKind, AbsorptionRange } from '../assembly/layers.ts';
import type { DuctMode } from '../acoustics/index.ts';
import type { ReportMeshInfo } from '../report/results.ts';
import type { SweepMemory } from './linear.ts';
import type { PointAccuracy, PointResult, ProblemKind, SolveStats } from './points.ts';

/** Milliseconds on a monotonic clock (performance.now in both hosts). */
export type Clock = () => number;

/** What the mesh and its factor cost, as reports print it (the report layer owns the shape). */
export type MeshInfo = ReportMeshInfo;

export interface LinearSystem { A: ComplexCsr; b: ComplexVector }

export interface SectionCutOns { section: string; modes: DuctMode[] }

/** The absorbing layers at one frequency: chosen once, read by the assembly and the reflection estimate. */
export interface Absorber {
  frequencyHz: number;
  kind: AbsorberKind;
  layers: number;
  /** The normal wavenumbers (k_x/k) the layer lengths are tuned for. */
  range: AbsorptionRange;
  /** Dimensionless complex lengths k·L̃ of the layer elements (discrete and constant kinds); null for the smooth profile. */
  lengths: readonly Complex[] | null;
}

/** A layered opening of a duct, as the plane its modes live in (a branch mouth in the branch's own axes). */
export interface Port { name: string; rect: CrossSection }

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
  absorberKind: AbsorberKind;
  ports: PortReflection[];
  /** A room's open walls: the worst |R| over the tuned range (null for a duct, and for a room without open walls). */
  tunedRangeWorst: number | null;
  /** reflection_estimate: the largest of the predictions; null for kinds without a closed form and without layers. */
  max: number | null;
}

export interface PlaneWaveEstimate {
  frequencyHz: number;
  tlDb: number;
  /** The smallest first cut-on of all sections and branches, Hz. */
  validBelowHz: number;
  valid: boolean;
}

/** How a run's accuracy figures are to be read: the engine's legend, for the report. */
export interface AccuracyLegend {
  reading: string;
  flagMeanings: Record<string, string>;
  thresholds: Record<string, number>;
}

/** A prepared problem in plain data: what the report says about the problem itself (serialisable). */
export interface ProblemDescription {
  kind: ProblemKind;
  info: MeshInfo;
  /** Each section's cross-modes up to the top of the sweep (empty for a room). */
  cutOns: SectionCutOns[];
  /** The lowest first cut-on of a duct's cross-sections: below it the plane-wave estimate holds (where there is one); null for a room. */
  planeWaveValidBelowHz: number | null;
  /** Why there is no plane-wave estimate, or null when there is one. */
  planeWaveUnavailable: string | null;
  accuracy: AccuracyLegend;
}

export interface Problem<P extends PointResult = PointResult> {
  readonly kind: ProblemKind;
  readonly mesh: Mesh;
  readonly info: MeshInfo;
  /** The physical air's bounding box (the absorbing layers lie outside it). */
  readonly bounds: Box;
  /** The matrix values and factor memory this thread reuses from one frequency to the next. */
  readonly memory: SweepMemory;
  readonly ports: readonly Port[];
  /** No absorption anywhere but the absorbing layers: then W_r + W_t = W_i must hold. */
  readonly lossless: boolean;
  /** values: where A's values go (default fresh arrays, as a caller that keeps A needs). */
  system(frequencyHz: number, values?: ComplexVector): LinearSystem;
  solve(frequencyHz: number, now: Clock, keepField?: boolean): P;
  /** stats: the cost of the solve that produced u, when known (an external solver's: its residual only). */
  results(frequencyHz: number, u: ComplexVector, stats?: SolveStats): P;
  absorberAt(frequencyHz: number): Absorber;
  reflectionEstimate(frequencyHz: number): ReflectionEstimate;
  incidentField(frequencyHz: number): ComplexVector | null;
  totalField(frequencyHz: number, u: ComplexVector): ComplexVector;
  planeWave(frequencyHz: number): PlaneWaveEstimate | null;
  cutOns(maxHz: number): SectionCutOns[];
  assess(point: PointResult): PointAccuracy;
  finer(): Problem;
  describe(): ProblemDescription;
}
