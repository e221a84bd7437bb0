/**
 * The scenario being edited: the scenario file's JSON value itself ("draft"), never mutated. A field
 * that does not parse as a number keeps the text the user typed, so the validator reports it at its
 * path like any other mistake. Edits go through `setAt` and the list operations below, which copy only
 * the objects on the way to the change.
 */
export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
export type JsonObject = { [key: string]: Json };
export type Draft = JsonObject;

/** "duct.sections[0].length" → ["duct", "sections", 0, "length"]. */
export function parsePath(path: string): (string | number)[] {
  const out: (string | number)[] = [];
  for (const part of path.split('.')) {
    if (part === '') continue;
    const m = /^([^[\]]*)((?:\[\d+\])*)$/.exec(part);
    if (!m) throw new Error(`bad path ${path}`);
    if (m[1] !== '') out.push(m[1]);
    for (const idx of m[2].matchAll(/\[(\d+)\]/g)) out.push(Number(idx[1]));
  }
  return out;
}

export function isObject(v: unknown): v is JsonObject {
  return v !== null && typeof v === 'object' && !Array.isArray(v);
}

export function getAt(root: Json | undefined, path: string): Json | undefined {
  let v: Json | undefined = root;
  for (const key of parsePath(path)) {
    if (typeof key === 'number') v = Array.isArray(v) ? v[key] : undefined;
    else v = isObject(v) ? v[key] : undefined;
    if (v === undefined) return undefined;
  }
  return v;
}

/** A copy of root with the value at path replaced; undefined removes an object key. Missing parents are created. */
export function setAt(root: Draft, path: string, value: Json | undefined): Draft {
  const keys = parsePath(path);
  if (keys.length === 0) throw new Error('setAt needs a path');
  return setIn(root, keys, value) as Draft;
}

function setIn(node: Json | undefined, keys: (string | number)[], value: Json | undefined): Json | undefined {
  const [key, ...rest] = keys;
  if (typeof key === 'number') {
    const arr = Array.isArray(node) ? [...node] : [];
    const next = rest.length === 0 ? value : setIn(arr[key], rest, value);
    if (next === undefined) arr.splice(key, 1);
    else arr[key] = next;
    return arr;
  }
  const obj: JsonObject = isObject(node) ? { ...node } : {};
  const next = rest.length === 0 ? value : setIn(obj[key], rest, value);
  if (next === undefined) delete obj[key];
  else obj[key] = next;
  return obj;
}

function listAt(d: Draft, path: string): Json[] {
  const v = getAt(d, path);
  return Array.isArray(v) ? v : [];
}

function nameOf(v: Json): string {
  return isObject(v) && typeof v.name === 'string' ? v.name : '';
}

/** A name not yet used in the list: base, base 2, base 3, … */
export function freshName(taken: readonly string[], base: string): string {
  if (!taken.includes(base)) return base;
  for (let k = 2; ; k++) if (!taken.includes(`${base} ${k}`)) return `${base} ${k}`;
}

export function moveItem(d: Draft, path: string, index: number, delta: -1 | 1): Draft {
  const list = [...listAt(d, path)], j = index + delta;
  if (index < 0 || index >= list.length || j < 0 || j >= list.length) return d;
  [list[index], list[j]] = [list[j], list[index]];
  return setAt(d, path, list);
}

export function removeItem(d: Draft, path: string, index: number): Draft {
  const list = listAt(d, path);
  if (index < 0 || index >= list.length) return d;
  return setAt(d, path, list.filter((_, i) => i !== index));
}

export function insertItem(d: Draft, path: string, index: number, item: Json): Draft {
  const list = [...listAt(d, path)];
  list.splice(Math.max(0, Math.min(index, list.length)), 0, item);
  return setAt(d, path, list);
}

// ---- duct ----

/** Names used by sections and branches (they share one name space). */
export function ductNames(d: Draft): string[] {
  return [...listAt(d, 'duct.sections'), ...listAt(d, 'duct.branches')].map(nameOf);
}

/** A new section after `index`, copying its cross-section so the duct stays one airway. */
export function addSection(d: Draft, index: number): Draft {
  const sections = listAt(d, 'duct.sections'), like = sections[index];
  const base = isObject(like) ? like : { length: 0.5, width: 0.2, height: 0.15 };
  const section: JsonObject = { name: freshName(ductNames(d), 'section'), length: numberOr(base.length, 0.5), width: numberOr(base.width, 0.2), height: numberOr(base.height, 0.15) };
  if (typeof base.offsetY === 'number') section.offsetY = base.offsetY;
  if (typeof base.offsetZ === 'number') section.offsetZ = base.offsetZ;
  return insertItem(d, 'duct.sections', index + 1, section);
}

/** Removes a section with the branches and linings standing on it. */
export function removeSection(d: Draft, index: number): Draft {
  const name = nameOf(listAt(d, 'duct.sections')[index] ?? null);
  let out = removeItem(d, 'duct.sections', index);
  const onIt = (v: Json) => isObject(v) && v.section === name;
  const branches = listAt(out, 'duct.branches');
  if (branches.some(onIt)) out = setAt(out, 'duct.branches', branches.filter((b) => !onIt(b)));
  const linings = listAt(out, 'linings');
  if (linings.some(onIt)) out = setAt(out, 'linings', linings.filter((l) => !onIt(l)));
  return out;
}

