/**
 * The vocabulary of format "quietgrid/1": which fields each object may hold, the enumerations and
 * the limits. The validator reads its unknown-field lists from here, and the schema test walks
 * scenarios/schema.json against `SCENARIO_FIELDS`, so the file and the code cannot drift apart.
 */
import { LINING_MATERIAL_IDS, POROUS_MODELS } from '../acoustics/index.ts';
import { SIDES, WALL_KEYS } from '../core/space.ts';
import type { AbsorberKind, BranchEnd, BranchSide, LiningModel, Spacing } from './types.ts';

export const READABLE_FORMATS: readonly string[] = ['quietgrid/1'];

export const BRANCH_SIDES: readonly BranchSide[] = ['+y', '-y', '+z', '-z'];

export const SPACINGS: readonly Spacing[] = ['octave', 'third-octave', 'linear', 'log'];
export const BAND_SPACINGS: readonly Spacing[] = ['octave', 'third-octave'];
export const ABSORBER_KINDS: readonly AbsorberKind[] = ['discrete', 'constant', 'smooth'];
export const LINING_MODELS: readonly LiningModel[] = POROUS_MODELS;
/** Entries of the lining-material library a scenario may name. */
export const LINING_LIBRARY: readonly string[] = LINING_MATERIAL_IDS;
export const BRANCH_ENDS: readonly BranchEnd[] = ['closed', 'open'];
export const TERMINATION_WORDS: readonly string[] = ['anechoic', 'rigid'];
export const WALL_WORDS: readonly string[] = ['rigid', 'open'];
/** Nominal octave centres a source power may be given at (IEC 61260-1 base-10 bands, 31.5 Hz to 8 kHz). */
export const OCTAVE_BAND_KEYS: readonly string[] = ['31.5', '63', '125', '250', '500', '1000', '2000', '4000', '8000'];

export const LIMITS = {
  /** Highest frequency a sweep may reach, Hz: the top of the audio range. */
  maxFrequencyHz: 20_000,
  /** Most frequencies one scenario may ask for: each is a full 3D factorisation. */
  maxFrequencies: 400,
  /** Duct dimensions, m: below a millimetre it is no duct (and arithmetic underflows); above 10 km it is a typing slip. */
  minDimension: 0.001,
  maxDimension: 10_000,
  maxSections: 64,
  maxBranches: 64,
  maxSources: 32,
  maxReceivers: 64,
  maxLinings: 64,
  minOrder: 1,
  maxOrder: 6,
  minLayers: 1,
  maxLayers: 12,
  /** Below this many points per wavelength the phase error of the elements grows quickly: warn. */
  lowPointsPerWavelength: 4,
  minTemperatureC: -100,
  maxTemperatureC: 1000,
  minLevelDb: -50,
  maxLevelDb: 200,
  maxTitleLength: 200,
  maxNotesLength: 20_000,
  maxNameLength: 64,
} as const;

/**
 * Names of sections, branches, sources and receivers: 1–64 characters, no control characters,
 * no leading or trailing white space (they label boxes, CSV columns and plots).
 * The same pattern string stands in schema.json.
 */
export const NAME_PATTERN = '^[^\\s\\u0000-\\u001F\\u007F]([^\\u0000-\\u001F\\u007F]*[^\\s\\u0000-\\u001F\\u007F])?$';
export const NAME_REGEXP = new RegExp(NAME_PATTERN);

const BOUNDARY_OBJECT_FIELDS = ['absorption', 'impedance'];

/**
 * Allowed fields of every object in the format, keyed by its path pattern: "[]" stands for any array
 * item. Where the format offers alternatives (the three sweep forms, absorption or impedance), the
 * list is their union; the validator then checks which combinations make sense.
 */
export const SCENARIO_FIELDS: Readonly<Record<string, readonly string[]>> = {
  '': ['format', 'title', 'notes', 'air', 'sweep', 'mesh', 'absorber', 'duct', 'room', 'sourcePower', 'linings'],
  air: ['temperatureC', 'soundSpeed', 'density'],
  sweep: ['fromHz', 'toHz', 'spacing', 'pointsPerBand', 'count', 'frequenciesHz'],
  mesh: ['order', 'pointsPerWavelength'],
  absorber: ['kind', 'layers', 'thickness'],
  duct: ['sections', 'branches', 'outlet', 'incident'],
  'duct.sections[]': ['name', 'length', 'width', 'height', 'offsetY', 'offsetZ'],
  'duct.branches[]': ['name', 'section', 'at', 'side', 'length', 'width', 'height', 'end'],
  'duct.outlet': BOUNDARY_OBJECT_FIELDS,
  'duct.incident': ['mode', 'amplitudePa'],
  room: ['size', 'walls', 'sources', 'receivers'],
  'room.walls': [...WALL_KEYS],
  ...Object.fromEntries(WALL_KEYS.map((key) => [`room.walls.${key}`, BOUNDARY_OBJECT_FIELDS])),
  'room.sources[]': ['name', 'position', 'volumeVelocity'],
  'room.receivers[]': ['name', 'position'],
  sourcePower: ['octaveBandsDb'],
  'sourcePower.octaveBandsDb': [...OCTAVE_BAND_KEYS],
  'linings[]': ['section', 'faces', 'thickness', 'material'],
  'linings[].material': ['model', 'flowResistivity', 'library'],
};

/** The enumerations of the format by path pattern, as the validator reads them (the schema test compares). */
export const SCENARIO_ENUMS: Readonly<Record<string, readonly string[]>> = {
  format: READABLE_FORMATS,
  'sweep.spacing': SPACINGS,
  'absorber.kind': ABSORBER_KINDS,
  'duct.outlet': TERMINATION_WORDS,
  'duct.branches[].side': BRANCH_SIDES,
  'duct.branches[].end': BRANCH_ENDS,
  ...Object.fromEntries(WALL_KEYS.map((key) => [`room.walls.${key}`, WALL_WORDS])),
  'linings[].faces[]': SIDES,
  'linings[].material.model': LINING_MODELS,
  'linings[].material.library': LINING_LIBRARY,
};

/** The field list for a concrete path such as "duct.sections[2]". */
export function fieldsAt(path: string): readonly string[] {
  const pattern = path.replace(/\[\d+\]/g, '[]');
  const fields = SCENARIO_FIELDS[pattern];
  if (fields === undefined) throw new Error(`no field list for ${pattern}`);
  return fields;
}
