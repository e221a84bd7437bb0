/**
 * Absorbing layers: which stretch each layer cell gets at a given wavenumber, and what the discrete
 * layers are predicted to reflect.
 *
 * Vocabulary. The grid (engine/grid/grid.ts) adds `layers` cells beyond every face of the bounding box
 * that has an opening. A cell lies in the layers along an axis when its index on that axis is outside
 * the physical range (GridAxis.layerSide ≠ 0), and each such axis is stretched; the cell is named by how
 * many axes are stretched (`layerCellKind`):
 *
 *        ┌───┬───────────┬───┐    interior  no axis stretched: the physical air, s = 1
 *        │ C │     F     │ C │    face      one axis: the layer in front of an opening
 *        ├───┼───────────┼───┤    edge      two axes: where the layers of two open faces meet
 *        │ F │ interior  │ F │    corner    three axes: where three open faces meet (a room's open
 *        ├───┼───────────┼───┤              corner); a corner cell is a cell with three stretched axes
 *        │ C │     F     │ C │
 *        └───┴───────────┴───┘    (a cut normal to z through an open room: F face, C edge cells;
 *                                  the same cut inside a z layer shows edge and corner cells)
 *
 * Every kind is assembled by the same element integrator (engine/fe/element.ts), which takes one stretch
 * per axis (AxisStretch, engine/fe/stretch.ts): an unstretched axis passes s = 1. So a face cell differs
 * from a corner cell only in how many of its three stretches are not 1.
 *
 * Discrete layers (constant stretch per layer element, p-point Gauss rule along the stretched axis): L layer
 * elements of complex lengths L̃_j ending on a rigid wall reflect a wave of normal wavenumber k_x by
 *     R(k_x) = ∏_j [P_p(z_j) / P_p(−z_j)]²,  z_j = −j·k_x·L̃_j,
 *     P_p(z) = Σ_{m=0}^{p} (2p−m)!·p! / ((2p)!·m!·(p−m)!) · z^m,
 * P_p(z)/P_p(−z) being the [p/p] Padé approximant of e^z (Guddati & Lim, IJNME 66, 2006, for p = 1;
 * arXiv:2308.12255 for p ≥ 1; analysis after Ainsworth, J. Comput. Phys. 198, 2004). Written here for
 * e^{+jωt}: the literature's e^{−iωt} form with conjugated lengths. Propagating waves (k_x real) are
 * absorbed when Im L̃_j < 0, evanescent ones (k_x = −jκ) when Re L̃_j > 0.
 */
import type { AxisStretch } from '../fe/stretch.ts';
import type { Grid } from '../grid/grid.ts';
import type { Complex } from '../core/complex.ts';
import type { AbsorberKind } from '../core/absorber.ts';

export type { AbsorberKind };

function padeCoefficients(p: number): number[] {
  const f = (n: number) => { let r = 1; for (let i = 2; i <= n; i++) r *= i; return r; };
  const c: number[] = [];
  for (let m = 0; m <= p; m++) c.push((f(2 * p - m) * f(p)) / (f(2 * p) * f(m) * f(p - m)));
  return c;
}

function polyAt(c: number[], zr: number, zi: number): Complex {
  let re = 0, im = 0;
  for (let m = c.length - 1; m >= 0; m--) {
    const r = re * zr - im * zi + c[m], i = re * zi + im * zr;
    re = r; im = i;
  }
  return { re, im };
}

/** R at a rigid-ended stack of layers with dimensionless lengths ℓ_j = k·L̃_j, for k_x/k = q. */
export function padeReflection(p: number, lengths: readonly Complex[], q: Complex): Complex {
  const c = padeCoefficients(p);
  let re = 1, im = 0;
  for (const l of lengths) {
    // z = −j·q·ℓ
    const qr = q.re * l.re - q.im * l.im, qi = q.re * l.im + q.im * l.re;
    const zr = qi, zi = -qr;
    const num = polyAt(c, zr, zi), den = polyAt(c, -zr, -zi);
    const d2 = den.re * den.re + den.im * den.im;
    const rr = (num.re * den.re + num.im * den.im) / d2, ri = (num.im * den.re - num.re * den.im) / d2;
    const sr = rr * rr - ri * ri, si = 2 * rr * ri; // squared: there and back
    const nr = re * sr - im * si, ni = re * si + im * sr;
    re = nr; im = ni;
  }
  return { re, im };
}

/** The normal wavenumbers (as k_x/k) a layer stack should absorb. */
export interface AbsorptionRange {
  propagating: [number, number]; // k_x/k of propagating waves (grazing … normal)
  evanescent: [number, number] | null; // κ/k of evanescent waves; null where none reach the layers
}

