/**
 * Where the parts of a duct stand: sections one after another along +x from x = 0, each centred at
 * (offsetY, offsetZ); a branch as a box standing out of its section's wall. The validator checks
 * these boxes and the geometry hands them to the mesher, so both see the same duct.
 */
import type { Axis } from '../core/space.ts';
import type { TaggedBox } from './box.ts';
import type { BranchSide, NormalisedBranch, NormalisedSection } from './types.ts';

export function layOutSections(sections: readonly NormalisedSection[]): TaggedBox[] {
  let x = 0;
  return sections.map((s) => {
    const box = {
      x0: x,
      x1: x + s.length,
      y0: s.offsetY - s.width / 2,
      y1: s.offsetY + s.width / 2,
      z0: s.offsetZ - s.height / 2,
      z1: s.offsetZ + s.height / 2,
      tag: s.name,
    };
    x += s.length;
    return box;
  });
}

/** The axis a side faces along, and +1 or −1 for its direction. */
export function sideAxis(side: BranchSide): { axis: Axis; sign: 1 | -1 } {
  return { axis: side[1] as Axis, sign: side[0] === '+' ? 1 : -1 };
}

/** The section's extent across the wall a branch stands on, along the branch's "height" axis. */
export function wallSpan(side: BranchSide, section: NormalisedSection): { axis: Axis; size: number; centre: number } {
  return sideAxis(side).axis === 'y'
    ? { axis: 'z', size: section.height, centre: section.offsetZ }
    : { axis: 'y', size: section.width, centre: section.offsetY };
}

export function layOutBranch(branch: NormalisedBranch, section: NormalisedSection, sectionBox: TaggedBox): TaggedBox {
  const xc = sectionBox.x0 + branch.at;
  const { axis, sign } = sideAxis(branch.side);
  const span = wallSpan(branch.side, section);
  const wall = sign > 0 ? (axis === 'y' ? sectionBox.y1 : sectionBox.z1) : axis === 'y' ? sectionBox.y0 : sectionBox.z0;
  const out: [number, number] = sign > 0 ? [wall, wall + branch.length] : [wall - branch.length, wall];
  const across: [number, number] = [span.centre - branch.height / 2, span.centre + branch.height / 2];
  const [y, z] = axis === 'y' ? [out, across] : [across, out];
  return { x0: xc - branch.width / 2, x1: xc + branch.width / 2, y0: y[0], y1: y[1], z0: z[0], z1: z[1], tag: branch.name };
}