/** Renames a section and every branch and lining that names it. */
export function renameSection(d: Draft, index: number, name: string): Draft {
  const old = nameOf(listAt(d, 'duct.sections')[index] ?? null);
  let out = setAt(d, `duct.sections[${index}].name`, name);
  const retarget = (path: string) => {
    const list = listAt(out, path);
    if (list.some((v) => isObject(v) && v.section === old)) out = setAt(out, path, list.map((v) => (isObject(v) && v.section === old ? { ...v, section: name } : v)));
  };
  retarget('duct.branches');
  retarget('linings');
  return out;
}

/** A closed side branch on top of the given section, at its middle. */
export function addBranch(d: Draft, sectionIndex: number): Draft {
  const s = listAt(d, 'duct.sections')[sectionIndex];
  if (!isObject(s)) return d;
  const length = numberOr(s.length, 0.5), width = numberOr(s.width, 0.2);
  const branch: JsonObject = {
    name: freshName(ductNames(d), 'branch'), section: nameOf(s), at: round(length / 2), side: '+z',
    length: 0.2, width: round(Math.min(0.1, length / 2)), height: round(width), end: 'closed',
  };
  return insertItem(d, 'duct.branches', listAt(d, 'duct.branches').length, branch);
}

/** A lining of medium mineral wool on the two side walls of a section. */
export function addLining(d: Draft, sectionIndex: number): Draft {
  const s = listAt(d, 'duct.sections')[sectionIndex];
  if (!isObject(s)) return d;
  const width = numberOr(s.width, 0.2);
  const lining: JsonObject = { section: nameOf(s), faces: ['+y', '-y'], thickness: round(Math.min(0.05, width / 4)), material: { library: 'mineral-wool-medium' } };
  return insertItem(d, 'linings', listAt(d, 'linings').length, lining);
}

// ---- room ----

export function roomNames(d: Draft): string[] {
  return [...listAt(d, 'room.sources'), ...listAt(d, 'room.receivers')].map(nameOf);
}

export function addSource(d: Draft): Draft {
  const size = roomSize(d);
  return insertItem(d, 'room.sources', listAt(d, 'room.sources').length, {
    name: freshName(roomNames(d), 'source'), position: [round(size[0] / 3), round(size[1] / 2), round(size[2] / 3)], volumeVelocity: 0.001,
  });
}

export function addReceiver(d: Draft): Draft {
  const size = roomSize(d);
  return insertItem(d, 'room.receivers', listAt(d, 'room.receivers').length, {
    name: freshName(roomNames(d), 'receiver'), position: [round((2 * size[0]) / 3), round(size[1] / 2), round(size[2] / 2)],
  });
}

function roomSize(d: Draft): [number, number, number] {
  const s = listAt(d, 'room.size');
  return [numberOr(s[0], 2), numberOr(s[1], 2), numberOr(s[2], 2)];
}

function numberOr(v: Json | undefined, fallback: number): number {
  return typeof v === 'number' && Number.isFinite(v) && v > 0 ? v : fallback;
}

/** Rounds to 0.1 mm so new parts have tidy dimensions. */
function round(v: number): number {
  return Math.round(v * 1e4) / 1e4;
}

// ---- sweep ----

export type SweepForm = 'octave' | 'third-octave' | 'list' | 'linear' | 'log';

export function sweepForm(d: Draft): SweepForm {
  const s = getAt(d, 'sweep');
  if (isObject(s) && s.frequenciesHz !== undefined) return 'list';
  const spacing = isObject(s) ? s.spacing : undefined;
  return spacing === 'octave' || spacing === 'linear' || spacing === 'log' ? spacing : 'third-octave';
}

/**
 * The sweep rewritten in another form, keeping what carries over: the range for band and spread forms,
 * the frequencies now swept (rounded to 0.1 Hz) for a list.
 */
export function changeSweepForm(d: Draft, form: SweepForm, currentFrequenciesHz: readonly number[]): Draft {
  const s = getAt(d, 'sweep'), old = isObject(s) ? s : {};
  const first = currentFrequenciesHz[0], last = currentFrequenciesHz[currentFrequenciesHz.length - 1];
  const from = typeof old.fromHz === 'number' ? old.fromHz : first !== undefined ? round1(first) : 63;
  const to = typeof old.toHz === 'number' ? old.toHz : last !== undefined ? round1(last) : 1000;
  if (form === 'list') {
    const list = currentFrequenciesHz.length > 0 ? currentFrequenciesHz.map(round1) : [125, 250, 500];
    return setAt(d, 'sweep', { frequenciesHz: list });
  }
  if (form === 'octave' || form === 'third-octave') {
    const sweep: JsonObject = { fromHz: from, toHz: to, spacing: form };
    if (typeof old.pointsPerBand === 'number') sweep.pointsPerBand = old.pointsPerBand;
    return setAt(d, 'sweep', sweep);
  }
  return setAt(d, 'sweep', { fromHz: from, toHz: to, spacing: form, count: typeof old.count === 'number' ? old.count : Math.min(400, Math.max(2, currentFrequenciesHz.length || 10)) });
}

function round1(f: number): number {
  return Math.round(f * 10) / 10;
}

/** "125, 250 500" → [125, 250, 500]; a token that is not a number stays text for the validator to name. */
export function parseFrequencyList(text: string): Json[] {
  return text.split(/[\s,;]+/).filter((t) => t !== '').map((t) => {
    const v = Number(t);
    return Number.isFinite(v) ? v : t;
  });
}
