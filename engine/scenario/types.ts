/**
 * The scenario file, format "quietgrid/1": what a user writes (`ScenarioInput`) and what the rest of
 * the engine reads (`NormalisedScenario`, every default filled in and listed in `defaultsUsed`).
 * scenarios/schema.json documents the same format field by field; tests keep the two in step.
 */
import type { Band, PorousModel } from '../acoustics/index.ts';
import type { Side, WallKey } from '../core/space.ts';
import type { AbsorberKind } from '../core/absorber.ts';

export type { AbsorberKind, Side, WallKey };

export const SCENARIO_FORMAT = 'quietgrid/1';

/** Duct walls a side branch can leave from (the duct runs along x). */
export type BranchSide = Exclude<Side, '-x' | '+x'>;

/** A locally reacting boundary given by its normal-incidence absorption coefficient, 0 < α ≤ 1. */
export interface AbsorptionBoundary { absorption: number }
/** A locally reacting boundary given by its specific impedance normalised by ρc: [Re, Im], Re ≥ 0. */
export interface ImpedanceBoundary { impedance: [number, number] }

/** End of the duct after the last section. */
export type Termination = 'anechoic' | 'rigid' | AbsorptionBoundary | ImpedanceBoundary;
/** A room wall. "open" means free field beyond it. */
export type WallCondition = 'rigid' | 'open' | AbsorptionBoundary | ImpedanceBoundary;

export type Spacing = 'octave' | 'third-octave' | 'linear' | 'log';
export type LiningModel = PorousModel;
export type BranchEnd = 'closed' | 'open';

/** A problem found in a scenario: where, what value, which rule, how to fix it, and all of it in one sentence. */
export interface Issue {
  /** Where in the file, e.g. "duct.branches[0].at"; "" is the whole file. */
  path: string;
  /** The offending value, when there is one (absent for a missing field). */
  value?: unknown;
  /** Stable identifier of the rule, e.g. "branch-inside-section". */
  rule: string;
  fix: string;
  /** "path = value: rule in words; fix: …" */
  message: string;
}

/** A value the validator chose because the file left it out. */
export interface DefaultUsed {
  path: string;
  value: unknown;
  why: string;
}

// ---- input: what the file may contain (every optional field optional) ----

export interface AirInput { temperatureC?: number; soundSpeed?: number; density?: number }

export type SweepInput =
  | { fromHz: number; toHz: number; spacing: 'octave' | 'third-octave'; pointsPerBand?: number }
  | { fromHz: number; toHz: number; spacing: 'linear' | 'log'; count: number }
  | { frequenciesHz: number[] };

export interface MeshInput { order?: number; pointsPerWavelength?: number }
export interface AbsorberInput { kind?: AbsorberKind; layers?: number; thickness?: number }

export interface SectionInput {
  name: string;
  length: number;
  width: number;
  height: number;
  offsetY?: number;
  offsetZ?: number;
}

export interface BranchInput {
  name: string;
  section: string;
  at: number;
  side: BranchSide;
  length: number;
  width: number;
  height: number;
  end?: BranchEnd;
}

export interface IncidentInput { mode?: [number, number]; amplitudePa?: number }

export interface DuctInput {
  sections: SectionInput[];
  branches?: BranchInput[];
  outlet?: Termination;
  incident?: IncidentInput;
}

export interface RoomSourceInput { name: string; position: [number, number, number]; volumeVelocity: number }
export interface ReceiverInput { name: string; position: [number, number, number] }

export interface RoomInput {
  size: [number, number, number];
  walls?: Partial<Record<WallKey, WallCondition>>;
  sources: RoomSourceInput[];
  receivers?: ReceiverInput[];
}

/** Keys are nominal octave centres as strings: "31.5", "63", … "8000". */
export interface SourcePowerInput { octaveBandsDb: Record<string, number> }

