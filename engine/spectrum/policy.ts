/**
 * Adaptive frequency sampling for band values: which frequencies to solve, when to stop, and the
 * band values the solved points give.
 *
 * A plain object for the sweep scheduler: after each result it asks `next(samples, busy, failed)` for
 * the frequencies worth starting now, and `done(...)` whether to stop; `bands(samples)` gives the
 * band values from any set of solved points (one run's, or the union of several runs').
 *
 * 1. Coarse start: every band edge (so that each band is covered edge to edge) and points between
 *    them at most `coarseRatio` apart (default 1/6 octave), largest gaps first.
 * 2. Then, for each band whose value has not converged, the frequency where the fit's error adds most
 *    to that band's error: the gaps between solved points are scanned with the pointwise error of the
 *    leave-out fits (fit.ts), weighted by the band's quantity and source density. Bands are served in
 *    order of their error over the tolerance, one frequency each, then a second round, up to `batch`.
 * 3. A band is 'ok' when solved points reach both its edges, it holds at least `minSolvesPerBand`
 *    solved points, and its integral's error estimate (bandIntegral.ts) is within `toleranceDb`.
 *    Anything else is 'not covered', with the reason, and has no value.
 */
import type { Band } from '../acoustics/bands.ts';
import { bandFromIndex, OCTAVE_RATIO } from '../acoustics/bands.ts';
import { bandMean, type BandIntegral } from './bandIntegral.ts';
import { spectrumCurve, type CurveOptions, type FitCache, type SpectrumCurve } from './curve.ts';
import { fitPoint } from './fit.ts';
import { errorDb, quantityDb, quantityError, type BandQuantity } from './quantity.ts';
import { sampleTable, type Sample, type SampleTable } from './samples.ts';

export interface SamplingPolicyOptions {
  /** The bands to give values for: octave and one-third-octave bands of bands.ts, in any mix. */
  bands: readonly Band[];
  /** What each band value integrates (one result per band and quantity). */
  quantities: readonly BandQuantity[];
  /** Convergence tolerance of every band value, dB. Default 0.1. */
  toleranceDb?: number;
  /** Most frequencies one `next` call proposes (the workers to keep busy). Default 2. */
  batch?: number;
  /** Stop after this many solves (failed ones count). Default 400. */
  maxSolves?: number;
  /** Solved points a band must hold, edges included, before its value can be 'ok'. Default 3. */
  minSolvesPerBand?: number;
  /** Largest frequency ratio between neighbouring points of the coarse start. Default 10^(1/20) (1/6 octave). */
  coarseRatio?: number;
  /** Options of the piecewise fit (curve.ts, fit.ts). */
  fit?: CurveOptions;
}

export type BandStatus = 'ok' | 'not covered';

export interface BandResult {
  band: Band;
  quantity: string;
  status: BandStatus;
  /** The band value, dB; null unless status is 'ok'. */
  valueDb: number | null;
  /** The band mean of the power quantity (linear, e.g. τ̄ or mean-square pressure); null when the samples do not reach both edges. */
  mean: number | null;
  /** The integral's value in dB even when not converged (progress display only, never a band value); null when not reaching both edges. */
  provisionalDb: number | null;
  /** Estimated half-width of the value's error interval, dB (fit and quadrature together); +∞ when unknown. */
  errorDb: number;
  fitErrorDb: number;
  quadratureErrorDb: number;
  /** Solved frequencies within the band's edges (edges included). */
  solves: number;
  /** Why the band has no value (status 'not covered'). */
  reason?: string;
}

export interface SamplingPolicy {
  readonly toleranceDb: number;
  /** The bands given values, as passed in. */
  readonly bandSet: readonly Band[];
  readonly quantities: readonly BandQuantity[];
  /** The coarse start, ascending. */
  initial(): number[];
  /** Frequencies to start now, most useful first, at most `batch`; none at a solved, busy or failed frequency. */
  next(samples: readonly Sample[], busy?: readonly number[], failed?: readonly number[]): number[];
  /** True when every band is 'ok', the solve budget is spent, or nothing more can be proposed. */
  done(samples: readonly Sample[], busy?: readonly number[], failed?: readonly number[]): boolean;
  /** The band values of these samples (one per band and quantity, bands in the order given). */
  bands(samples: readonly Sample[]): BandResult[];
  /** The fitted curve of these samples (null without samples). */
  curve(samples: readonly Sample[]): SpectrumCurve | null;
}

