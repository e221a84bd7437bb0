/**
 * A rational fit of several complex outputs over frequency with one set of poles: the AAA algorithm
 * (Nakatsukasa, Sète & Trefethen, The AAA algorithm for rational approximation, SIAM J. Sci. Comput.
 * 40 (2018) A1494–A1522) in its set-valued form (Lietaert, Meerbergen, Pérez & Vandereycken,
 * Automatic rational approximation and linearization of nonlinear eigenvalue problems, IMA J. Numer.
 * Anal. 42 (2022)). Each output c is written in barycentric form
 *
 *     r_c(t) = Σ_k w_k f_kc / (t − t_k)  /  Σ_k w_k / (t − t_k),
 *
 * with support points t_k taken greedily from the samples where the fit is worst and weights w_k
 * shared by all outputs (the smallest right singular vector of the stacked Loewner matrices). The
 * outputs of one acoustic system share its resonances, so one denominator serves them all.
 *
 * t = (f − centre)/halfWidth maps the sampled range onto [−1, 1]; each output is divided by its
 * largest sampled magnitude so that every output counts alike in the least-squares problem.
 */
import { complexMatrix, rightSingular } from './svd.ts';
import { eigenvalues, type ComplexList } from './eigenvalues.ts';

export interface AaaOptions {
  /** Stop when every sample is matched to this, relative to each output's largest magnitude. Default 1e-13. */
  tolerance?: number;
  /** Most support points (the fit's degree is one less). Default 100. */
  maxSupport?: number;
  /** Remove Froissart doublets (poles with negligible residues) and refit. Default true. */
  cleanup?: boolean;
  /** A pole is spurious when |residue| / (distance to the nearest sample) is below this (scaled units). Default 1e-13. */
  cleanupTolerance?: number;
}

export interface RationalFit {
  channels: number;
  centre: number; // Hz
  halfWidth: number; // Hz
  /** Largest sampled magnitude of each output (1 where all are zero). */
  scale: Float64Array; // channels
  support: Float64Array; // m, scaled frequency t_k
  weightRe: Float64Array; // m
  weightIm: Float64Array; // m
  valueRe: Float64Array; // m·channels, support-major, as sampled (not scaled)
  valueIm: Float64Array; // m·channels
  /** Largest relative mismatch at the samples that are not support points. */
  sampleError: number;
}

export interface Pole {
  /** Pole in Hz (complex frequency). */
  re: number;
  im: number;
  /** Residue of each output at the pole, in output units × Hz. */
  residueRe: Float64Array; // channels
  residueIm: Float64Array; // channels
}

const CLEANUP_ROUNDS = 4;
const DEFAULTS = { tolerance: 1e-13, maxSupport: 100, cleanup: true, cleanupTolerance: 1e-13 };

/**
 * Fit samples (frequencies ascending and distinct; values sample-major, `channels` per sample).
 */
export function aaa(frequencyHz: Float64Array, valueRe: Float64Array, valueIm: Float64Array, channels: number, options: AaaOptions = {}): RationalFit {
  const o = { ...DEFAULTS, ...options };
  const n = frequencyHz.length;
  if (n === 0) throw new RangeError('aaa needs at least one sample');
  if (valueRe.length !== n * channels || valueIm.length !== n * channels) throw new RangeError(`aaa: ${n} samples of ${channels} outputs need ${n * channels} values`);
  for (let i = 1; i < n; i++) if (!(frequencyHz[i] > frequencyHz[i - 1])) throw new RangeError('aaa: frequencies must be ascending and distinct');
  const centre = 0.5 * (frequencyHz[0] + frequencyHz[n - 1]);
  const halfWidth = n > 1 ? 0.5 * (frequencyHz[n - 1] - frequencyHz[0]) : Math.max(1, Math.abs(centre));
  const t = Float64Array.from(frequencyHz, (f) => (f - centre) / halfWidth);
  const scale = new Float64Array(channels).fill(0);
  for (let i = 0; i < n; i++) for (let c = 0; c < channels; c++) scale[c] = Math.max(scale[c], Math.hypot(valueRe[i * channels + c], valueIm[i * channels + c]));
  for (let c = 0; c < channels; c++) if (!(scale[c] > 0) || !Number.isFinite(scale[c])) scale[c] = 1;
  const gRe = new Float64Array(n * channels), gIm = new Float64Array(n * channels);
  for (let i = 0; i < n; i++) for (let c = 0; c < channels; c++) {
    gRe[i * channels + c] = valueRe[i * channels + c] / scale[c];
    gIm[i * channels + c] = valueIm[i * channels + c] / scale[c];
  }
  const data: Scaled = { n, channels, t, gRe, gIm };
  let support = greedy(data, o.tolerance, Math.min(o.maxSupport, n));
  let weights = solveWeights(data, support);
  // A refit after a cleanup can leave a new doublet: repeat a few times (each round removes support points).
  for (let round = 0; o.cleanup && round < CLEANUP_ROUNDS && support.length > 1; round++) {
    const spurious = spuriousSupport(data, support, weights, o.cleanupTolerance);
    if (spurious.size === 0) break;
    support = support.filter((k) => !spurious.has(k));
    weights = solveWeights(data, support);
  }
  const m = support.length;
  const fit: RationalFit = {
    channels, centre, halfWidth, scale,
    support: Float64Array.from(support, (k) => t[k]),
    weightRe: weights.re, weightIm: weights.im,
    valueRe: new Float64Array(m * channels), valueIm: new Float64Array(m * channels),
    sampleError: 0,
  };
  support.forEach((k, j) => {
    fit.valueRe.set(valueRe.subarray(k * channels, (k + 1) * channels), j * channels);
    fit.valueIm.set(valueIm.subarray(k * channels, (k + 1) * channels), j * channels);
  });
  fit.sampleError = mismatch(data, support, weights).max;
  return fit;
}

