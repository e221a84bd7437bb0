/**
 * Where linings stand: each lined face of a section becomes a slab of porous material inside the
 * section, against that wall, taken out of the section's air space. The validator checks these slabs
 * and the geometry hands them to the mesher, so both see the same linings.
 *
 * Corners, so that slabs never overlap and no corner is left unlined:
 * - ±y slabs run the section's full length and full height;
 * - ±z slabs run its full length and fit between the ±y slabs;
 * - ±x slabs (end walls) fill the cross-section inside the side slabs, less the opening into the
 *   neighbouring section, over `thickness` at that end. At the duct's closed outlet there is no
 *   neighbour and the slab closes the whole cross-section (a layer on the rigid or impedance end).
 *
 * The ports' straight runs must stay air: the incident wave is launched and the reflection measured in
 * the first section, the transmitted power in the last one when the outlet is anechoic.
 */
import { overlapAlong, SNAP_TOLERANCE } from '../core/space.ts';
import type { TaggedBox } from './box.ts';
import type { NormalisedLining, NormalisedSection, Side, Termination } from './types.ts';

const TOL = SNAP_TOLERANCE;

export interface LinedFace { lining: number; faceIndex: number; face: Side; thickness: number }

export interface LiningSlab extends LinedFace {
  section: number;
  /** The slab as one or more boxes (an end wall with an opening in it takes up to four). */
  pieces: TaggedBox[];
}

export interface LiningProblem extends LinedFace { rule: string; statement: string; fix: string }

export interface LinedDuct {
  sections: readonly NormalisedSection[];
  /** The sections' boxes, as laid out (duct-layout.ts). */
  sectionBoxes: readonly TaggedBox[];
  branches: readonly { name: string; section: string; box: TaggedBox }[];
  outlet: Termination;
}

export function liningTag(section: string, face: Side): string {
  return `lining:${section}:${face}`;
}

export function layOutLinings(duct: LinedDuct, linings: readonly NormalisedLining[]): { slabs: LiningSlab[]; problems: LiningProblem[] } {
  const slabs: LiningSlab[] = [], problems: LiningProblem[] = [];
  duct.sections.forEach((section, s) => {
    const faces = facesOf(section.name, linings);
    for (const lined of faces.values()) {
      const problem = portProblem(duct, s, lined);
      if (problem) { problems.push(problem); continue; }
      const pieces = slabPieces(duct, s, lined, faces);
      const trouble = pieces.length === 0 ? emptyEndWall(duct, s, lined) : coveredBranch(duct, s, lined, pieces);
      if (trouble) problems.push(trouble);
      else slabs.push({ ...lined, section: s, pieces });
    }
  });
  return { slabs, problems };
}

/** The lined faces of one section; a face lined twice (refused by the validator) keeps its first lining. */
function facesOf(section: string, linings: readonly NormalisedLining[]): Map<Side, LinedFace> {
  const faces = new Map<Side, LinedFace>();
  linings.forEach((l, lining) => {
    if (l.section !== section) return;
    l.faces.forEach((face, faceIndex) => {
      if (!faces.has(face)) faces.set(face, { lining, faceIndex, face, thickness: l.thickness });
    });
  });
  return faces;
}

function portProblem(duct: LinedDuct, s: number, lined: LinedFace): LiningProblem | undefined {
  const name = duct.sections[s].name, last = duct.sections.length - 1, side = lined.face[1] !== 'x';
  const problem = (rule: string, statement: string, fix: string) => ({ ...lined, rule, statement, fix });
  if (s === 0 && lined.face === '-x') {
    return problem('lining-inlet-run', `face -x of section "${name}" is the duct's inlet, where the incident wave enters: an opening, not a wall`, 'remove "-x" from the faces');
  }
  if (s === 0 && side) {
    return problem('lining-inlet-run', `the inlet section "${name}" must be unlined air along its length: the incident wave is launched and the reflection measured in its straight run`,
      `add an unlined section ahead of "${name}" to be the inlet, or line a later section`);
  }
  if (s !== last || duct.outlet !== 'anechoic') return undefined;
  if (lined.face === '+x') {
    return problem('lining-outlet-run', `face +x of section "${name}" is the duct's anechoic outlet: an opening, not a wall`,
      'remove "+x" from the faces, or close the outlet ("rigid", or an absorption or impedance) to line its end wall');
  }
  if (side) {
    return problem('lining-outlet-run', `the outlet section "${name}" must be unlined air along its length: the transmitted power is measured in its straight run`,
      `add an unlined section after "${name}" to be the outlet, or line an earlier section`);
  }
  return undefined;
}