export const DEFAULT_TOLERANCE_DB = 0.1;
export const DEFAULT_MAX_SOLVES = 400;
const EDGE_TOLERANCE = 1e-9; // relative: a sample this close to an edge covers it
const MIN_GAP = 1e-5; // relative: gaps narrower than this are not split further
const SCAN_POINTS = [1 / 6, 2 / 6, 3 / 6, 4 / 6, 5 / 6];
const EDGE_RETRY = [0.995, 0.98]; // outward steps for an edge whose solve failed

export function samplingPolicy(options: SamplingPolicyOptions): SamplingPolicy {
  if (options.bands.length === 0) throw new RangeError('the sampling policy needs at least one band');
  if (options.quantities.length === 0) throw new RangeError('the sampling policy needs at least one quantity to integrate');
  const tol = options.toleranceDb ?? DEFAULT_TOLERANCE_DB;
  const batch = options.batch ?? 2, maxSolves = options.maxSolves ?? DEFAULT_MAX_SOLVES;
  const minSolves = options.minSolvesPerBand ?? 3;
  const coarseRatio = options.coarseRatio ?? OCTAVE_RATIO ** (1 / 6);
  if (!(tol > 0)) throw new RangeError(`toleranceDb must be positive (got ${tol})`);
  if (!(coarseRatio > 1)) throw new RangeError(`coarseRatio must exceed 1 (got ${coarseRatio})`);
  const bands = [...options.bands], quantities = [...options.quantities];
  const cache: FitCache = new Map();
  let last: { key: string; table: SampleTable; curve: SpectrumCurve | null; results: BandResult[] } | null = null;

  const coarse = coarseSet(bands, coarseRatio);

  const evaluate = (samples: readonly Sample[]) => {
    const key = samplesKey(samples);
    if (last?.key === key) return last;
    const table = sampleTable(samples);
    const curve = table.frequencyHz.length > 0 ? spectrumCurve(table, options.fit, cache) : null;
    const results = bands.flatMap((band) => quantities.map((q) => bandResult(curve, table, band, q, tol, minSolves)));
    last = { key, table, curve, results };
    if (cache.size > 4000) cache.clear();
    return last;
  };

  const next = (samples: readonly Sample[], busy: readonly number[] = [], failed: readonly number[] = []): number[] => {
    const taken = [...samples.map((s) => s.frequencyHz), ...busy, ...failed];
    const isTaken = (f: number) => taken.some((g) => Math.abs(g - f) <= EDGE_TOLERANCE * f);
    const out: number[] = [];
    // 1. the coarse start, and replacements for band edges whose solve failed (no fit needed yet)
    for (const f of coarseOrder(coarse)) if (!isTaken(f)) out.push(f);
    for (const f of edgeRetries(bands, failed, isTaken)) out.push(f);
    if (out.length > 0) return out.slice(0, batch);
    const { table, curve, results } = evaluate(samples);
    if (curve === null || table.frequencyHz.length + failed.length >= maxSolves) return [];
    // 2. per unconverged band, candidates in order of usefulness
    const points = [...taken].sort((a, b) => a - b);
    const byBand = new Map<Band, { ratio: number; candidates: number[] }>();
    results.forEach((r) => {
      if (r.status === 'ok' || r.mean === null) return;
      const q = quantities.find((x) => x.name === r.quantity)!;
      const ratio = r.solves < minSolves ? Infinity : r.errorDb / tol;
      const prev = byBand.get(r.band);
      if (prev && prev.ratio >= ratio) return;
      byBand.set(r.band, { ratio, candidates: bandCandidates(curve, r.band, q, points, r.solves < minSolves) });
    });
    const order = [...byBand.values()].sort((a, b) => b.ratio - a.ratio);
    for (let round = 0; out.length < batch; round++) {
      let added = false;
      for (const o of order) {
        const f = o.candidates[round];
        if (f === undefined || out.length >= batch) continue;
        if (out.some((g) => Math.abs(g - f) <= MIN_GAP * f)) continue;
        out.push(f);
        added = true;
      }
      if (!added) break;
    }
    return out;
  };

  return {
    toleranceDb: tol, bandSet: bands, quantities,
    initial: () => [...coarse],
    next,
    done(samples, busy = [], failed = []) {
      if (samples.length + failed.length >= maxSolves) return true;
      const solved = samples.map((s) => s.frequencyHz);
      // the coarse start is needed whatever the fit says
      if (coarse.some((f) => !solved.some((g) => Math.abs(g - f) <= EDGE_TOLERANCE * f) && !failed.some((g) => Math.abs(g - f) <= EDGE_TOLERANCE * f))) return false;
      const { results } = evaluate(samples);
      if (results.every((r) => r.status === 'ok')) return true;
      return busy.length === 0 && next(samples, busy, failed).length === 0;
    },
    bands: (samples) => evaluate(samples).results.map((r) => ({ ...r })),
    curve: (samples) => evaluate(samples).curve,
  };
}