export const DEFAULT_RANGE: AbsorptionRange = { propagating: [0.2, 1], evanescent: [0.2, 5] };

function samples(r: AbsorptionRange, count = 24): Complex[] {
  const out: Complex[] = [];
  for (let i = 0; i < count; i++) {
    const t = i / (count - 1);
    out.push({ re: r.propagating[0] * Math.pow(r.propagating[1] / r.propagating[0], t), im: 0 });
    if (r.evanescent) out.push({ re: 0, im: -r.evanescent[0] * Math.pow(r.evanescent[1] / r.evanescent[0], t) });
  }
  return out;
}

export function worstReflection(p: number, lengths: readonly Complex[], range: AbsorptionRange = DEFAULT_RANGE): number {
  let worst = 0;
  for (const q of samples(range, 48)) {
    const R = padeReflection(p, lengths, q);
    worst = Math.max(worst, Math.hypot(R.re, R.im));
  }
  return worst;
}

/** Seeds from minimising the worst |R| (checked in shared notes), conjugated to e^{+jωt}. */
const SEEDS: Record<string, [number, number][]> = {
  '2/4': [[7.58, 9.55], [0.8, -0.28], [2.57, 2.4], [6.66, 9.51]],
  '3/3': [[1.39, -0.72], [11.81, 13.05], [3.57, 4.49]],
  '3/4': [[3.45, 4.06], [14.33, 15.67], [3.16, 3.0], [0.98, -0.84]],
  '4/3': [[13.17, 12.19], [8.66, 10.45], [1.54, 0.82]],
  '4/4': [[1.52, -0.1], [8.45, 13.91], [7.5, 6.19], [12.37, 14.41]],
};

function geometricSeed(count: number): Complex[] {
  const out: Complex[] = [];
  for (let j = 0; j < count; j++) {
    const a = count === 1 ? 4 : 1.2 * Math.pow(12, j / (count - 1));
    out.push({ re: a, im: -1.1 * a });
  }
  return out;
}

const chosen = new Map<string, Complex[]>();

/**
 * Dimensionless complex lengths ℓ_j = k·L̃_j minimising the worst |R| over the range: Nelder–Mead on
 * log10 of the worst reflection from a few seeds, deterministic, cached per (p, layers, range).
 */
export function chooseLengths(p: number, layers: number, range: AbsorptionRange = DEFAULT_RANGE): Complex[] {
  const key = `${p}/${layers}/${range.propagating.join(',')}/${range.evanescent?.join(',') ?? '-'}`;
  const hit = chosen.get(key);
  if (hit) return hit;
  const seeds: Complex[][] = [geometricSeed(layers)];
  const table = SEEDS[`${p}/${layers}`];
  if (table && range.evanescent) seeds.unshift(table.map(([re, im]) => ({ re, im: -im })));
  const toVec = (ls: Complex[]) => ls.flatMap((l) => [l.re, l.im]);
  const toLengths = (v: number[]) => Array.from({ length: layers }, (_, j) => ({ re: v[2 * j], im: v[2 * j + 1] }));
  // a coarse sample set drives the search (12 per branch reach the same optimum as 48 at a fifth of the cost)
  const coarse = samples(range, 12);
  const cost = (v: number[]) => {
    const ls = toLengths(v);
    let worst = 0;
    for (const q of coarse) {
      const R = padeReflection(p, ls, q);
      worst = Math.max(worst, Math.hypot(R.re, R.im));
    }
    return Math.log10(worst + 1e-300);
  };
  let best = toVec(seeds[0]), bestCost = cost(best);
  for (const s of seeds) {
    const r = nelderMead(cost, toVec(s), 600);
    if (r.f < bestCost) { best = r.x; bestCost = r.f; }
  }
  const out = toLengths(best);
  chosen.set(key, out);
  return out;
}