interface Scaled { n: number; channels: number; t: Float64Array; gRe: Float64Array; gIm: Float64Array }

/** The greedy AAA iteration: returns the support indices of the best fit it met. */
function greedy(d: Scaled, tolerance: number, maxSupport: number): number[] {
  const support: number[] = [];
  let best: number[] = [], bestError = Infinity;
  let weights: { re: Float64Array; im: Float64Array } | null = null;
  for (;;) {
    const { max, at } = weights === null ? meanMismatch(d) : mismatch(d, support, weights);
    if (support.length > 0 && max < bestError) {
      bestError = max;
      best = [...support];
    }
    if (support.length > 0 && (max <= tolerance || support.length >= maxSupport || at < 0)) break;
    support.push(at);
    weights = solveWeights(d, support);
  }
  return best.length > 0 ? best : [...support];
}

/** Mismatch of the constant fit (each output's mean) before the first support point. */
function meanMismatch(d: Scaled): { max: number; at: number } {
  const { n, channels: C } = d, mr = new Float64Array(C), mi = new Float64Array(C);
  for (let i = 0; i < n; i++) for (let c = 0; c < C; c++) {
    mr[c] += d.gRe[i * C + c] / n;
    mi[c] += d.gIm[i * C + c] / n;
  }
  let max = -1, at = -1;
  for (let i = 0; i < n; i++) {
    let e = 0;
    for (let c = 0; c < C; c++) e = Math.max(e, Math.hypot(d.gRe[i * C + c] - mr[c], d.gIm[i * C + c] - mi[c]));
    if (e > max) { max = e; at = i; }
  }
  return { max, at };
}

/** Largest scaled mismatch over the samples that are not support points, and where it is (−1: none left). */
function mismatch(d: Scaled, support: readonly number[], w: { re: Float64Array; im: Float64Array }): { max: number; at: number } {
  const { n, channels: C, t } = d, m = support.length;
  const isSupport = new Uint8Array(n);
  for (const k of support) isSupport[k] = 1;
  const nr = new Float64Array(C), ni = new Float64Array(C);
  let max = 0, at = -1;
  for (let i = 0; i < n; i++) {
    if (isSupport[i]) continue;
    let dr = 0, di = 0;
    nr.fill(0); ni.fill(0);
    for (let j = 0; j < m; j++) {
      const k = support[j], inv = 1 / (t[i] - t[k]);
      const cr = w.re[j] * inv, ci = w.im[j] * inv;
      dr += cr; di += ci;
      for (let c = 0; c < C; c++) {
        const fr = d.gRe[k * C + c], fi = d.gIm[k * C + c];
        nr[c] += cr * fr - ci * fi;
        ni[c] += cr * fi + ci * fr;
      }
    }
    const dd = dr * dr + di * di;
    let e = 0;
    for (let c = 0; c < C; c++) {
      const rr = (nr[c] * dr + ni[c] * di) / dd, ri = (ni[c] * dr - nr[c] * di) / dd;
      const x = Math.hypot(d.gRe[i * C + c] - rr, d.gIm[i * C + c] - ri);
      e = Math.max(e, Number.isFinite(x) ? x : Infinity);
    }
    if (e > max || at < 0) { max = e; at = i; }
  }
  return { max, at };
}

