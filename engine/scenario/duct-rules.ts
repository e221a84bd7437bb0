/**
 * Rules between the parts of a duct, checked on the boxes the mesher will receive: the duct is one
 * connected airway, every branch stands on its own section and nowhere else, and an open branch end
 * faces free space (its absorbing layer must not run into another part of the duct).
 */
import { cutOnFrequency } from '../acoustics/index.ts';
import { item, type Checker } from './checker.ts';
import { boxesMeet, lower, overlapAlong, SNAP_TOLERANCE, upper } from '../core/space.ts';
import type { TaggedBox } from './box.ts';
import { layOutBranch, layOutSections, sideAxis, wallSpan } from './duct-layout.ts';
import { num } from './issues.ts';
import { didYouMean } from './suggest.ts';
import type { NormalisedBranch, NormalisedSection } from './types.ts';

const TOL = SNAP_TOLERANCE;

export interface DuctContext {
  /** Highest swept frequency, when the sweep read cleanly. */
  sweepTopHz?: number;
  sweepBottomHz?: number;
  soundSpeed?: number;
  mode?: [number, number];
}

interface PlacedBranch {
  branch: NormalisedBranch;
  index: number;
  box: TaggedBox;
  sectionIndex: number;
}

export function checkDuctRules(ck: Checker, sections: NormalisedSection[], branches: (NormalisedBranch | undefined)[], context: DuctContext): void {
  const boxes = layOutSections(sections);
  checkUniqueNames(ck, sections, branches);
  checkConnected(ck, sections, boxes);
  const placed = placeBranches(ck, sections, boxes, branches);
  checkClearance(ck, placed, boxes, sections);
  checkOpenEnds(ck, placed, boxes);
  checkPortModes(ck, sections, context);
}

function checkUniqueNames(ck: Checker, sections: NormalisedSection[], branches: (NormalisedBranch | undefined)[]): void {
  const seen = new Map<string, string>();
  const note = (name: string, path: string) => {
    const first = seen.get(name);
    if (first === undefined) seen.set(name, path);
    else ck.error(path, name, 'unique-name', `the name "${name}" is already used by ${first}; section and branch names label the parts and must differ`, 'give this part a name of its own');
  };
  sections.forEach((s, i) => note(s.name, `${item('duct.sections', i)}.name`));
  branches.forEach((b, i) => b !== undefined && note(b.name, `${item('duct.branches', i)}.name`));
}

function checkConnected(ck: Checker, sections: NormalisedSection[], boxes: TaggedBox[]): void {
  for (let i = 1; i < boxes.length; i++) {
    const a = boxes[i - 1], b = boxes[i];
    const apartY = overlapAlong(a, b, 'y') <= TOL, apartZ = overlapAlong(a, b, 'z') <= TOL;
    if (!apartY && !apartZ) continue;
    const key = apartY ? 'offsetY' : 'offsetZ';
    const axis = apartY ? 'y' : 'z';
    const range = (box: TaggedBox) => `${axis} ${num(lower(box, axis))}…${num(upper(box, axis))} m`;
    ck.error(`${item('duct.sections', i)}.${key}`, sections[i][key], 'sections-connected',
      `sections "${a.tag}" and "${b.tag}" do not connect: their cross-sections do not overlap (${range(a)} against ${range(b)}), so the duct is cut in two`,
      `change ${key} of "${b.tag}" (or its ${apartY ? 'width' : 'height'}) so that its cross-section overlaps that of "${a.tag}"`);
  }
}

/** Branches on a known section, inside its length and on its wall; the others are reported and dropped. */
function placeBranches(ck: Checker, sections: NormalisedSection[], boxes: TaggedBox[], branches: (NormalisedBranch | undefined)[]): PlacedBranch[] {
  const placed: PlacedBranch[] = [];
  branches.forEach((branch, index) => {
    if (branch === undefined) return;
    const path = item('duct.branches', index);
    const sectionIndex = sections.findIndex((s) => s.name === branch.section);
    if (sectionIndex < 0) {
      const names = sections.map((s) => s.name);
      ck.error(`${path}.section`, branch.section, 'branch-section', 'a branch must stand on one of the duct sections, and no section has this name',
        `${didYouMean(branch.section, names)}use one of: ${names.map((n) => `"${n}"`).join(', ')}`);
      return;
    }
    const section = sections[sectionIndex];
    if (fitsAlong(ck, branch, section, path) && fitsAcross(ck, branch, section, path)) {
      placed.push({ branch, index, sectionIndex, box: layOutBranch(branch, section, boxes[sectionIndex]) });
    }
  });
  return placed;
}

function fitsAlong(ck: Checker, branch: NormalisedBranch, section: NormalisedSection, path: string): boolean {
  const half = branch.width / 2;
  if (branch.width > section.length + TOL) {
    ck.error(`${path}.width`, branch.width, 'branch-inside-section',
      `the branch is wider (along x) than section "${section.name}" is long (${num(section.length)} m)`,
      `set width to at most ${num(section.length)}, or stand the branch on a longer section`);
    return false;
  }
  if (branch.at - half < -TOL || branch.at + half > section.length + TOL) {
    ck.error(`${path}.at`, branch.at, 'branch-inside-section',
      `the branch centre must lie inside section "${section.name}" (0 < at < ${num(section.length)} m, and the branch width must fit)`,
      `set at between ${num(half)} and ${num(section.length - half)}`);
    return false;
  }
  return true;
}