/** Every band edge, and points between them no more than `ratio` apart, ascending. */
function coarseSet(bands: readonly Band[], ratio: number): number[] {
  const edges = dedupe(bands.flatMap((b) => [b.lowHz, b.highHz]).sort((a, b) => a - b));
  const out: number[] = [];
  for (let i = 0; i < edges.length; i++) {
    out.push(edges[i]);
    if (i + 1 === edges.length) break;
    const a = edges[i], b = edges[i + 1];
    // consecutive edges of separate bands: no points in a gap that no band spans
    if (!bands.some((band) => band.lowHz <= a * (1 + EDGE_TOLERANCE) && band.highHz >= b * (1 - EDGE_TOLERANCE))) continue;
    const steps = Math.ceil(Math.log(b / a) / Math.log(ratio) - 1e-9);
    for (let k = 1; k < steps; k++) out.push(a * (b / a) ** (k / steps));
  }
  return out;
}

/** The coarse set in an order where every prefix is spread over the range: ends, then repeated halving. */
function coarseOrder(points: readonly number[]): number[] {
  if (points.length <= 2) return [...points];
  const out = [points[0], points[points.length - 1]];
  let spans: [number, number][] = [[0, points.length - 1]];
  while (spans.length > 0) {
    const nextSpans: [number, number][] = [];
    for (const [a, b] of spans) {
      if (b - a < 2) continue;
      const m = (a + b) >> 1;
      out.push(points[m]);
      nextSpans.push([a, m], [m, b]);
    }
    spans = nextSpans;
  }
  return out;
}

function edgeRetries(bands: readonly Band[], failed: readonly number[], isTaken: (f: number) => boolean): number[] {
  const out: number[] = [];
  const failedNear = (f: number) => failed.some((g) => Math.abs(g - f) <= EDGE_TOLERANCE * f);
  for (const edge of dedupe(bands.flatMap((b) => [b.lowHz, b.highHz]).sort((a, b) => a - b))) {
    if (!failedNear(edge)) continue;
    const isLow = bands.some((b) => sameEdge(b.lowHz, edge)), isHigh = bands.some((b) => sameEdge(b.highHz, edge));
    for (const step of EDGE_RETRY) {
      // a point just beyond the edge covers it: below for the band above, above for the band below
      const points = [isLow ? edge * step : null, isHigh ? edge / step : null].filter((f): f is number => f !== null);
      if (points.some(failedNear)) continue;
      out.push(...points.filter((f) => !isTaken(f)));
      break;
    }
  }
  return out;
}

/** Frequencies inside the band worth solving, best first: one per gap between solved/busy/failed points, gaps ranked by their share of the band's error. */
function bandCandidates(curve: SpectrumCurve, band: Band, q: BandQuantity, points: readonly number[], needCount: boolean): number[] {
  const inside = points.filter((f) => f > band.lowHz * (1 + EDGE_TOLERANCE) && f < band.highHz * (1 - EDGE_TOLERANCE));
  const cuts = [band.lowHz, ...inside, band.highHz];
  const out = fitPoint(curve.channels);
  const scored: { f: number; score: number }[] = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const a = cuts[i], b = cuts[i + 1];
    if (b - a <= MIN_GAP * b) continue;
    if (needCount) {
      scored.push({ f: Math.sqrt(a * b), score: b / a });
      continue;
    }
    let best = -1, at = a;
    for (const s of SCAN_POINTS) {
      const f = a + (b - a) * s;
      curve.at(f, out);
      const e = quantityError(q, f, out.re, out.im, out.error) * (q.sourceDensity ? q.sourceDensity(f) : 1);
      const v = Number.isNaN(e) ? Infinity : e;
      if (v > best) { best = v; at = f; }
    }
    scored.push({ f: at, score: best * (b - a) });
  }
  return scored.sort((x, y) => y.score - x.score || x.f - y.f).map((s) => s.f);
}

