/**
 * The geometry the mesher consumes: air boxes, their bounding box, the openings through which air
 * continues anechoically (where absorbing layers attach), the sorted coordinates of every box face
 * (grid lines must pass through them), and the ports of a duct or the layout of a room.
 * All coordinates pass through one snap per axis, so faces meant to coincide are equal numbers.
 *
 * Linings are boxes too, listed before the sections (where boxes overlap the first listed decides the
 * medium): each lined face a slab (lining-layout.ts), cut finer where the material's wavelength is
 * shorter than the air's at the mesh's density (lining-slices.ts). So the boxes depend on the mesh
 * settings and the sweep as well as on the duct.
 */
import { crossSectionOf, faceRect, wallSide, WALL_KEYS, type CrossSection, type FaceRect } from '../core/space.ts';
import { boundingBox, type TaggedBox } from './box.ts';
import { layOutBranch, layOutSections } from './duct-layout.ts';
import { layOutLinings, type LiningSlab } from './lining-layout.ts';
import { airElementSize, liningCuts, liningElementSize, sliceBox } from './lining-slices.ts';
import { snapper, uniqueSorted } from './snap.ts';
import type {
  BranchEnd, BranchSide, LiningModel, NormalisedDuctScenario, NormalisedRoomScenario, NormalisedScenario, ReceiverInput, RoomSourceInput,
  Side, Termination, WallCondition, WallKey,
} from './types.ts';

export type { TaggedBox } from './box.ts';

export interface Opening { side: Side; rect: FaceRect; name: string }

export interface SectionLayout extends CrossSection { name: string; x0: number; x1: number; width: number; height: number }

export interface BranchLayout { name: string; section: string; side: BranchSide; end: BranchEnd; box: TaggedBox }

export interface DuctPorts {
  /** x up to which the inlet section is a straight uniform unlined duct: the first branch edge or lining, or the section end. */
  inlet: { x: number; rect: CrossSection; clearTo: number };
  /**
   * x from which the outlet section is a straight uniform duct: the last branch edge, or the section start;
   * with an anechoic outlet also past any lining. A closed outlet measures nothing there, and the
   * validator lets its section be lined: linings then do not move clearFrom.
   */
  outlet: { x: number; rect: CrossSection; clearFrom: number; termination: Termination };
  sections: SectionLayout[];
  branches: BranchLayout[];
}

export interface RoomLayout {
  size: [number, number, number];
  walls: Record<WallKey, WallCondition>;
  sources: RoomSourceInput[];
  receivers: ReceiverInput[];
}

/** One lined face of one section, and the boxes of `Geometry.boxes` that hold its material. */
export interface LiningLayout {
  /** Index into the scenario's `linings`. */
  lining: number;
  section: string;
  face: Side;
  /** "lining:<section>:<face>", also the tag of its boxes. */
  tag: string;
  thickness: number;
  model: LiningModel;
  flowResistivity: number;
  library: string | null;
  boxes: number[];
  /** The slab's bounding box. */
  region: TaggedBox;
  /** Largest element edge the material calls for at the mesh's density, m; null when the air's grading is already finer. */
  elementSize: number | null;
}

export interface Geometry {
  kind: 'duct' | 'room';
  boxes: TaggedBox[];
  /** The lined faces; empty for a room and for an unlined duct. */
  linings: LiningLayout[];
  bounds: TaggedBox;
  openings: Opening[];
  /** Sorted unique coordinates of every box face, per axis. */
  breakpoints: { x: number[]; y: number[]; z: number[] };
  duct?: DuctPorts;
  room?: RoomLayout;
}

interface Snap { x: (v: number) => number; y: (v: number) => number; z: (v: number) => number }

export function buildGeometry(scenario: NormalisedScenario): Geometry {
  return scenario.kind === 'duct' ? ductGeometry(scenario) : roomGeometry(scenario);
}

