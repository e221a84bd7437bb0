/** Axis-aligned boxes and the few relations between them that the duct rules and the geometry need. */

/** An air box, metres; tag = the section or branch name, or "room". */
export interface Box {
  x0: number;
  x1: number;
  y0: number;
  y1: number;
  z0: number;
  z1: number;
  tag: string;
}

export type Axis = 'x' | 'y' | 'z';

/** Coordinates closer than this are the same coordinate, m: far below any real dimension, far above rounding. */
export const SNAP_TOLERANCE = 1e-9;

export function lower(box: Box, axis: Axis): number {
  return axis === 'x' ? box.x0 : axis === 'y' ? box.y0 : box.z0;
}

export function upper(box: Box, axis: Axis): number {
  return axis === 'x' ? box.x1 : axis === 'y' ? box.y1 : box.z1;
}

/** Length of the overlap of the two boxes' extents along `axis` (negative when apart). */
export function overlapAlong(a: Box, b: Box, axis: Axis): number {
  return Math.min(upper(a, axis), upper(b, axis)) - Math.max(lower(a, axis), lower(b, axis));
}

/** True when the closed boxes meet at all — a shared face, edge or corner counts. */
export function boxesMeet(a: Box, b: Box): boolean {
  return (['x', 'y', 'z'] as const).every((axis) => overlapAlong(a, b, axis) >= -SNAP_TOLERANCE);
}

export function boundingBox(boxes: readonly Box[], tag: string): Box {
  return {
    x0: Math.min(...boxes.map((b) => b.x0)),
    x1: Math.max(...boxes.map((b) => b.x1)),
    y0: Math.min(...boxes.map((b) => b.y0)),
    y1: Math.max(...boxes.map((b) => b.y1)),
    z0: Math.min(...boxes.map((b) => b.z0)),
    z1: Math.max(...boxes.map((b) => b.z1)),
    tag,
  };
}