function bandResult(curve: SpectrumCurve | null, table: SampleTable, band: Band, q: BandQuantity, tol: number, minSolves: number): BandResult {
  const solves = table.frequencyHz.filter((f) => f >= band.lowHz * (1 - EDGE_TOLERANCE) && f <= band.highHz * (1 + EDGE_TOLERANCE)).length;
  const base = { band, quantity: q.name, solves, valueDb: null, mean: null, provisionalDb: null, errorDb: Infinity, fitErrorDb: Infinity, quadratureErrorDb: Infinity };
  if (curve === null) return { ...base, status: 'not covered', reason: 'no solved frequency' };
  const lowOk = curve.fromHz <= band.lowHz * (1 + EDGE_TOLERANCE), highOk = curve.toHz >= band.highHz * (1 - EDGE_TOLERANCE);
  if (!lowOk || !highOk) {
    const side = !lowOk && !highOk ? 'either edge' : !lowOk ? `its lower edge ${hz(band.lowHz)} Hz` : `its upper edge ${hz(band.highHz)} Hz`;
    return { ...base, status: 'not covered', reason: `the solved frequencies (${hz(curve.fromHz)}–${hz(curve.toHz)} Hz) do not reach ${side}: a band value needs the band covered from edge to edge (${hz(band.lowHz)}–${hz(band.highHz)} Hz)` };
  }
  const integral = combinedMean(curve, band, q);
  const mean = integral.mean;
  const e = errorDb(mean, integral.error);
  const result: BandResult = {
    ...base, status: 'not covered', mean, provisionalDb: mean > 0 ? quantityDb(q, mean) : null,
    errorDb: e, fitErrorDb: errorDb(mean, integral.fitError), quadratureErrorDb: errorDb(mean, integral.quadratureError),
  };
  if (!(mean > 0) || !Number.isFinite(mean)) return { ...result, reason: `the band mean of the power quantity is ${mean}: no level can be formed` };
  if (solves < minSolves) return { ...result, reason: `only ${solves} solved ${solves === 1 ? 'frequency' : 'frequencies'} in the band, edges included (at least ${minSolves} needed)` };
  if (!(e <= tol)) return { ...result, reason: `estimated error ±${Number.isFinite(e) ? e.toFixed(2) : '∞'} dB exceeds the ${tol} dB tolerance: more frequencies must be solved in ${hz(band.lowHz)}–${hz(band.highHz)} Hz` };
  return { ...result, status: 'ok', valueDb: result.provisionalDb };
}

/** The band mean as the weighted sum over its one-third-octave pieces, each integrated on its own fit. */
function combinedMean(curve: SpectrumCurve, band: Band, q: BandQuantity): BandIntegral {
  const thirds = band.fraction === 3 ? [band.index] : [3 * band.index - 1, 3 * band.index, 3 * band.index + 1];
  let sum = 0, fitError = 0, quadratureError = 0, evaluations = 0, weight = 0;
  for (const x of thirds) {
    const piece = bandFromIndex(x, 3), fit = curve.piece(x);
    if (fit === null) return { mean: NaN, fitError: Infinity, quadratureError: Infinity, error: Infinity, weight: 0, evaluations };
    const r = bandMean(fit, q, Math.max(piece.lowHz, band.lowHz), Math.min(piece.highHz, band.highHz));
    // each piece counts by ∫ s df, its share of the source's power in the band (its width when flat)
    sum += r.weight * r.mean; fitError += r.weight * r.fitError; quadratureError += r.weight * r.quadratureError;
    weight += r.weight; evaluations += r.evaluations;
  }
  return { mean: sum / weight, fitError: fitError / weight, quadratureError: quadratureError / weight, error: (fitError + quadratureError) / weight, weight, evaluations };
}

function samplesKey(samples: readonly Sample[]): string {
  let h = 0;
  for (const s of samples) for (let c = 0; c < s.re.length; c++) h += s.re[c] * 1.0001 ** c + s.im[c] * 0.9999 ** c + s.frequencyHz;
  return `${samples.length}:${samples.map((s) => s.frequencyHz).sort((a, b) => a - b).join(',')}:${h}`;
}

function dedupe(sorted: number[]): number[] {
  return sorted.filter((f, i) => i === 0 || !sameEdge(f, sorted[i - 1]));
}

function sameEdge(a: number, b: number): boolean {
  return Math.abs(a - b) <= EDGE_TOLERANCE * Math.max(a, b);
}

function hz(f: number): string {
  return f >= 100 ? f.toFixed(0) : f.toFixed(1);
}