function slabPieces(duct: LinedDuct, s: number, lined: LinedFace, faces: Map<Side, LinedFace>): TaggedBox[] {
  const box = duct.sectionBoxes[s], t = lined.thickness, tag = liningTag(duct.sections[s].name, lined.face);
  const inset = (face: Side) => faces.get(face)?.thickness ?? 0;
  const y0 = box.y0 + inset('-y'), y1 = box.y1 - inset('+y'), z0 = box.z0 + inset('-z'), z1 = box.z1 - inset('+z');
  switch (lined.face) {
    case '-y': return [{ ...box, y1: box.y0 + t, tag }];
    case '+y': return [{ ...box, y0: box.y1 - t, tag }];
    case '-z': return [{ ...box, y0, y1, z1: box.z0 + t, tag }];
    case '+z': return [{ ...box, y0, y1, z0: box.z1 - t, tag }];
    default: {
      const low = lined.face === '-x', x0 = low ? box.x0 : box.x1 - t, x1 = low ? box.x0 + t : box.x1;
      const neighbour = duct.sectionBoxes[low ? s - 1 : s + 1];
      return rectMinus({ y0, y1, z0, z1 }, neighbour).map((r) => ({ x0, x1, ...r, tag }));
    }
  }
}

interface YZ { y0: number; y1: number; z0: number; z1: number }

/** The rectangle r less the cross-section of `hole` (when there is one), as up to four rectangles. */
function rectMinus(r: YZ, hole: YZ | undefined): YZ[] {
  if (hole === undefined) return [r];
  const h = { y0: Math.max(r.y0, hole.y0), y1: Math.min(r.y1, hole.y1), z0: Math.max(r.z0, hole.z0), z1: Math.min(r.z1, hole.z1) };
  if (h.y1 - h.y0 <= TOL || h.z1 - h.z0 <= TOL) return [r];
  const out: YZ[] = [
    { ...r, y1: h.y0 }, { ...r, y0: h.y1 }, // full-height strips beside the hole
    { y0: h.y0, y1: h.y1, z0: r.z0, z1: h.z0 }, { y0: h.y0, y1: h.y1, z0: h.z1, z1: r.z1 }, // above and below it
  ];
  return out.filter((q) => q.y1 - q.y0 > TOL && q.z1 - q.z0 > TOL);
}

function emptyEndWall(duct: LinedDuct, s: number, lined: LinedFace): LiningProblem {
  const name = duct.sections[s].name, other = duct.sections[lined.face === '-x' ? s - 1 : s + 1].name;
  return {
    ...lined, rule: 'lining-end-wall',
    statement: `face ${lined.face} of section "${name}" has no wall to line: the opening into section "${other}" covers all of it inside the side linings`,
    fix: `remove "${lined.face}" from the faces (where "${other}" is the larger section, the end wall is one of its faces)`,
  };
}

/** A slab that meets a branch's mouth over an area would put porous material across it. */
function coveredBranch(duct: LinedDuct, s: number, lined: LinedFace, pieces: TaggedBox[]): LiningProblem | undefined {
  const name = duct.sections[s].name;
  const branch = duct.branches.find((b) => b.section === name && pieces.some((p) => coversArea(p, b.box)));
  if (branch === undefined) return undefined;
  return {
    ...lined, rule: 'lining-covers-branch',
    statement: `the lining on face ${lined.face} of section "${name}" would cover part of the mouth of branch "${branch.name}"`,
    fix: `leave face ${lined.face} unlined, or move the branch to a face that is not lined`,
  };
}

function coversArea(a: TaggedBox, b: TaggedBox): boolean {
  const o = (['x', 'y', 'z'] as const).map((axis) => overlapAlong(a, b, axis));
  return o.every((v) => v >= -TOL) && o.filter((v) => v > TOL).length >= 2;
}