/** The weights: smallest right singular vector of the Loewner matrix (G_ic − g_kc)/(t_i − t_k), rows (i, c) over non-support samples. */
function solveWeights(d: Scaled, support: readonly number[]): { re: Float64Array; im: Float64Array } {
  const { n, channels: C, t } = d, m = support.length;
  if (m === 1) return { re: Float64Array.of(1), im: Float64Array.of(0) };
  const isSupport = new Uint8Array(n);
  for (const k of support) isSupport[k] = 1;
  const rows = (n - m) * C;
  const a = complexMatrix(Math.max(rows, 1), m);
  let r = 0;
  for (let i = 0; i < n; i++) {
    if (isSupport[i]) continue;
    for (let c = 0; c < C; c++, r++) {
      for (let j = 0; j < m; j++) {
        const k = support[j], inv = 1 / (t[i] - t[k]);
        a.re[r + j * a.rows] = (d.gRe[i * C + c] - d.gRe[k * C + c]) * inv;
        a.im[r + j * a.rows] = (d.gIm[i * C + c] - d.gIm[k * C + c]) * inv;
      }
    }
  }
  const { vectors } = rightSingular(a);
  return { re: vectors.re.slice((m - 1) * m, m * m), im: vectors.im.slice((m - 1) * m, m * m) };
}

/** Support points to drop: for each pole whose residues are negligible, the support point nearest to it. */
function spuriousSupport(d: Scaled, support: readonly number[], w: { re: Float64Array; im: Float64Array }, tolerance: number): Set<number> {
  const supportT = Float64Array.from(support, (k) => d.t[k]);
  const poles = barycentricPoles(supportT, w.re, w.im);
  const out = new Set<number>();
  const values = { re: new Float64Array(support.length * d.channels), im: new Float64Array(support.length * d.channels) };
  support.forEach((k, j) => {
    values.re.set(d.gRe.subarray(k * d.channels, (k + 1) * d.channels), j * d.channels);
    values.im.set(d.gIm.subarray(k * d.channels, (k + 1) * d.channels), j * d.channels);
  });
  for (let p = 0; p < poles.re.length; p++) {
    const pr = poles.re[p], pi = poles.im[p];
    if (!Number.isFinite(pr) || !Number.isFinite(pi)) continue;
    const res = residues(supportT, w.re, w.im, values.re, values.im, d.channels, pr, pi);
    let biggest = 0;
    for (let c = 0; c < d.channels; c++) biggest = Math.max(biggest, Math.hypot(res.re[c], res.im[c]));
    let nearestSample = Infinity;
    for (let i = 0; i < d.n; i++) nearestSample = Math.min(nearestSample, Math.hypot(d.t[i] - pr, pi));
    if (biggest < tolerance * nearestSample) {
      let nearest = 0;
      for (let j = 1; j < support.length; j++) if (Math.hypot(supportT[j] - pr, pi) < Math.hypot(supportT[nearest] - pr, pi)) nearest = j;
      out.add(support[nearest]);
    }
  }
  return out;
}

/**
 * Zeros of d(t) = Σ w_k/(t − t_k): the poles of the fit. With u = 1/(t − σ), d = u·Σ w̃_k/(u − u_k),
 * w̃_k = w_k/(σ − t_k), u_k = 1/(t_k − σ), and the zeros of Σ w̃_k/(u − u_k) are the eigenvalues of
 * Qᴴ(U − e·w̃ᵀU/s)Q, U = diag(u_k), s = Σ w̃_k = d(σ), Q an orthonormal basis of {x : w̃ᵀx = 0}.
 * (Project the arrowhead pencil [0 w̃ᵀ; e U] − λ·diag(0, I) onto w̃ᵀx = 0.) Choosing σ off the
 * real line where |d(σ)| is large keeps s away from zero even when Σ w_k is (a pole at infinity).
 */