function snapsFor(boxes: readonly TaggedBox[]): Snap {
  return {
    x: snapper(boxes.flatMap((b) => [b.x0, b.x1])),
    y: snapper(boxes.flatMap((b) => [b.y0, b.y1])),
    z: snapper(boxes.flatMap((b) => [b.z0, b.z1])),
  };
}

function snapBox(box: TaggedBox, s: Snap): TaggedBox {
  return { x0: s.x(box.x0), x1: s.x(box.x1), y0: s.y(box.y0), y1: s.y(box.y1), z0: s.z(box.z0), z1: s.z(box.z1), tag: box.tag };
}

function breakpointsOf(boxes: readonly TaggedBox[]): Geometry['breakpoints'] {
  return {
    x: uniqueSorted(boxes.flatMap((b) => [b.x0, b.x1])),
    y: uniqueSorted(boxes.flatMap((b) => [b.y0, b.y1])),
    z: uniqueSorted(boxes.flatMap((b) => [b.z0, b.z1])),
  };
}

function ductGeometry(scenario: NormalisedDuctScenario): Geometry {
  const { branches, outlet } = scenario.duct;
  const { sectionBoxes, branchBoxes, slabs } = snappedParts(scenario);
  const linings = liningBoxes(scenario, slabs, [...sectionBoxes, ...branchBoxes]);
  const boxes = [...linings.boxes, ...sectionBoxes, ...branchBoxes];
  const first = sectionBoxes[0], last = sectionBoxes[sectionBoxes.length - 1];
  const openings: Opening[] = [{ side: '-x', rect: faceRect(first, '-x'), name: 'inlet' }];
  if (outlet === 'anechoic') openings.push({ side: '+x', rect: faceRect(last, '+x'), name: 'outlet' });
  branches.forEach((b, i) => {
    if (b.end === 'open') openings.push({ side: b.side, rect: faceRect(branchBoxes[i], b.side), name: b.name });
  });
  const duct: DuctPorts = {
    ...ports(scenario, sectionBoxes, branchBoxes, linings.layouts),
    sections: sectionBoxes.map((b) => ({ name: b.tag, x0: b.x0, x1: b.x1, width: b.y1 - b.y0, height: b.z1 - b.z0, ...crossSectionOf(b) })),
    branches: branches.map((b, i) => ({ name: b.name, section: b.section, side: b.side, end: b.end, box: branchBoxes[i] })),
  };
  return { kind: 'duct', boxes, linings: linings.layouts, bounds: boundingBox(boxes, 'bounds'), openings, breakpoints: breakpointsOf(boxes), duct };
}

/** Sections, branches and lining slabs laid out, then snapped together so that faces meant to meet are equal. */
function snappedParts(scenario: NormalisedDuctScenario): { sectionBoxes: TaggedBox[]; branchBoxes: TaggedBox[]; slabs: LiningSlab[] } {
  const { sections, branches, outlet } = scenario.duct;
  const rawSections = layOutSections(sections);
  const rawBranches = branches.map((b) => {
    const i = sections.findIndex((s) => s.name === b.section);
    return layOutBranch(b, sections[i], rawSections[i]);
  });
  const placed = branches.map((b, i) => ({ name: b.name, section: b.section, box: rawBranches[i] }));
  const laid = layOutLinings({ sections, sectionBoxes: rawSections, branches: placed, outlet }, scenario.linings);
  if (laid.problems.length > 0) throw new Error(`buildGeometry: ${laid.problems[0].statement} (validate the scenario first)`);
  const snap = snapsFor([...rawSections, ...rawBranches, ...laid.slabs.flatMap((l) => l.pieces)]);
  return {
    sectionBoxes: rawSections.map((b) => snapBox(b, snap)),
    branchBoxes: rawBranches.map((b) => snapBox(b, snap)),
    slabs: laid.slabs.map((l) => ({ ...l, pieces: l.pieces.map((b) => snapBox(b, snap)) })),
  };
}

