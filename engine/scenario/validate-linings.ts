/**
 * The duct linings: each names a section, the faces it lines, a thickness and a material (a model
 * with its flow resistivity, or an entry of the material library). Then the slabs they make are
 * checked against the duct (lining-layout.ts), and the sweep against each model's fitted range.
 */
import { liningMaterial, porousFittedFrequencies, porousValidity } from '../acoustics/index.ts';
import { item, join, type Checker } from './checker.ts';
import { layOutBranch, layOutSections } from './duct-layout.ts';
import { SIDES } from '../core/space.ts';
import { LIMITS, LINING_LIBRARY, LINING_MODELS } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { layOutLinings } from './lining-layout.ts';
import { get, readArray, readEnum, readEnumOr, readNumber, readObject, readString, required, type Json } from './reader.ts';
import { didYouMean } from './suggest.ts';
import type { LiningModel, NormalisedAir, NormalisedDuct, NormalisedLining, NormalisedLiningMaterial, NormalisedSection, NormalisedSweep, Side } from './types.ts';

/** Miki's form: fitted to the same data as Delany & Bazley's, and physically admissible much further below it. */
export const DEFAULT_LINING_MODEL: LiningModel = 'miki';

export interface LiningContext { duct?: NormalisedDuct; sweep?: NormalisedSweep; air?: NormalisedAir }

export function readLinings(ck: Checker, value: Found, context: LiningContext): NormalisedLining[] | undefined {
  if (value === MISSING) return [];
  const list = readArray(ck, value, 'linings', 'the list of linings', { minItems: 0, maxItems: LIMITS.maxLinings, itemWhat: 'lining' });
  if (list === undefined) return undefined;
  const linings = list.map((v, i) => readLining(ck, v, item('linings', i), context.duct?.sections));
  if (linings.some((l) => l === undefined)) return undefined;
  const clean = linings as NormalisedLining[];
  if (!checkFacesLinedOnce(ck, clean)) return undefined;
  if (context.duct !== undefined && !checkLayout(ck, clean, context.duct)) return undefined;
  if (context.sweep !== undefined && context.air !== undefined) warnOutsideFit(ck, clean, context.sweep, context.air);
  return clean;
}

function readLining(ck: Checker, value: unknown, path: string, sections: NormalisedSection[] | undefined): NormalisedLining | undefined {
  const lining = readObject(ck, value, path, 'a lining');
  if (lining === undefined) return undefined;
  const what = 'the name of the lined section';
  const name = readString(ck, required(ck, lining, path, 'section', what, '"chamber"'), join(path, 'section'), what, { maxLength: LIMITS.maxNameLength });
  const section = name === undefined ? undefined : findSection(ck, name, join(path, 'section'), sections);
  const faces = readFaces(ck, required(ck, lining, path, 'faces', 'the lined faces', '["+y", "-y"]'), join(path, 'faces'));
  const thickness = readNumber(ck, required(ck, lining, path, 'thickness', 'the lining thickness', '0.05'), join(path, 'thickness'), 'the lining thickness', { unit: 'm', above: 0 });
  const material = readMaterial(ck, required(ck, lining, path, 'material', 'the lining material', '{"library": "mineral-wool-medium"}'), join(path, 'material'));
  if (section === undefined || faces === undefined || thickness === undefined || material === undefined) return undefined;
  if (!thinEnough(ck, section, faces, thickness, join(path, 'thickness'))) return undefined;
  return { section: section.name, faces, thickness, material };
}

function findSection(ck: Checker, name: string, path: string, sections: NormalisedSection[] | undefined): NormalisedSection | undefined {
  if (sections === undefined) return undefined;
  const found = sections.find((s) => s.name === name);
  if (found === undefined) {
    const names = sections.map((s) => s.name);
    ck.error(path, name, 'lining-section', 'a lining must line one of the duct sections, and no section has this name',
      `${didYouMean(name, names)}use one of: ${names.map((n) => `"${n}"`).join(', ')}`);
  }
  return found;
}

function readFaces(ck: Checker, value: Found, path: string): Side[] | undefined {
  const list = readArray(ck, value, path, 'the lined faces', { minItems: 1, maxItems: SIDES.length, itemWhat: 'face' });
  if (list === undefined) return undefined;
  const faces = list.map((f, i) => readEnum(ck, f, item(path, i), 'a face', SIDES));
  let clean = faces.every((f) => f !== undefined);
  faces.forEach((f, i) => {
    if (f === undefined || faces.indexOf(f) === i) return;
    clean = false;
    ck.error(item(path, i), f, 'unique-face', `the face "${f}" is listed twice`, 'list each face once');
  });
  return clean ? (faces as Side[]) : undefined;
}

/** {model, flowResistivity} or {library, model?}: σ from the file or from the library, never both. */
function readMaterial(ck: Checker, value: Found, path: string): NormalisedLiningMaterial | undefined {
  const material = readObject(ck, value, path, 'the lining material');
  if (material === undefined) return undefined;
  const library = get(material, 'library');
  if (library !== MISSING && get(material, 'flowResistivity') !== MISSING) {
    ck.error(join(path, 'library'), library, 'material-form', 'a lining material takes its flow resistivity either from "flowResistivity" or from a "library" entry, not both',
      'remove "library" to use your own flow resistivity, or remove "flowResistivity" to use the library\'s');
    return undefined;
  }
  return library === MISSING ? readOwnMaterial(ck, material, path) : readLibraryMaterial(ck, material, library, path);
}

