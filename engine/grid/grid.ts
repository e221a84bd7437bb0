/**
 * The structured hexahedral grid: a tensor grid over the bounding box of the air, whose breakpoints
 * include every box face, graded so that elements meet a points-per-wavelength rule, with absorbing-layer
 * cells added beyond every face of the bounding box that has an opening, and a cell mask (air or solid).
 *
 * Cell (i, j, k) has linear index i + nx(j + ny k). Along each axis a cell is either physical or a layer
 * cell on the low (−1) or high (+1) side, `layerIndex` counting from the interface outward. A layer cell is
 * air when the physical cell it projects onto (clamping each index into the physical range) is air and
 * lies against an opening on every side it was pushed out of: face layers stretch one axis, edge layers
 * two, corner layers three.
 */
import { sideAxis, sideSign, SNAP_TOLERANCE, type Box, type FaceRect, type Side } from '../core/space.ts';

/** A rectangle on a face of the bounding box through which air continues without end. */
export interface GridOpening { side: Side; rect: FaceRect }

export interface GridSpec {
  order: number;
  boxes: Box[];
  openings: GridOpening[];
  maxElementSize: number; // m, from the points-per-wavelength rule at the top frequency
  layerCount: number; // layer elements on each side with an opening
  layerThickness?: number; // m per layer element; default: the adjacent physical element size
  extraBreakpoints?: { x?: number[]; y?: number[]; z?: number[] };
}

export interface GridAxis {
  nodes: Float64Array; // ncell + 1 element boundaries, ascending
  layerSide: Int8Array; // ncell: 0 physical, −1 low-side layer, +1 high-side layer
  layerIndex: Int8Array; // ncell: 0 at the interface, growing outward; −1 for physical cells
  physLo: number; // first physical cell
  physHi: number; // one past the last physical cell
}

export interface Grid {
  order: number;
  axes: [GridAxis, GridAxis, GridAxis];
  dims: [number, number, number]; // cells per axis
  air: Uint8Array; // nCells: 1 air, 0 solid
  box: Int16Array; // nCells: index of the air box a physical cell lies in (−1 otherwise); layer cells take their projection's
}

const SNAP = SNAP_TOLERANCE;

function uniqueSorted(values: number[]): number[] {
  const v = values.filter(Number.isFinite).sort((a, b) => a - b), out: number[] = [];
  for (const x of v) if (out.length === 0 || x - out[out.length - 1] > SNAP) out.push(x);
  return out;
}

/** The element boundaries of an axis: every breakpoint kept, each interval split into equal elements no longer than hmax. */
export function subdivide(breaks: number[], hmax: number): number[] {
  const nodes = [breaks[0]];
  for (let i = 1; i < breaks.length; i++) {
    const a = breaks[i - 1], len = breaks[i] - a, m = Math.max(1, Math.ceil(len / hmax - 1e-9));
    for (let k = 1; k <= m; k++) nodes.push(k === m ? breaks[i] : a + (len * k) / m);
  }
  return nodes;
}

function buildAxis(breaks: number[], hmax: number, lo: number, hi: number, thickness: number | undefined): GridAxis {
  const phys = subdivide(breaks, hmax);
  const hLo = thickness ?? phys[1] - phys[0], hHi = thickness ?? phys[phys.length - 1] - phys[phys.length - 2];
  const nodes: number[] = [];
  for (let j = lo; j >= 1; j--) nodes.push(phys[0] - j * hLo);
  nodes.push(...phys);
  for (let j = 1; j <= hi; j++) nodes.push(phys[phys.length - 1] + j * hHi);
  const ncell = nodes.length - 1, layerSide = new Int8Array(ncell), layerIndex = new Int8Array(ncell).fill(-1);
  for (let j = 0; j < lo; j++) { layerSide[lo - 1 - j] = -1; layerIndex[lo - 1 - j] = j; }
  for (let j = 0; j < hi; j++) { layerSide[lo + phys.length - 1 + j] = 1; layerIndex[lo + phys.length - 1 + j] = j; }
  return { nodes: Float64Array.from(nodes), layerSide, layerIndex, physLo: lo, physHi: lo + phys.length - 1 };
}