/** The ports and how far their runs are straight: up to the first branch or lining, from the last (linings only when measured). */
function ports(scenario: NormalisedDuctScenario, sectionBoxes: TaggedBox[], branchBoxes: TaggedBox[], linings: LiningLayout[]): Pick<DuctPorts, 'inlet' | 'outlet'> {
  const { branches, outlet } = scenario.duct, first = sectionBoxes[0], last = sectionBoxes[sectionBoxes.length - 1];
  const onSection = (name: string) => branchBoxes.filter((_, i) => branches[i].section === name);
  const lined = (name: string) => linings.filter((l) => l.section === name).map((l) => l.region);
  const outletLined = outlet === 'anechoic' ? lined(last.tag) : [];
  return {
    inlet: { x: first.x0, rect: crossSectionOf(first), clearTo: Math.min(first.x1, ...[...onSection(first.tag), ...lined(first.tag)].map((b) => b.x0)) },
    outlet: { x: last.x1, rect: crossSectionOf(last), clearFrom: Math.max(last.x0, ...[...onSection(last.tag), ...outletLined].map((b) => b.x1)), termination: outlet },
  };
}

/** The grid stores a cell's box index in 16 bits. */
const MAX_BOXES = 32_000;

/** The lining slabs as boxes, cut where the material needs finer elements than the air, with their layouts. */
function liningBoxes(scenario: NormalisedDuctScenario, slabs: LiningSlab[], others: TaggedBox[]): { boxes: TaggedBox[]; layouts: LiningLayout[] } {
  const rule = { order: scenario.mesh.order, pointsPerWavelength: scenario.mesh.pointsPerWavelength, frequenciesHz: scenario.sweep.frequenciesHz };
  const airSize = airElementSize(rule, scenario.air.soundSpeed);
  const sized = slabs.map((slab) => {
    const material = scenario.linings[slab.lining].material;
    return { slab, material, size: liningElementSize(rule, material.model, material.flowResistivity, scenario.air) };
  });
  const pieces = sized.flatMap((s) => s.slab.pieces.map((box) => ({ box, size: s.size })));
  const cuts = liningCuts(pieces, breakpointsOf([...others, ...pieces.map((p) => p.box)]), airSize);
  const boxes: TaggedBox[] = [];
  const layouts = sized.map(({ slab, size, material }): LiningLayout => {
    const start = boxes.length;
    for (const piece of slab.pieces) boxes.push(...sliceBox(piece, cuts));
    const tag = slab.pieces[0].tag;
    return {
      lining: slab.lining, section: scenario.duct.sections[slab.section].name, face: slab.face, tag, thickness: slab.thickness,
      model: material.model, flowResistivity: material.flowResistivity, library: material.library,
      boxes: Array.from({ length: boxes.length - start }, (_, i) => start + i), region: boundingBox(slab.pieces, tag), elementSize: size < airSize ? size : null,
    };
  });
  if (boxes.length + others.length > MAX_BOXES) {
    throw new Error(`buildGeometry: the linings need ${boxes.length} boxes to resolve the material's wavelength, more than the grid can index: lower the top of the sweep, the points per wavelength, or the lining's flow resistivity`);
  }
  return { boxes, layouts };
}

function roomGeometry(scenario: NormalisedRoomScenario): Geometry {
  const { size, walls, sources, receivers } = scenario.room;
  const room: TaggedBox = { x0: 0, x1: size[0], y0: 0, y1: size[1], z0: 0, z1: size[2], tag: 'room' };
  const openings = WALL_KEYS.filter((k) => walls[k] === 'open').map((k) => ({ side: wallSide(k), rect: faceRect(room, wallSide(k)), name: `wall ${k}` }));
  return {
    kind: 'room',
    boxes: [room],
    linings: [],
    bounds: { ...room, tag: 'bounds' },
    openings,
    breakpoints: breakpointsOf([room]),
    room: {
      size: copy3(size),
      walls: { ...walls },
      sources: sources.map((s) => ({ ...s, position: copy3(s.position) })),
      receivers: receivers.map((r) => ({ ...r, position: copy3(r.position) })),
    },
  };
}

function copy3(v: readonly [number, number, number]): [number, number, number] {
  return [v[0], v[1], v[2]];
}
