// Bad scenarios, each a mutation of a valid fixture, with the field and rule the validator must name.
// `schema: true` marks the rules that scenarios/schema.json can express too: the schema test checks
// that the schema refuses those inputs as well.
import { FULL_DUCT, FULL_ROOM, ISSUE_EXAMPLE, LIST_SWEEP_DUCT } from './fixtures.ts';

/* eslint-disable @typescript-eslint/no-explicit-any */
type Mutation = (s: any) => void;

export interface BadCase {
  name: string;
  base: unknown;
  mutate: Mutation;
  path: string;
  rule: string;
  schema: boolean;
}

const I = ISSUE_EXAMPLE, D = FULL_DUCT, R = FULL_ROOM, L = LIST_SWEEP_DUCT;
const many = (n: number) => Array.from({ length: n }, (_, i) => 100 + i);

const rows: [string, unknown, Mutation, string, string, boolean][] = [
  // format
  ['format missing', I, (s) => delete s.format, 'format', 'format-missing', true],
  ['older format', I, (s) => (s.format = 'quietgrid/0'), 'format', 'format-version', true],
  ['newer format', I, (s) => (s.format = 'quietgrid/2'), 'format', 'format-version', true],
  ['foreign format', I, (s) => (s.format = 'acme-duct/1'), 'format', 'format-version', true],
  ['format not a string', I, (s) => (s.format = 1), 'format', 'format-version', true],
  // top level
  ['unknown top-level field', I, (s) => (s.titel = 'x'), 'titel', 'unknown-field', true],
  ['title not a string', I, (s) => (s.title = 12), 'title', 'type', true],
  ['title too long', I, (s) => (s.title = 'x'.repeat(201)), 'title', 'length', true],
  ['notes not a string', I, (s) => (s.notes = ['a']), 'notes', 'type', true],
  ['both duct and room', I, (s) => (s.room = structuredClone(FULL_ROOM.room)), 'room', 'duct-or-room', true],
  ['neither duct nor room', I, (s) => delete s.duct, 'duct', 'duct-or-room', true],
  ['linings in a room', R, (s) => (s.linings = []), 'linings', 'linings-in-room', true],
  // air
  ['air not an object', I, (s) => (s.air = 20), 'air', 'type', true],
  ['temperature below range', I, (s) => (s.air.temperatureC = -300), 'air.temperatureC', 'range', true],
  ['sound speed zero', I, (s) => (s.air.soundSpeed = 0), 'air.soundSpeed', 'range', true],
  ['density a word', I, (s) => (s.air.density = 'heavy'), 'air.density', 'type', true],
  ['air field misspelt', I, (s) => (s.air.temperature = 20), 'air.temperature', 'unknown-field', true],
  // sweep
  ['sweep missing', I, (s) => delete s.sweep, 'sweep', 'required', true],
  ['spacing misspelt', I, (s) => (s.sweep.spacing = 'third octave'), 'sweep.spacing', 'enum', true],
  ['fromHz zero', I, (s) => (s.sweep.fromHz = 0), 'sweep.fromHz', 'range', true],
  ['fromHz as text', I, (s) => (s.sweep.fromHz = '50'), 'sweep.fromHz', 'type', true],
  ['toHz above 20 kHz', I, (s) => (s.sweep.toHz = 25000), 'sweep.toHz', 'range', true],
  ['toHz missing', I, (s) => delete s.sweep.toHz, 'sweep.toHz', 'required', true],
  ['sweep reversed', I, (s) => Object.assign(s.sweep, { fromHz: 1000, toHz: 50 }), 'sweep.toHz', 'sweep-order', false],
  ['sweep of equal ends', I, (s) => Object.assign(s.sweep, { fromHz: 500, toHz: 500 }), 'sweep.toHz', 'sweep-order', false],
  ['no band in range', I, (s) => Object.assign(s.sweep, { fromHz: 52, toHz: 58 }), 'sweep', 'sweep-empty', false],
  ['pointsPerBand zero', I, (s) => (s.sweep.pointsPerBand = 0), 'sweep.pointsPerBand', 'range', true],
  ['pointsPerBand fractional', I, (s) => (s.sweep.pointsPerBand = 1.5), 'sweep.pointsPerBand', 'integer', true],
  ['too many points per band', I, (s) => (s.sweep.pointsPerBand = 40), 'sweep.pointsPerBand', 'sweep-count', false],
  ['count with band spacing', I, (s) => (s.sweep.count = 10), 'sweep.count', 'sweep-form', true],
  ['linear without count', R, (s) => delete s.sweep.count, 'sweep.count', 'required', true],
  ['count above 400', R, (s) => (s.sweep.count = 401), 'sweep.count', 'range', true],
  ['pointsPerBand with linear spacing', R, (s) => (s.sweep.pointsPerBand = 2), 'sweep.pointsPerBand', 'sweep-form', true],
  ['list not ascending', L, (s) => (s.sweep.frequenciesHz = [100, 90]), 'sweep.frequenciesHz[1]', 'ascending', false],
  ['list with a repeat', L, (s) => (s.sweep.frequenciesHz = [100, 100]), 'sweep.frequenciesHz[1]', 'ascending', false],
  ['list empty', L, (s) => (s.sweep.frequenciesHz = []), 'sweep.frequenciesHz', 'count', true],
  ['list of 401', L, (s) => (s.sweep.frequenciesHz = many(401)), 'sweep.frequenciesHz', 'count', true],
  ['list with a negative frequency', L, (s) => (s.sweep.frequenciesHz = [-5, 10]), 'sweep.frequenciesHz[0]', 'range', true],
  ['list above 20 kHz', L, (s) => (s.sweep.frequenciesHz = [100, 20001]), 'sweep.frequenciesHz[1]', 'range', true],
  ['list and range together', L, (s) => (s.sweep.fromHz = 50), 'sweep.fromHz', 'sweep-form', true],
  // mesh, absorber
  ['order fractional', I, (s) => (s.mesh.order = 4.5), 'mesh.order', 'integer', true],
  ['order too high', I, (s) => (s.mesh.order = 7), 'mesh.order', 'range', true],
  ['order zero', I, (s) => (s.mesh.order = 0), 'mesh.order', 'range', true],
  ['points per wavelength zero', I, (s) => (s.mesh.pointsPerWavelength = 0), 'mesh.pointsPerWavelength', 'range', true],
  ['mesh field misspelt', I, (s) => (s.mesh.ordre = 4), 'mesh.ordre', 'unknown-field', true],
  ['absorber kind unknown', I, (s) => (s.absorber.kind = 'pml'), 'absorber.kind', 'enum', true],
  ['absorber layers 13', I, (s) => (s.absorber.layers = 13), 'absorber.layers', 'range', true],
  ['absorber thickness negative', I, (s) => (s.absorber.thickness = -1), 'absorber.thickness', 'range', true],
  // sections
  ['sections empty', I, (s) => (s.duct.sections = []), 'duct.sections', 'count', true],
  ['sections missing', I, (s) => delete s.duct.sections, 'duct.sections', 'required', true],
  ['sections not a list', I, (s) => (s.duct.sections = { name: 'a' }), 'duct.sections', 'type', true],
  ['section field misspelt', I, (s) => { s.duct.sections[0].lenght = 0.6; delete s.duct.sections[0].length; }, 'duct.sections[0].lenght', 'unknown-field', true],
  ['section length missing', I, (s) => delete s.duct.sections[0].length, 'duct.sections[0].length', 'required', true],
  ['section length negative', I, (s) => (s.duct.sections[0].length = -0.6), 'duct.sections[0].length', 'range', true],
  ['section length zero', I, (s) => (s.duct.sections[1].length = 0), 'duct.sections[1].length', 'range', true],
  ['section length as text', I, (s) => (s.duct.sections[0].length = '0.6'), 'duct.sections[0].length', 'type', true],
  ['section width null', I, (s) => (s.duct.sections[2].width = null), 'duct.sections[2].width', 'type', true],
  ['section height infinite', I, (s) => (s.duct.sections[0].height = Infinity), 'duct.sections[0].height', 'finite', false],
  ['section offset not a number', I, (s) => (s.duct.sections[1].offsetY = 'centre'), 'duct.sections[1].offsetY', 'type', true],
  ['section name empty', I, (s) => (s.duct.sections[0].name = ''), 'duct.sections[0].name', 'pattern', true],
  ['section name padded', I, (s) => (s.duct.sections[0].name = ' inlet'), 'duct.sections[0].name', 'pattern', true],
  ['section name a number', I, (s) => (s.duct.sections[0].name = 5), 'duct.sections[0].name', 'type', true],
  ['section names repeated', I, (s) => (s.duct.sections[2].name = 'inlet'), 'duct.sections[2].name', 'unique-name', false],
  ['sections apart in y', I, (s) => (s.duct.sections[1].offsetY = 0.5), 'duct.sections[1].offsetY', 'sections-connected', false],
  ['sections apart in z', I, (s) => (s.duct.sections[2].offsetZ = 1), 'duct.sections[2].offsetZ', 'sections-connected', false],
  ['sections only touching', I, (s) => (s.duct.sections[2].offsetY = 0.3), 'duct.sections[2].offsetY', 'sections-connected', false],
  // branches
  ['branches not a list', I, (s) => (s.duct.branches = {}), 'duct.branches', 'type', true],
  ['branch field misspelt', I, (s) => (s.duct.branches[0].sid = '+y'), 'duct.branches[0].sid', 'unknown-field', true],
  ['branch named like a section', I, (s) => (s.duct.branches[0].name = 'chamber'), 'duct.branches[0].name', 'unique-name', false],
  ['branch on an unknown section', I, (s) => (s.duct.branches[0].section = 'inelt'), 'duct.branches[0].section', 'branch-section', false],
  ['branch beyond its section', I, (s) => (s.duct.branches[0].at = 0.7), 'duct.branches[0].at', 'branch-inside-section', false],
  ['branch over the section start', I, (s) => (s.duct.branches[0].at = 0.01), 'duct.branches[0].at', 'branch-inside-section', false],
  ['branch wider than its section', I, (s) => (s.duct.branches[0].width = 0.7), 'duct.branches[0].width', 'branch-inside-section', false],
  ['branch taller than its wall', I, (s) => (s.duct.branches[0].height = 0.2), 'duct.branches[0].height', 'branch-fits-wall', false],
  ['branch on top wider than the duct', I, (s) => Object.assign(s.duct.branches[0], { side: '+z', height: 0.2 }), 'duct.branches[0].height', 'branch-fits-wall', false],
  ['branch side unknown', I, (s) => (s.duct.branches[0].side = 'y'), 'duct.branches[0].side', 'enum', true],
  ['branch end unknown', I, (s) => (s.duct.branches[0].end = 'capped'), 'duct.branches[0].end', 'enum', true],
  ['branch length zero', I, (s) => (s.duct.branches[0].length = 0), 'duct.branches[0].length', 'range', true],
  ['branch at missing', I, (s) => delete s.duct.branches[0].at, 'duct.branches[0].at', 'required', true],
  ['branches overlapping', I, (s) => s.duct.branches.push({ ...s.duct.branches[0], name: 'stub 2', at: 0.33 }), 'duct.branches[1].at', 'branches-overlap', false],
  ['branches side by side', I, (s) => s.duct.branches.push({ ...s.duct.branches[0], name: 'stub 2', at: 0.36 }), 'duct.branches[1].at', 'branches-overlap', false],
  ['branch against the next section', I, (s) => (s.duct.branches[0].at = 0.57), 'duct.branches[0].at', 'branch-clear', false],
  ['open branch end inside the outline', I, (s) => Object.assign(s.duct.branches[0], { length: 0.1, end: 'open' }), 'duct.branches[0].end', 'open-end-outermost', false],
  // outlet and incident wave
  ['outlet word unknown', I, (s) => (s.duct.outlet = 'open'), 'duct.outlet', 'enum', true],
  ['outlet absorption zero', I, (s) => (s.duct.outlet = { absorption: 0 }), 'duct.outlet.absorption', 'range', true],
  ['outlet absorption above one', I, (s) => (s.duct.outlet = { absorption: 1.2 }), 'duct.outlet.absorption', 'range', true],
  ['outlet negative resistance', I, (s) => (s.duct.outlet = { impedance: [-1, 0] }), 'duct.outlet.impedance[0]', 'range', true],
  ['outlet impedance of one part', I, (s) => (s.duct.outlet = { impedance: [1] }), 'duct.outlet.impedance', 'count', true],
  ['outlet impedance part a word', I, (s) => (s.duct.outlet = { impedance: [1, 'j'] }), 'duct.outlet.impedance[1]', 'type', true],
  ['outlet with both forms', I, (s) => (s.duct.outlet = { absorption: 0.5, impedance: [1, 0] }), 'duct.outlet', 'boundary-form', true],
  ['outlet empty object', I, (s) => (s.duct.outlet = {}), 'duct.outlet', 'boundary-form', true],
  ['outlet field misspelt', I, (s) => (s.duct.outlet = { absorbtion: 0.5 }), 'duct.outlet.absorbtion', 'unknown-field', true],
  ['outlet a number', I, (s) => (s.duct.outlet = 1), 'duct.outlet', 'type', true],
  ['incident mode fractional', I, (s) => (s.duct.incident = { mode: [1.5, 0] }), 'duct.incident.mode[0]', 'integer', true],
  ['incident mode negative', I, (s) => (s.duct.incident = { mode: [0, -1] }), 'duct.incident.mode[1]', 'range', true],
  ['incident mode of one index', I, (s) => (s.duct.incident = { mode: [0] }), 'duct.incident.mode', 'count', true],
  ['incident amplitude zero', I, (s) => (s.duct.incident = { amplitudePa: 0 }), 'duct.incident.amplitudePa', 'range', true],
  // linings
  ['lining on an unknown section', D, (s) => (s.linings[0].section = 'bx'), 'linings[0].section', 'lining-section', false],
  ['lining face unknown', D, (s) => (s.linings[0].faces = ['+w']), 'linings[0].faces[0]', 'enum', true],
  ['lining face twice', D, (s) => (s.linings[0].faces = ['+z', '+z']), 'linings[0].faces[1]', 'unique-face', true],
  ['lining faces empty', D, (s) => (s.linings[0].faces = []), 'linings[0].faces', 'count', true],
  ['face lined by two linings', D, (s) => (s.linings[1].faces = ['+z']), 'linings[1].faces[0]', 'lined-twice', false],
  ['lining too thick', D, (s) => (s.linings[0].thickness = 0.2), 'linings[0].thickness', 'lining-thickness', false],
  ['lining thickness zero', D, (s) => (s.linings[0].thickness = 0), 'linings[0].thickness', 'range', true],
  ['lining model unknown', D, (s) => (s.linings[0].material.model = 'biot'), 'linings[0].material.model', 'enum', true],
  ['lining flow resistivity negative', D, (s) => (s.linings[0].material.flowResistivity = -1), 'linings[0].material.flowResistivity', 'range', true],
  ['lining material missing', D, (s) => delete s.linings[0].material, 'linings[0].material', 'required', true],
  ['linings not a list', D, (s) => (s.linings = { section: 'box' }), 'linings', 'type', true],
  ['lining material with both σ and a library entry', D, (s) => (s.linings[1].material.flowResistivity = 9000), 'linings[1].material.library', 'material-form', true],
  ['lining library entry unknown', D, (s) => (s.linings[1].material.library = 'mineral-wool'), 'linings[1].material.library', 'enum', true],
  ['lining σ without a model', D, (s) => delete s.linings[0].material.model, 'linings[0].material.model', 'required', true],
  ['lining material empty', D, (s) => (s.linings[0].material = {}), 'linings[0].material.model', 'required', true],
  ['lining along the inlet run', D, (s) => (s.linings[0].section = 'in'), 'linings[0].faces[0]', 'lining-inlet-run', false],
  ['lining on the inlet opening', D, (s) => (s.linings[1].section = 'in'), 'linings[1].faces[0]', 'lining-inlet-run', false],
  ['lining along an anechoic outlet run', D, (s) => { s.duct.outlet = 'anechoic'; s.linings[0].section = 'out'; }, 'linings[0].faces[0]', 'lining-outlet-run', false],
  ['lining on an anechoic outlet opening', D, (s) => { s.duct.outlet = 'anechoic'; s.linings[1] = { ...s.linings[1], section: 'out', faces: ['+x'] }; }, 'linings[1].faces[0]', 'lining-outlet-run', false],
  ['lining an end wall the neighbour covers', D, (s) => (s.linings[1].section = 'out'), 'linings[1].faces[0]', 'lining-end-wall', false],
  ['lining over a branch mouth', D, (s) => (s.linings[0].faces = ['+y']), 'linings[0].faces[0]', 'lining-covers-branch', false],
  // source power
  ['source power band not an octave centre', D, (s) => (s.sourcePower.octaveBandsDb['100'] = 80), 'sourcePower.octaveBandsDb.100', 'unknown-field', true],
  ['source power level absurd', D, (s) => (s.sourcePower.octaveBandsDb['125'] = 300), 'sourcePower.octaveBandsDb.125', 'range', true],
  ['source power with no bands', D, (s) => (s.sourcePower.octaveBandsDb = {}), 'sourcePower.octaveBandsDb', 'count', true],
  ['source power without its bands', D, (s) => (s.sourcePower = {}), 'sourcePower.octaveBandsDb', 'required', true],
  ['source power field misspelt', D, (s) => (s.sourcePower.octaveBandDb = {}), 'sourcePower.octaveBandDb', 'unknown-field', true],
  // room
  ['room size of two', R, (s) => (s.room.size = [2, 1.6]), 'room.size', 'count', true],
  ['room size negative', R, (s) => (s.room.size = [2, -1, 1]), 'room.size[1]', 'range', true],
  ['room size missing', R, (s) => delete s.room.size, 'room.size', 'required', true],
  ['room field unknown', R, (s) => (s.room.height = 3), 'room.height', 'unknown-field', true],
  ['wall key misspelt', R, (s) => (s.room.walls.x0 = 'rigid'), 'room.walls.x0', 'unknown-field', true],
  ['wall condition unknown', R, (s) => (s.room.walls['y-'] = 'absorbent'), 'room.walls.y-', 'enum', true],
  ['wall absorption above one', R, (s) => (s.room.walls['z+'] = { absorption: 2 }), 'room.walls.z+.absorption', 'range', true],
  ['source on a wall', R, (s) => (s.room.sources[0].position = [0, 0.8, 0.4]), 'room.sources[0].position[0]', 'inside-room', false],
  ['source outside the room', R, (s) => (s.room.sources[0].position = [0.7, 2, 0.4]), 'room.sources[0].position[1]', 'inside-room', false],
  ['receiver on the ceiling', R, (s) => (s.room.receivers[0].position = [1.5, 0.5, 1.2]), 'room.receivers[0].position[2]', 'inside-room', false],
  ['position of two coordinates', R, (s) => (s.room.receivers[0].position = [1.5, 0.5]), 'room.receivers[0].position', 'count', true],
  ['no sources', R, (s) => (s.room.sources = []), 'room.sources', 'count', true],
  ['source strength zero', R, (s) => (s.room.sources[0].volumeVelocity = 0), 'room.sources[0].volumeVelocity', 'range', true],
  ['source strength missing', R, (s) => delete s.room.sources[0].volumeVelocity, 'room.sources[0].volumeVelocity', 'required', true],
  ['receiver named like the source', R, (s) => (s.room.receivers[0].name = 'engine'), 'room.receivers[0].name', 'unique-name', false],
  ['receiver field unknown', R, (s) => (s.room.receivers[0].gain = 1), 'room.receivers[0].gain', 'unknown-field', true],
  // whole value
  ['scenario is an array', I, (s) => s, '', 'type', true],
];

export const BAD_CASES: BadCase[] = rows.map(([name, base, mutate, path, rule, schema]) => ({ name, base, mutate, path, rule, schema }));

/** The scenario of a case: the base cloned and mutated (the array case replaces the whole value). */
export function badScenario(c: BadCase): unknown {
  if (c.name === 'scenario is an array') return [structuredClone(c.base)];
  const s = structuredClone(c.base);
  c.mutate(s);
  return s;
}