export function buildGrid(spec: GridSpec): Grid {
  if (spec.boxes.length === 0) throw new Error('buildGrid: no air boxes');
  const keys = [['x0', 'x1'], ['y0', 'y1'], ['z0', 'z1']] as const;
  const extra = [spec.extraBreakpoints?.x ?? [], spec.extraBreakpoints?.y ?? [], spec.extraBreakpoints?.z ?? []];
  const axes = [0, 1, 2].map((d) => {
    const breaks = uniqueSorted([...spec.boxes.flatMap((b) => [b[keys[d][0]], b[keys[d][1]]]), ...extra[d]]);
    const lo = spec.openings.some((o) => sideAxis(o.side) === d && sideSign(o.side) < 0) ? spec.layerCount : 0;
    const hi = spec.openings.some((o) => sideAxis(o.side) === d && sideSign(o.side) > 0) ? spec.layerCount : 0;
    return buildAxis(breaks, spec.maxElementSize, lo, hi, spec.layerThickness);
  }) as [GridAxis, GridAxis, GridAxis];
  const dims = axes.map((a) => a.nodes.length - 1) as [number, number, number];
  const nCells = dims[0] * dims[1] * dims[2];
  const air = new Uint8Array(nCells), box = new Int16Array(nCells).fill(-1);
  const physBox = physicalBoxes(spec.boxes, axes);
  const idx = [0, 0, 0], proj = [0, 0, 0];
  for (let k = 0; k < dims[2]; k++) for (let j = 0; j < dims[1]; j++) for (let i = 0; i < dims[0]; i++) {
    idx[0] = i; idx[1] = j; idx[2] = k;
    for (let d = 0; d < 3; d++) proj[d] = Math.min(Math.max(idx[d], axes[d].physLo), axes[d].physHi - 1);
    const pb = physBox(proj[0], proj[1], proj[2]);
    if (pb < 0) continue;
    let ok = true;
    for (let d = 0; d < 3 && ok; d++) {
      const side = axes[d].layerSide[idx[d]];
      if (side !== 0) ok = againstOpening(spec.openings, axes, proj, d, side);
    }
    if (!ok) continue;
    const c = i + dims[0] * (j + dims[1] * k);
    air[c] = 1;
    box[c] = pb;
  }
  return { order: spec.order, axes, dims, air, box };
}

function physicalBoxes(boxes: Box[], axes: GridAxis[]): (i: number, j: number, k: number) => number {
  const mid = (d: number, i: number) => 0.5 * (axes[d].nodes[i] + axes[d].nodes[i + 1]);
  return (i, j, k) => {
    const x = mid(0, i), y = mid(1, j), z = mid(2, k);
    return boxes.findIndex((b) => x > b.x0 && x < b.x1 && y > b.y0 && y < b.y1 && z > b.z0 && z < b.z1);
  };
}

function againstOpening(openings: GridOpening[], axes: GridAxis[], proj: number[], d: number, side: number): boolean {
  const others = [0, 1, 2].filter((e) => e !== d);
  const ca = 0.5 * (axes[others[0]].nodes[proj[others[0]]] + axes[others[0]].nodes[proj[others[0]] + 1]);
  const cb = 0.5 * (axes[others[1]].nodes[proj[others[1]]] + axes[others[1]].nodes[proj[others[1]] + 1]);
  return openings.some((o) => sideAxis(o.side) === d && sideSign(o.side) === side && ca > o.rect.a0 && ca < o.rect.a1 && cb > o.rect.b0 && cb < o.rect.b1);
}

export function cellIndex(g: Grid, i: number, j: number, k: number): number {
  return i + g.dims[0] * (j + g.dims[1] * k);
}