/** A lining material: a model with its flow resistivity, or an entry of the material library (engine/acoustics/materials.ts). */
export type LiningMaterialInput =
  | { model: LiningModel; flowResistivity: number }
  | { model?: LiningModel; library: string };

export interface LiningInput {
  section: string;
  faces: Side[];
  thickness: number;
  material: LiningMaterialInput;
}

export interface ScenarioInput {
  format: typeof SCENARIO_FORMAT;
  title?: string;
  notes?: string;
  air?: AirInput;
  sweep: SweepInput;
  mesh?: MeshInput;
  absorber?: AbsorberInput;
  duct?: DuctInput;
  room?: RoomInput;
  sourcePower?: SourcePowerInput;
  linings?: LiningInput[];
}

// ---- normalised: every default filled in ----

export interface NormalisedAir { temperatureC: number; soundSpeed: number; density: number }

interface SweepFrequencies {
  /** Strictly ascending, Hz. */
  frequenciesHz: number[];
}
export interface BandSweep extends SweepFrequencies {
  spacing: 'octave' | 'third-octave';
  fromHz: number;
  toHz: number;
  pointsPerBand: number;
  bands: Band[];
  /** bandOfPoint[i] indexes `bands` for frequenciesHz[i]. */
  bandOfPoint: number[];
}
export interface SpreadSweep extends SweepFrequencies {
  spacing: 'linear' | 'log';
  fromHz: number;
  toHz: number;
  count: number;
}
export interface ListSweep extends SweepFrequencies { spacing: 'list' }
export type NormalisedSweep = BandSweep | SpreadSweep | ListSweep;

export interface NormalisedMesh { order: number; pointsPerWavelength: number }
/** thickness null: the file left the layer stack's thickness to the solver. */
export interface NormalisedAbsorber { kind: AbsorberKind; layers: number; thickness: number | null }

export type NormalisedSection = Required<SectionInput>;
export type NormalisedBranch = Required<BranchInput>;

export interface NormalisedDuct {
  sections: NormalisedSection[];
  branches: NormalisedBranch[];
  outlet: Termination;
  /** mode [m, n]: m half-wavelengths across the width (y), n across the height (z); amplitudePa is a peak value. */
  incident: { mode: [number, number]; amplitudePa: number };
}

export interface NormalisedRoom {
  size: [number, number, number];
  walls: Record<WallKey, WallCondition>;
  sources: RoomSourceInput[];
  receivers: ReceiverInput[];
}

export interface SourcePowerBand {
  /** Nominal octave centre, Hz (the key in the file). */
  nominalHz: number;
  /** Sound power level, dB re 1 pW. */
  levelDb: number;
}
/** Ascending in frequency. */
export interface NormalisedSourcePower { octaveBands: SourcePowerBand[] }

/** library: the library entry the flow resistivity came from, or null when the file gave σ itself. */
export interface NormalisedLiningMaterial { model: LiningModel; flowResistivity: number; library: string | null }

export interface NormalisedLining {
  section: string;
  faces: Side[];
  thickness: number;
  material: NormalisedLiningMaterial;
}

interface NormalisedCommon {
  format: typeof SCENARIO_FORMAT;
  title: string;
  notes: string;
  air: NormalisedAir;
  sweep: NormalisedSweep;
  mesh: NormalisedMesh;
  absorber: NormalisedAbsorber;
  sourcePower?: NormalisedSourcePower;
  defaultsUsed: DefaultUsed[];
}

export interface NormalisedDuctScenario extends NormalisedCommon {
  kind: 'duct';
  duct: NormalisedDuct;
  linings: NormalisedLining[];
}
export interface NormalisedRoomScenario extends NormalisedCommon {
  kind: 'room';
  room: NormalisedRoom;
}
export type NormalisedScenario = NormalisedDuctScenario | NormalisedRoomScenario;

export type ValidationResult =
  | { ok: true; scenario: NormalisedScenario; warnings: Issue[] }
  | { ok: false; errors: Issue[]; warnings: Issue[] };