export function nelderMead(f: (x: number[]) => number, x0: number[], maxEval: number): { x: number[]; f: number } {
  const n = x0.length;
  let simplex = [x0, ...x0.map((_, i) => x0.map((v, j) => (i === j ? v + 0.25 * Math.max(1, Math.abs(v)) : v)))];
  let values = simplex.map(f);
  let evals = n + 1;
  while (evals < maxEval) {
    const order = values.map((v, i) => [v, i]).sort((a, b) => a[0] - b[0]).map((p) => p[1]);
    simplex = order.map((i) => simplex[i]);
    values = order.map((i) => values[i]);
    if (values[n] - values[0] < 1e-10) break;
    const centroid = x0.map((_, j) => simplex.slice(0, n).reduce((s, x) => s + x[j], 0) / n);
    const along = (t: number) => centroid.map((c, j) => c + t * (simplex[n][j] - c));
    const xr = along(-1), fr = f(xr); evals++;
    if (fr < values[0]) {
      const xe = along(-2), fe = f(xe); evals++;
      [simplex[n], values[n]] = fe < fr ? [xe, fe] : [xr, fr];
    } else if (fr < values[n - 1]) {
      [simplex[n], values[n]] = [xr, fr];
    } else {
      const xc = along(0.5), fc = f(xc); evals++;
      if (fc < values[n]) [simplex[n], values[n]] = [xc, fc];
      else {
        for (let i = 1; i <= n; i++) simplex[i] = simplex[i].map((v, j) => simplex[0][j] + 0.5 * (v - simplex[0][j]));
        for (let i = 1; i <= n; i++) values[i] = f(simplex[i]);
        evals += n;
      }
    }
  }
  const i0 = values.indexOf(Math.min(...values));
  return { x: simplex[i0], f: values[i0] };
}

export type LayerCellKind = 'interior' | 'face' | 'edge' | 'corner';
const KINDS: readonly LayerCellKind[] = ['interior', 'face', 'edge', 'corner'];

/** What a grid cell is, by the number of its stretched axes (see the vocabulary above). */
export function layerCellKind(grid: Grid, cell: number): LayerCellKind {
  const [nx, ny] = grid.dims, ijk = [cell % nx, Math.floor(cell / nx) % ny, Math.floor(cell / (nx * ny))];
  return KINDS[ijk.filter((v, d) => grid.axes[d].layerSide[v] !== 0).length];
}

/** How many air cells of each kind the grid has. */
export function layerCellCounts(grid: Grid): Record<LayerCellKind, number> {
  const out: Record<LayerCellKind, number> = { interior: 0, face: 0, edge: 0, corner: 0 };
  for (let c = 0; c < grid.air.length; c++) if (grid.air[c]) out[layerCellKind(grid, c)]++;
  return out;
}

export interface AbsorberOptions {
  kind: AbsorberKind;
  /** Target reflection of the smooth profile, R₀ = exp(−2 Im(k L̃)): default 1e-6. */
  smoothTarget?: number;
  range?: AbsorptionRange;
  /** The lengths k·L̃ already chosen for this frequency (one per layer element); chosen here for `range` when absent. */
  lengths?: readonly Complex[];
}

/**
 * The stretch of every cell along every axis at wavenumber k: physical cells none, layer cells by kind.
 * stretches[d][i] is the stretch of cell i along axis d.
 */
export function layerStretches(grid: Grid, k: number, opts: AbsorberOptions): AxisStretch[][] {
  const p = grid.order;
  return grid.axes.map((axis) => {
    const out: AxisStretch[] = [];
    const counts = { lo: axis.physLo, hi: axis.nodes.length - 1 - axis.physHi };
    for (let i = 0; i < axis.nodes.length - 1; i++) {
      const side = axis.layerSide[i];
      if (side === 0) { out.push({ kind: 'none' }); continue; }
      const count = side < 0 ? counts.lo : counts.hi, j = axis.layerIndex[i];
      const h = axis.nodes[i + 1] - axis.nodes[i];
      if (opts.kind === 'smooth') {
        const origin = side < 0 ? axis.nodes[axis.physLo] : axis.nodes[axis.physHi];
        out.push(smoothStretch(origin, side as 1 | -1, count * h, k, opts.smoothTarget ?? 1e-6));
      } else {
        const l = lengthsFor(p, count, opts)[j];
        out.push({ kind: 'constant', re: l.re / (k * h), im: l.im / (k * h), reduced: opts.kind === 'discrete' });
      }
    }
    return out;
  });
}

function lengthsFor(p: number, count: number, opts: AbsorberOptions): readonly Complex[] {
  if (!opts.lengths) return chooseLengths(p, count, opts.range);
  if (opts.lengths.length !== count) throw new RangeError(`layerStretches: ${opts.lengths.length} layer lengths given for a stack of ${count} layers`);
  return opts.lengths;
}

/**
 * Quadratic profile s(d) = 1 + (α − jβ)(d/D)²: the continuous layer's plane-wave reflection at normal
 * incidence is exp(−2kβD/3) (Bérenger 1994), so β = 3 ln(1/R₀)/(2kD); α = β/2 gives evanescent waves a
 * comparable real stretch.
 */
function smoothStretch(origin: number, direction: 1 | -1, depth: number, k: number, target: number): AxisStretch {
  const power = 2, beta = ((power + 1) * Math.log(1 / target)) / (2 * k * depth);
  return { kind: 'smooth', origin, direction, depth, power, alpha: 0.5 * beta, beta };
}