export function barycentricPoles(t: Float64Array, wr: Float64Array, wi: Float64Array): ComplexList {
  const m = t.length;
  if (m < 2) return { re: new Float64Array(0), im: new Float64Array(0) };
  let sigma = [0, 1.5], bestS = -1;
  for (const [sr, si] of [[0, 1.5], [0, -1.5], [0.7, 1.1], [-0.7, 1.1], [0, 3]]) {
    let dr = 0, di = 0, sum = 0;
    for (let k = 0; k < m; k++) {
      const [qr, qi] = cdiv(wr[k], wi[k], sr - t[k], si);
      dr += qr; di += qi; sum += Math.hypot(qr, qi);
    }
    const rel = Math.hypot(dr, di) / sum;
    if (rel > bestS) { bestS = rel; sigma = [sr, si]; }
  }
  const [sr, si] = sigma;
  const ur = new Float64Array(m), ui = new Float64Array(m), vr = new Float64Array(m), vi = new Float64Array(m);
  let sRe = 0, sIm = 0;
  for (let k = 0; k < m; k++) {
    [ur[k], ui[k]] = cdiv(1, 0, t[k] - sr, -si);
    [vr[k], vi[k]] = cdiv(wr[k], wi[k], sr - t[k], si);
    sRe += vr[k]; sIm += vi[k];
  }
  // M = U − e·(w̃ᵀU)/s (m×m), then Qᴴ M Q with Q from the Householder reflector that maps conj(w̃) to a multiple of e₁.
  const mRe = new Float64Array(m * m), mIm = new Float64Array(m * m);
  for (let j = 0; j < m; j++) {
    const [xr, xi] = cmul(vr[j], vi[j], ur[j], ui[j]);
    const [yr, yi] = cdiv(xr, xi, sRe, sIm);
    for (let i = 0; i < m; i++) {
      mRe[i + j * m] = -yr;
      mIm[i + j * m] = -yi;
    }
    mRe[j + j * m] += ur[j];
    mIm[j + j * m] += ui[j];
  }
  const h = reflectorOf(vr, Float64Array.from(vi, (x) => -x)); // H conj(w̃) ∝ e₁, H = Hᴴ
  const hm = multiply(h, { re: mRe, im: mIm }, m);
  const hmh = multiply(hm, h, m);
  const small = complexMatrix(m - 1, m - 1);
  for (let j = 1; j < m; j++) for (let i = 1; i < m; i++) {
    small.re[i - 1 + (j - 1) * (m - 1)] = hmh.re[i + j * m];
    small.im[i - 1 + (j - 1) * (m - 1)] = hmh.im[i + j * m];
  }
  const u = eigenvalues(small);
  const out = { re: new Float64Array(m - 1), im: new Float64Array(m - 1) };
  for (let p = 0; p < m - 1; p++) {
    const [ir, ii] = u.re[p] === 0 && u.im[p] === 0 ? [Infinity, Infinity] : cdiv(1, 0, u.re[p], u.im[p]);
    out.re[p] = sr + ir;
    out.im[p] = si + ii;
  }
  return out;
}

/** Residue n_c(p)/d'(p) of each output at the pole p (scaled or unscaled values, as given). */
export function residues(t: Float64Array, wr: Float64Array, wi: Float64Array, fr: Float64Array, fi: Float64Array, channels: number, pr: number, pi: number): { re: Float64Array; im: Float64Array } {
  const m = t.length, nr = new Float64Array(channels), ni = new Float64Array(channels);
  let dr = 0, di = 0;
  for (let k = 0; k < m; k++) {
    const [ar, ai] = cdiv(wr[k], wi[k], pr - t[k], pi); // w/(p − t)
    const [br, bi] = cdiv(ar, ai, pr - t[k], pi); // w/(p − t)²
    dr -= br; di -= bi;
    for (let c = 0; c < channels; c++) {
      nr[c] += ar * fr[k * channels + c] - ai * fi[k * channels + c];
      ni[c] += ar * fi[k * channels + c] + ai * fr[k * channels + c];
    }
  }
  const re = new Float64Array(channels), im = new Float64Array(channels);
  for (let c = 0; c < channels; c++) [re[c], im[c]] = cdiv(nr[c], ni[c], dr, di);
  return { re, im };
}

/** The poles of a fit in Hz, with each output's residue in output units × Hz. */
export function polesOf(fit: RationalFit): Pole[] {
  const p = barycentricPoles(fit.support, fit.weightRe, fit.weightIm);
  const out: Pole[] = [];
  for (let k = 0; k < p.re.length; k++) {
    if (!Number.isFinite(p.re[k]) || !Number.isFinite(p.im[k])) continue;
    const r = residues(fit.support, fit.weightRe, fit.weightIm, fit.valueRe, fit.valueIm, fit.channels, p.re[k], p.im[k]);
    for (let c = 0; c < fit.channels; c++) {
      r.re[c] *= fit.halfWidth;
      r.im[c] *= fit.halfWidth;
    }
    out.push({ re: fit.centre + fit.halfWidth * p.re[k], im: fit.halfWidth * p.im[k], residueRe: r.re, residueIm: r.im });
  }
  return out.sort((a, b) => a.re - b.re || a.im - b.im);
}