function readOwnMaterial(ck: Checker, material: Json, path: string): NormalisedLiningMaterial | undefined {
  const model = readEnum(ck, required(ck, material, path, 'model', 'the material model', '"miki"'), join(path, 'model'), 'the material model', LINING_MODELS);
  const what = 'the static airflow resistivity';
  const example = `20000 (or name a library material instead: "library": "${LINING_LIBRARY[2]}")`;
  const flowResistivity = readNumber(ck, required(ck, material, path, 'flowResistivity', what, example), join(path, 'flowResistivity'), what, { unit: 'Pa·s/m²', above: 0 });
  if (model === undefined || flowResistivity === undefined) return undefined;
  return { model, flowResistivity, library: null };
}

function readLibraryMaterial(ck: Checker, material: Json, library: unknown, path: string): NormalisedLiningMaterial | undefined {
  const id = readEnum(ck, library, join(path, 'library'), 'the library material', LINING_LIBRARY);
  const model = readEnumOr(ck, get(material, 'model'), join(path, 'model'), 'the material model', LINING_MODELS, DEFAULT_LINING_MODEL,
    'not given: Miki\'s form, whose layers stay physically admissible further below the fitted range than with Delany & Bazley\'s');
  if (id === undefined || model === undefined) return undefined;
  return { model, flowResistivity: liningMaterial(id)!.flowResistivity, library: id };
}

/** A lining thinner than half the section across it leaves an airway, even with the opposite face lined too. */
function thinEnough(ck: Checker, section: NormalisedSection, faces: Side[], thickness: number, path: string): boolean {
  const across = (face: Side) => (face[1] === 'x' ? section.length : face[1] === 'y' ? section.width : section.height);
  const limit = Math.min(...faces.map(across));
  if (thickness < limit / 2) return true;
  const face = faces.find((f) => across(f) === limit)!;
  ck.error(path, thickness, 'lining-thickness',
    `a lining must be thinner than half the section across it: face ${face} of section "${section.name}" faces a ${num(limit)} m ${face[1] === 'x' ? 'length' : face[1] === 'y' ? 'width' : 'height'}`,
    `set thickness below ${num(limit / 2)}`);
  return false;
}

function checkFacesLinedOnce(ck: Checker, linings: NormalisedLining[]): boolean {
  const seen = new Set<string>();
  let clean = true;
  linings.forEach((l, i) => l.faces.forEach((face, j) => {
    const key = `${l.section} ${face}`;
    if (seen.has(key)) {
      clean = false;
      ck.error(`${item('linings', i)}.faces[${j}]`, face, 'lined-twice', `face ${face} of section "${l.section}" is already lined by an earlier lining`, 'line each face once');
    }
    seen.add(key);
  }));
  return clean;
}

/** The slabs against the duct: the ports' runs stay air, end walls exist, no branch mouth is covered. */
function checkLayout(ck: Checker, linings: NormalisedLining[], duct: NormalisedDuct): boolean {
  const sectionBoxes = layOutSections(duct.sections);
  const branches = duct.branches.map((b) => {
    const i = duct.sections.findIndex((s) => s.name === b.section);
    return { name: b.name, section: b.section, box: layOutBranch(b, duct.sections[i], sectionBoxes[i]) };
  });
  const { problems } = layOutLinings({ sections: duct.sections, sectionBoxes, branches, outlet: duct.outlet }, linings);
  for (const p of problems) ck.error(`${item('linings', p.lining)}.faces[${p.faceIndex}]`, p.face, p.rule, p.statement, p.fix);
  return problems.length === 0;
}

/** Outside its fitted range a one-parameter model is a guess: say so, with the range for this σ. */
function warnOutsideFit(ck: Checker, linings: NormalisedLining[], sweep: NormalisedSweep, air: NormalisedAir): void {
  const fLo = sweep.frequenciesHz[0], fHi = sweep.frequenciesHz[sweep.frequenciesHz.length - 1];
  linings.forEach((l, i) => {
    const { model, flowResistivity } = l.material, v = porousValidity(model, fLo, fHi, flowResistivity, air.density);
    if (v.warning === null) return;
    const [a, b] = porousFittedFrequencies(model, flowResistivity, air.density);
    const instead = model === 'delany-bazley' && v.range[0] < v.fitted[0] ? 'use "model": "miki" below it, or ' : '';
    ck.warn(join(item('linings', i), 'material'), l.material, 'lining-model-range',
      `over the sweep (${num(fLo)}–${num(fHi)} Hz) the ${model} model of σ = ${num(flowResistivity)} Pa·s/m² leaves its fitted range: ${v.warning}`,
      `the fitted range for this σ is ${num(Number(a.toPrecision(3)))}–${num(Number(b.toPrecision(3)))} Hz: ${instead}narrow the sweep to it, or choose a material whose range covers the sweep`);
  });
}
