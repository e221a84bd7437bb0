/**
 * The shapes of space every layer shares: axes, axis-aligned boxes, the six sides of a box and the wall
 * keys of a room file, the rectangle of a face, and a duct's cross-section. Coordinates in metres.
 *
 *        z
 *        |  y          side '-x' is the face at x = x0 (outward normal −x), '+x' at x = x1, and so on;
 *        | /           a room file keys its walls by axis then end ("x-" is the wall at x = 0):
 *        |/____ x      wallSide('x-') = '-x'.
 *
 * A face rectangle {a0, a1, b0, b1} spans the two axes other than the normal, in x, y, z order (for ±x:
 * a = y, b = z). A cross-section {y0, y1, z0, z1} is a rectangle normal to x, the axis every duct runs along.
 */

export type Axis = 'x' | 'y' | 'z';
/** An axis by index: 0 = x, 1 = y, 2 = z (the order of every [x, y, z] triple). */
export type AxisIndex = 0 | 1 | 2;
export const AXES: readonly Axis[] = ['x', 'y', 'z'];

/** The in-plane axes of a plane normal to `axis`, in x, y, z order (normal x: y and z; normal y: x and z; normal z: x and y). */
export function planeAxes(axis: AxisIndex): [AxisIndex, AxisIndex] {
  return axis === 0 ? [1, 2] : axis === 1 ? [0, 2] : [0, 1];
}

export interface Box { x0: number; x1: number; y0: number; y1: number; z0: number; z1: number }

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
  return AXES.every((axis) => overlapAlong(a, b, axis) >= -SNAP_TOLERANCE);
}

/** The smallest box holding every box given. */
export function boundsOf(boxes: readonly Box[]): Box {
  return {
    x0: Math.min(...boxes.map((b) => b.x0)),
    x1: Math.max(...boxes.map((b) => b.x1)),
    y0: Math.min(...boxes.map((b) => b.y0)),
    y1: Math.max(...boxes.map((b) => b.y1)),
    z0: Math.min(...boxes.map((b) => b.z0)),
    z1: Math.max(...boxes.map((b) => b.z1)),
  };
}

/** A side of a box by its outward normal. */
export type Side = '-x' | '+x' | '-y' | '+y' | '-z' | '+z';
export const SIDES: readonly Side[] = ['-x', '+x', '-y', '+y', '-z', '+z'];
export function sideAxis(s: Side): AxisIndex { return s[1] === 'x' ? 0 : s[1] === 'y' ? 1 : 2; }
export function sideSign(s: Side): -1 | 1 { return s[0] === '-' ? -1 : 1; }

/** A room wall as the scenario file names it: axis, then end ("x-" is the wall at x = 0). */
export type WallKey = 'x-' | 'x+' | 'y-' | 'y+' | 'z-' | 'z+';
export const WALL_KEYS: readonly WallKey[] = ['x-', 'x+', 'y-', 'y+', 'z-', 'z+'];

export function wallSide(key: WallKey): Side {
  return `${key[1]}${key[0]}` as Side;
}

/** A rectangle in the two axes other than a face's normal, in x, y, z order. */
export interface FaceRect { a0: number; a1: number; b0: number; b1: number }

/** The face of `box` on `side`. */
export function faceRect(box: Box, side: Side): FaceRect {
  const axis = side[1];
  if (axis === 'x') return { a0: box.y0, a1: box.y1, b0: box.z0, b1: box.z1 };
  if (axis === 'y') return { a0: box.x0, a1: box.x1, b0: box.z0, b1: box.z1 };
  return { a0: box.x0, a1: box.x1, b0: box.y0, b1: box.y1 };
}

/** A rectangle normal to x: a duct's cross-section, a port, a measurement plane. */
export interface CrossSection { y0: number; y1: number; z0: number; z1: number }

/** The cross-section of anything that has one (a box, a section layout), as a plain rectangle. */
export function crossSectionOf(r: CrossSection): CrossSection {
  return { y0: r.y0, y1: r.y1, z0: r.z0, z1: r.z1 };
}

export function crossSectionArea(r: CrossSection): number {
  return (r.y1 - r.y0) * (r.z1 - r.z0);
}
