/**
 * The duct block, field by field: sections, side branches, outlet termination and incident mode.
 * The rules between parts (connected, inside, clear of each other) are in duct-rules.ts.
 */
import { item, join, type Checker } from './checker.ts';
import { BRANCH_ENDS, BRANCH_SIDES, LIMITS, TERMINATION_WORDS } from './fields.ts';
import { MISSING, type Found } from './issues.ts';
import { get, readArray, readEnum, readEnumOr, readName, readNumber, readNumberOr, readNumbers, readObject, readString, required, type Json } from './reader.ts';
import { checkDuctRules, type DuctContext } from './duct-rules.ts';
import { readBoundary } from './validate-boundary.ts';
import type { NormalisedBranch, NormalisedDuct, NormalisedSection, Termination } from './types.ts';

const LENGTH = { unit: 'm', min: LIMITS.minDimension, max: LIMITS.maxDimension } as const;

export function readDuct(ck: Checker, value: Found, context: DuctContext): NormalisedDuct | undefined {
  const duct = readObject(ck, value, 'duct', 'the duct');
  if (duct === undefined) return undefined;
  const sections = readList(ck, duct, 'sections', LIMITS.maxSections, 1, readSection);
  const branches = get(duct, 'branches') === MISSING ? [] : readList(ck, duct, 'branches', LIMITS.maxBranches, 0, readBranch);
  const outlet = readOutlet(ck, get(duct, 'outlet'));
  const incident = readIncident(ck, get(duct, 'incident'));
  if (sections === undefined || branches === undefined) return undefined;
  const clean = sections.every((s) => s !== undefined);
  if (clean) checkDuctRules(ck, sections as NormalisedSection[], branches, { ...context, mode: incident?.mode });
  if (!clean || branches.some((b) => b === undefined) || outlet === undefined || incident === undefined) return undefined;
  return { sections: sections as NormalisedSection[], branches: branches as NormalisedBranch[], outlet, incident };
}

/** The items of duct[key], each read by `readItem`; undefined entries stand for bad items. */
function readList<T>(ck: Checker, duct: Json, key: 'sections' | 'branches', maxItems: number, minItems: number,
  readItem: (ck: Checker, value: unknown, path: string) => T | undefined): (T | undefined)[] | undefined {
  const path = join('duct', key);
  const what = key === 'sections' ? 'the list of duct sections' : 'the list of side branches';
  const example = '[{"name": "inlet", "length": 0.6, "width": 0.15, "height": 0.1}]';
  const raw = key === 'sections' ? required(ck, duct, 'duct', key, 'the list of duct sections', example) : get(duct, key);
  const items = readArray(ck, raw, path, what, { minItems, maxItems, itemWhat: key === 'sections' ? 'section' : 'branch', itemsWhat: key === 'sections' ? 'sections' : 'branches' });
  return items?.map((v, i) => readItem(ck, v, item(path, i)));
}

function readSection(ck: Checker, value: unknown, path: string): NormalisedSection | undefined {
  const s = readObject(ck, value, path, 'a duct section');
  if (s === undefined) return undefined;
  const name = readName(ck, s, path, 'section');
  const dim = (key: string, what: string, example: string) =>
    readNumber(ck, required(ck, s, path, key, what, example), join(path, key), what, LENGTH);
  const length = dim('length', 'the section length (along x)', '0.5');
  const width = dim('width', 'the section width (along y)', '0.2');
  const height = dim('height', 'the section height (along z)', '0.2');
  const offset = (key: string) => readNumberOr(ck, get(s, key), join(path, key), `the section's ${key}`, { unit: 'm' }, 0, 'not given: centred on the duct axis');
  const offsetY = offset('offsetY');
  const offsetZ = offset('offsetZ');
  if (name === undefined || length === undefined || width === undefined || height === undefined || offsetY === undefined || offsetZ === undefined) return undefined;
  return { name, length, width, height, offsetY, offsetZ };
}

function readBranch(ck: Checker, value: unknown, path: string): NormalisedBranch | undefined {
  const b = readObject(ck, value, path, 'a side branch');
  if (b === undefined) return undefined;
  const name = readName(ck, b, path, 'branch');
  const sectionWhat = 'the name of the section the branch stands on';
  const section = readString(ck, required(ck, b, path, 'section', sectionWhat, '"inlet"'), join(path, 'section'), sectionWhat, { maxLength: LIMITS.maxNameLength });
  const at = readNumber(ck, required(ck, b, path, 'at', 'the branch centre (m from the section start)', '0.3'), join(path, 'at'), 'the branch centre', { unit: 'm' });
  const side = readEnum(ck, required(ck, b, path, 'side', 'the wall the branch stands on', '"+y"'), join(path, 'side'), 'the side', BRANCH_SIDES);
  const dim = (key: string, what: string) => readNumber(ck, required(ck, b, path, key, what, '0.1'), join(path, key), what, LENGTH);
  const length = dim('length', 'the branch length (outward from the wall)');
  const width = dim('width', 'the branch width (along x)');
  const height = dim('height', 'the branch height (across the wall)');
  const end = readEnumOr(ck, get(b, 'end'), join(path, 'end'), 'the branch end', BRANCH_ENDS, 'closed', 'not given: a rigid closed end');
  if (name === undefined || section === undefined || at === undefined || side === undefined || length === undefined
    || width === undefined || height === undefined || end === undefined) return undefined;
  return { name, section, at, side, length, width, height, end };
}

function readOutlet(ck: Checker, value: Found): Termination | undefined {
  if (value === MISSING) {
    ck.usedDefault('duct.outlet', 'anechoic', 'not given: the duct continues beyond the outlet without reflection');
    return 'anechoic';
  }
  return readBoundary(ck, value, 'duct.outlet', 'the outlet termination', TERMINATION_WORDS as readonly ('anechoic' | 'rigid')[]);
}

function readIncident(ck: Checker, value: Found): NormalisedDuct['incident'] | undefined {
  if (value === MISSING) {
    ck.usedDefault('duct.incident', { mode: [0, 0], amplitudePa: 1 }, 'not given: a plane wave of 1 Pa');
    return { mode: [0, 0], amplitudePa: 1 };
  }
  const inc = readObject(ck, value, 'duct.incident', 'the incident wave');
  if (inc === undefined) return undefined;
  const rawMode = get(inc, 'mode');
  const mode = rawMode === MISSING ? [0, 0]
    : readNumbers(ck, rawMode, 'duct.incident.mode', 'the incident mode [m, n]', 2, { integer: true, min: 0 },
      (i) => (i === 0 ? 'the mode order across the width (m)' : 'the mode order across the height (n)'));
  if (rawMode === MISSING) ck.usedDefault('duct.incident.mode', [0, 0], 'not given: the plane wave');
  const amplitudePa = readNumberOr(ck, get(inc, 'amplitudePa'), 'duct.incident.amplitudePa', 'the incident amplitude',
    { unit: 'Pa', above: 0 }, 1, 'not given: 1 Pa peak');
  if (mode === undefined || amplitudePa === undefined) return undefined;
  return { mode: [mode[0], mode[1]], amplitudePa };
}