/** r_c(f) for every output c into out (length ≥ channels). A support frequency returns its sample. */
export function evaluateFit(fit: RationalFit, frequencyHz: number, outRe: Float64Array, outIm: Float64Array): void {
  const C = fit.channels, m = fit.support.length, t = (frequencyHz - fit.centre) / fit.halfWidth;
  outRe.fill(0, 0, C);
  outIm.fill(0, 0, C);
  let dr = 0, di = 0;
  for (let j = 0; j < m; j++) {
    const diff = t - fit.support[j];
    if (diff === 0) {
      for (let c = 0; c < C; c++) {
        outRe[c] = fit.valueRe[j * C + c];
        outIm[c] = fit.valueIm[j * C + c];
      }
      return;
    }
    const cr = fit.weightRe[j] / diff, ci = fit.weightIm[j] / diff;
    dr += cr; di += ci;
    for (let c = 0; c < C; c++) {
      const fr = fit.valueRe[j * C + c], fi = fit.valueIm[j * C + c];
      outRe[c] += cr * fr - ci * fi;
      outIm[c] += cr * fi + ci * fr;
    }
  }
  const dd = dr * dr + di * di;
  for (let c = 0; c < C; c++) {
    const nr = outRe[c], ni = outIm[c];
    outRe[c] = (nr * dr + ni * di) / dd;
    outIm[c] = (ni * dr - nr * di) / dd;
  }
}

function cmul(ar: number, ai: number, br: number, bi: number): [number, number] {
  return [ar * br - ai * bi, ar * bi + ai * br];
}

function cdiv(ar: number, ai: number, br: number, bi: number): [number, number] {
  if (Math.abs(br) >= Math.abs(bi)) {
    const r = bi / br, d = br + bi * r;
    return [(ar + ai * r) / d, (ai - ar * r) / d];
  }
  const r = br / bi, d = br * r + bi;
  return [(ar * r + ai) / d, (ai * r - ar) / d];
}

/** The Householder reflector H = I − 2xxᴴ/xᴴx (m×m, column-major) with H·v ∝ e₁. */
function reflectorOf(vr: Float64Array, vi: Float64Array): { re: Float64Array; im: Float64Array } {
  const m = vr.length;
  let norm = 0;
  for (let i = 0; i < m; i++) norm += vr[i] ** 2 + vi[i] ** 2;
  norm = Math.sqrt(norm);
  const xr = Float64Array.from(vr), xi = Float64Array.from(vi);
  const v0 = Math.hypot(vr[0], vi[0]);
  xr[0] += (v0 === 0 ? 1 : vr[0] / v0) * norm;
  xi[0] += (v0 === 0 ? 0 : vi[0] / v0) * norm;
  let xx = 0;
  for (let i = 0; i < m; i++) xx += xr[i] ** 2 + xi[i] ** 2;
  const re = new Float64Array(m * m), im = new Float64Array(m * m);
  for (let j = 0; j < m; j++) for (let i = 0; i < m; i++) {
    // −2 x_i conj(x_j)/xx
    re[i + j * m] = (i === j ? 1 : 0) - (2 * (xr[i] * xr[j] + xi[i] * xi[j])) / xx;
    im[i + j * m] = (-2 * (xi[i] * xr[j] - xr[i] * xi[j])) / xx;
  }
  return { re, im };
}

/** a·b for m×m column-major matrices. */
function multiply(a: { re: Float64Array; im: Float64Array }, b: { re: Float64Array; im: Float64Array }, m: number): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(m * m), im = new Float64Array(m * m);
  for (let j = 0; j < m; j++) for (let k = 0; k < m; k++) {
    const br = b.re[k + j * m], bi = b.im[k + j * m];
    if (br === 0 && bi === 0) continue;
    for (let i = 0; i < m; i++) {
      const ar = a.re[i + k * m], ai = a.im[i + k * m];
      re[i + j * m] += ar * br - ai * bi;
      im[i + j * m] += ar * bi + ai * br;
    }
  }
  return { re, im };
}