function fitsAcross(ck: Checker, branch: NormalisedBranch, section: NormalisedSection, path: string): boolean {
  const span = wallSpan(branch.side, section);
  if (branch.height <= span.size + TOL) return true;
  const dimension = span.axis === 'z' ? 'height' : 'width';
  ck.error(`${path}.height`, branch.height, 'branch-fits-wall',
    `the branch cross-section must fit on the ${branch.side} wall of section "${section.name}": its height (along ${span.axis}) may be at most the section's ${dimension}, ${num(span.size)} m`,
    `set height to at most ${num(span.size)}`);
  return false;
}

/** A branch touches nothing but its own section: any other contact would be an air path the duct does not have. */
function checkClearance(ck: Checker, placed: PlacedBranch[], boxes: TaggedBox[], sections: NormalisedSection[]): void {
  placed.forEach((p, k) => {
    const path = `${item('duct.branches', p.index)}.at`;
    boxes.forEach((box, s) => {
      if (s === p.sectionIndex || !boxesMeet(p.box, box)) return;
      ck.error(path, p.branch.at, 'branch-clear',
        `branch "${p.branch.name}" reaches the end of section "${p.branch.section}" and touches section "${box.tag}", which would open an air path between them`,
        `move the branch off that end (at strictly between ${num(p.branch.width / 2)} and ${num(sections[p.sectionIndex].length - p.branch.width / 2)}), or make it narrower`);
    });
    for (const q of placed.slice(0, k)) {
      if (!boxesMeet(p.box, q.box)) continue;
      const sameSide = q.sectionIndex === p.sectionIndex && q.branch.side === p.branch.side;
      ck.error(path, p.branch.at, sameSide ? 'branches-overlap' : 'branch-clear',
        `branch "${p.branch.name}" (x ${num(p.box.x0)}…${num(p.box.x1)} m) ${sameSide ? `overlaps or touches branch "${q.branch.name}" on the ${q.branch.side} side` : `touches branch "${q.branch.name}"`} (x ${num(q.box.x0)}…${num(q.box.x1)} m)`,
        shiftFix(p, q));
    }
  });
}

function shiftFix(p: PlacedBranch, q: PlacedBranch): string {
  const start = p.box.x0 - p.branch.at + p.branch.width / 2; // x of the section start
  const after = q.box.x1 - start + p.branch.width / 2;
  const before = q.box.x0 - start - p.branch.width / 2;
  return `set at above ${num(after)} or below ${num(before)} so that the two keep a gap, or move one to another side`;
}

/** An open end's absorbing layer extends outward from the bounding box: nothing may stand beyond it. */
function checkOpenEnds(ck: Checker, placed: PlacedBranch[], boxes: TaggedBox[]): void {
  const all = [...boxes, ...placed.map((p) => p.box)];
  for (const p of placed) {
    if (p.branch.end !== 'open') continue;
    const { axis, sign } = sideAxis(p.branch.side);
    const endAt = sign > 0 ? upper(p.box, axis) : lower(p.box, axis);
    const reach = (b: TaggedBox) => sign * ((sign > 0 ? upper(b, axis) : lower(b, axis)) - endAt);
    const beyond = all.filter((b) => b !== p.box && reach(b) > TOL).sort((a, b) => reach(b) - reach(a))[0];
    if (beyond === undefined) continue;
    ck.error(`${item('duct.branches', p.index)}.end`, 'open', 'open-end-outermost',
      `an open branch end must be the outermost part of the duct on its side (${p.branch.side}), but "${beyond.tag}" reaches ${axis} = ${num(sign > 0 ? upper(beyond, axis) : lower(beyond, axis))} m, beyond the end at ${axis} = ${num(endAt)} m`,
      `lengthen the branch to at least ${num(p.branch.length + reach(beyond))} m, or set end to "closed"`);
  }
}

/** Warnings where plane-wave ports stop telling the whole story, or the chosen incident mode does not propagate. */
function checkPortModes(ck: Checker, sections: NormalisedSection[], context: DuctContext): void {
  const { sweepTopHz: top, sweepBottomHz: bottom, soundSpeed: c, mode } = context;
  if (top === undefined || bottom === undefined || c === undefined) return;
  const ports: [string, NormalisedSection][] = [['inlet', sections[0]], ['outlet', sections[sections.length - 1]]];
  for (const [port, s] of ports) {
    const cutOn = c / (2 * Math.max(s.width, s.height));
    if (top <= cutOn) continue;
    // Rigid rectangular duct, first cross-mode f = c/(2·max(width, height)): Morse & Ingard, Theoretical Acoustics (1968).
    ck.warn('sweep', top, 'above-cut-on', `the sweep reaches ${num(top)} Hz, above the first cross-mode cut-on of the ${port} section "${s.name}" (${num(cutOn)} Hz): there higher modes propagate at the port as well as the plane wave`,
      `lower the top of the sweep below ${num(cutOn)} Hz, or read results above it with that in mind`);
  }
  if (mode === undefined || (mode[0] === 0 && mode[1] === 0)) return;
  const inlet = sections[0];
  const fmn = cutOnFrequency(inlet.width, inlet.height, c, mode[0], mode[1]);
  if (fmn <= bottom) return;
  ck.warn('duct.incident.mode', mode, 'incident-mode-cut-off',
    `mode (${mode[0]}, ${mode[1]}) of the inlet section cuts on at ${num(fmn)} Hz; below that it does not propagate and carries no power into the duct${fmn > top ? ', which is the whole sweep' : ''}`,
    fmn > top ? 'choose mode [0, 0], or sweep above the cut-on frequency' : `start the sweep above ${num(fmn)} Hz, or read the points below it as empty`);
}
