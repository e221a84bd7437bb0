/**
 * Optional blocks that do not change the field solution: the source's sound power per octave band
 * (results are scaled to it) and the duct linings (read and checked for shape; what they do
 * acoustically is the solver's business).
 */
import { bandFromIndex, bandOfNominal } from '../acoustics/index.ts';
import { item, join, type Checker } from './checker.ts';
import { LIMITS, LINING_MODELS, OCTAVE_BAND_KEYS, SIDES } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { get, readArray, readEnum, readNumber, readObject, readString, required } from './reader.ts';
import type { NormalisedLining, NormalisedSection, NormalisedSourcePower, NormalisedSweep, Side } from './types.ts';
import { didYouMean } from './suggest.ts';

export function readSourcePower(ck: Checker, value: Found, sweep: NormalisedSweep | undefined): NormalisedSourcePower | undefined {
  const block = readObject(ck, value, 'sourcePower', 'the source power');
  if (block === undefined) return undefined;
  const path = 'sourcePower.octaveBandsDb';
  const bands = readObject(ck, required(ck, block, 'sourcePower', 'octaveBandsDb', 'the sound power level per octave band', '{"125": 88, "250": 85}'), path, 'the octave-band levels');
  if (bands === undefined) return undefined;
  const keys = OCTAVE_BAND_KEYS.filter((k) => get(bands, k) !== MISSING);
  if (keys.length === 0 && Object.keys(bands).length === 0) {
    ck.error(path, bands, 'count', 'at least one octave band needs a level', `add levels such as "125": 88 (bands: ${OCTAVE_BAND_KEYS.join(', ')} Hz)`);
    return undefined;
  }
  const levels = keys.map((k) => readNumber(ck, bands[k], join(path, k), `the sound power level at ${k} Hz`, { unit: 'dB re 1 pW', min: LIMITS.minLevelDb, max: LIMITS.maxLevelDb }));
  if (levels.some((l) => l === undefined) || keys.length !== Object.keys(bands).length) return undefined;
  const octaveBands = keys.map((k, i) => ({ nominalHz: Number(k), levelDb: levels[i] as number }));
  if (sweep !== undefined) warnUncovered(ck, octaveBands.map((b) => b.nominalHz), sweep);
  return { octaveBands };
}

/** Frequencies of the sweep in octave bands without a level get no scaled result: say so. */
function warnUncovered(ck: Checker, nominals: number[], sweep: NormalisedSweep): void {
  const edges = nominals.map((n) => {
    const band = bandFromIndex(bandOfNominal(n, 1)!.index, 1);
    return [band.lowHz, band.highHz];
  });
  const outside = sweep.frequenciesHz.filter((f) => !edges.some(([lo, hi]) => f >= lo && f < hi));
  if (outside.length === 0) return;
  ck.warn('sourcePower.octaveBandsDb', nominals, 'source-power-bands',
    `${outside.length} of the ${sweep.frequenciesHz.length} swept frequencies (from ${num(outside[0])} Hz) fall in octave bands without a sound power level, so they get no level from it`,
    'add levels for those octave bands, or narrow the sweep');
}

export function readLinings(ck: Checker, value: Found, sections: NormalisedSection[] | undefined): NormalisedLining[] | undefined {
  if (value === MISSING) return [];
  const list = readArray(ck, value, 'linings', 'the list of linings', { minItems: 0, maxItems: LIMITS.maxLinings, itemWhat: 'lining' });
  if (list === undefined) return undefined;
  const linings = list.map((v, i) => readLining(ck, v, item('linings', i), sections));
  if (linings.some((l) => l === undefined)) return undefined;
  checkFacesLinedOnce(ck, linings as NormalisedLining[]);
  return linings as NormalisedLining[];
}

function readLining(ck: Checker, value: unknown, path: string, sections: NormalisedSection[] | undefined): NormalisedLining | undefined {
  const lining = readObject(ck, value, path, 'a lining');
  if (lining === undefined) return undefined;
  const what = 'the name of the lined section';
  const name = readString(ck, required(ck, lining, path, 'section', what, '"chamber"'), join(path, 'section'), what, { maxLength: LIMITS.maxNameLength });
  const section = name === undefined ? undefined : findSection(ck, name, join(path, 'section'), sections);
  const faces = readFaces(ck, required(ck, lining, path, 'faces', 'the lined faces', '["+y", "-y"]'), join(path, 'faces'));
  const thickness = readNumber(ck, required(ck, lining, path, 'thickness', 'the lining thickness', '0.05'), join(path, 'thickness'), 'the lining thickness', { unit: 'm', above: 0 });
  const material = readMaterial(ck, required(ck, lining, path, 'material', 'the lining material', '{"model": "delany-bazley", "flowResistivity": 20000}'), join(path, 'material'));
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

function readMaterial(ck: Checker, value: Found, path: string): NormalisedLining['material'] | undefined {
  const material = readObject(ck, value, path, 'the lining material');
  if (material === undefined) return undefined;
  const model = readEnum(ck, required(ck, material, path, 'model', 'the material model', '"delany-bazley"'), join(path, 'model'), 'the material model', LINING_MODELS);
  const what = 'the static airflow resistivity';
  const flowResistivity = readNumber(ck, required(ck, material, path, 'flowResistivity', what, '20000'), join(path, 'flowResistivity'), what, { unit: 'Pa·s/m²', above: 0 });
  if (model === undefined || flowResistivity === undefined) return undefined;
  return { model, flowResistivity };
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

function checkFacesLinedOnce(ck: Checker, linings: NormalisedLining[]): void {
  const seen = new Set<string>();
  linings.forEach((l, i) => l.faces.forEach((face, j) => {
    const key = `${l.section} ${face}`;
    if (seen.has(key)) {
      ck.error(`${item('linings', i)}.faces[${j}]`, face, 'lined-twice', `face ${face} of section "${l.section}" is already lined by an earlier lining`, 'line each face once');
    }
    seen.add(key);
  }));
}
