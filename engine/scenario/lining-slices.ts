/**
 * Porous material carries a shorter wave than the air, and a decaying one (|kc| > ω/c): a grid graded
 * for the air's wavelength would be too coarse inside a lining. So each lining's pieces are cut into
 * boxes no longer than the element size its own wavenumber calls for, and the faces of those boxes
 * become grid lines. The grid is a tensor grid: a cut refines the air on the same line too.
 *
 * Cuts subdivide the intervals between the grid's own breakpoints evenly (the finest lining over an
 * interval decides), so they never land next to an existing face and make a sliver of an element.
 */
import { porousWave, type PorousAir, type PorousModel } from '../acoustics/index.ts';
import { AXES, lower, maxElementSize, SNAP_TOLERANCE, upper, type Axis } from '../core/index.ts';
import type { TaggedBox } from './box.ts';
import { tidy, uniqueSorted } from './snap.ts';

const TOL = SNAP_TOLERANCE;

export interface MeshRule { order: number; pointsPerWavelength: number; frequenciesHz: readonly number[] }

/** The element size the grading rule gives for a wavenumber |k|: its wavelength 2π/|k|. */
function sizeFor(rule: MeshRule, wavenumber: number): number {
  return maxElementSize(rule.order, (2 * Math.PI) / wavenumber, rule.pointsPerWavelength);
}

/** The air's element size, exactly as the mesher grades it: the wavelength at the top of the sweep. */
export function airElementSize(rule: MeshRule, soundSpeed: number): number {
  return maxElementSize(rule.order, soundSpeed / Math.max(...rule.frequenciesHz), rule.pointsPerWavelength);
}

/** The largest element edge a lining needs: its largest |kc| over the sweep decides. */
export function liningElementSize(rule: MeshRule, model: PorousModel, flowResistivity: number, air: PorousAir): number {
  const magnitude = (f: number) => { const k = porousWave(model, f, flowResistivity, air).kc; return Math.hypot(k.re, k.im); };
  const kMax = Math.max(...rule.frequenciesHz.map(magnitude));
  return sizeFor(rule, kMax);
}

export interface SizedPiece { box: TaggedBox; size: number }

/** Per axis, the cut coordinates: intervals between breakpoints that a finer lining spans are split evenly. */
export function liningCuts(pieces: readonly SizedPiece[], breakpoints: Record<Axis, readonly number[]>, airSize: number): Record<Axis, number[]> {
  const cuts = { x: [] as number[], y: [] as number[], z: [] as number[] };
  for (const axis of AXES) {
    const base = breakpoints[axis];
    for (let i = 1; i < base.length; i++) {
      const a = base[i - 1], b = base[i], len = b - a;
      const over = pieces.filter((p) => lower(p.box, axis) <= a + TOL && upper(p.box, axis) >= b - TOL);
      if (over.length === 0) continue;
      const n = Math.ceil(len / Math.min(...over.map((p) => p.size)) - 1e-9);
      if (n <= Math.ceil(len / airSize - 1e-9)) continue; // the air's grading is fine enough already
      for (let k = 1; k < n; k++) cuts[axis].push(tidy(a + (len * k) / n));
    }
  }
  return cuts;
}

/** The box cut at every cut coordinate strictly inside it: a tensor product of slices. */
export function sliceBox(box: TaggedBox, cuts: Record<Axis, readonly number[]>): TaggedBox[] {
  const edges = AXES.map((axis) => {
    const lo = lower(box, axis), hi = upper(box, axis);
    return uniqueSorted([lo, ...cuts[axis].filter((c) => c > lo + TOL && c < hi - TOL), hi]);
  });
  const out: TaggedBox[] = [];
  for (let k = 1; k < edges[2].length; k++) for (let j = 1; j < edges[1].length; j++) for (let i = 1; i < edges[0].length; i++) {
    out.push({ x0: edges[0][i - 1], x1: edges[0][i], y0: edges[1][j - 1], y1: edges[1][j], z0: edges[2][k - 1], z1: edges[2][k], tag: box.tag });
  }
  return out;
}
