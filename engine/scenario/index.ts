// Public API of the scenario layer: read and check a scenario file, and the geometry it describes.
export * from './types.ts';
export { ScenarioError, formatIssues } from './issues.ts';
export { parseScenarioText, DEFAULT_MAX_BYTES, MAX_NESTING_DEPTH, FORBIDDEN_KEYS, type ParseOptions } from './parse.ts';
export { validateScenario, DEFAULT_TITLE } from './validate.ts';
export { readScenario } from './read.ts';
export { buildGeometry, type Geometry, type Opening, type SectionLayout, type BranchLayout, type DuctPorts, type RoomLayout, type LiningLayout } from './geometry.ts';
export { liningMedia, liningReport, type LiningReport } from './linings.ts';
export { liningTag } from './lining-layout.ts';
export { DEFAULT_LINING_MODEL } from './validate-linings.ts';
export type { TaggedBox } from './box.ts';
export { SCENARIO_FIELDS, SCENARIO_ENUMS, LIMITS, READABLE_FORMATS, NAME_PATTERN, OCTAVE_BAND_KEYS, LINING_LIBRARY } from './fields.ts';
