/**
 * Eigenvalues of the pencil (C, B) nearest a shift σ, by Arnoldi's method on the shift-and-invert
 * operator T = (C − σB)⁻¹B: an eigenpair C ψ = μ B ψ is T ψ = θ ψ with θ = 1/(μ − σ), so the eigenvalues
 * nearest σ are the largest of T and converge first (Ericsson & Ruhe, Math. Comp. 35, 1980; Saad,
 * Numerical Methods for Large Eigenvalue Problems, 2nd ed. (2011), ch. 6 and §9.1).
 *
 * The caller supplies T as a function (one sparse LDLᵀ solve per product). The Krylov basis is kept
 * orthonormal by classical Gram–Schmidt, reorthogonalised when needed (Daniel, Gragg, Kaufman &
 * Stewart, Math. Comp. 30, 1976). Instead of restarting, the basis grows by half until every Ritz value
 * inside the wanted disk |μ − σ| ≤ radius has converged and a converged one lies beyond it (so nothing
 * inside was skipped); with the basis as large as the space itself the answer is exact. A Ritz pair
 * (θ, V y) has residual ‖T V y − θ V y‖ = |h_{m+1,m}|·|y_m| (Saad 2011, Prop. 6.8).
 *
 * Cost: m products with T, 8·m²·n flops of orthogonalisation (a second Gram–Schmidt pass only where the first cancelled much), and the dense QR of the m × m Hessenberg
 * matrix at each check (about 10·m³ complex flops).
 */
import type { ComplexVector } from '../linalg/index.ts';
import type { Complex } from '../core/complex.ts';
import { cmatrix, hessenbergEigenvalues, hessenbergEigenvectors, type CMatrix } from './dense.ts';

export interface EigsOptions {
  /** Every eigenvalue with |μ − σ| ≤ radius is wanted. */
  radius: number;
  /** The Krylov dimension to try first (default 2·expected + 20). */
  expected?: number;
  /** Relative residual |h|·|y_m| / |θ| below which a Ritz pair counts as converged (default 1e-10). */
  tol?: number;
}

export interface EigsResult {
  mu: { re: Float64Array; im: Float64Array }; // the wanted eigenvalues, nearest σ first
  vectors: ComplexVector[]; // their (unnormalised) eigenvectors
  krylov: number; // the Krylov dimension used
  checks: number; // dense eigen-solves of the Hessenberg matrix
}

type Op = (x: ComplexVector, y: ComplexVector) => void;

export function shiftInvertEigs(apply: Op, n: number, sigma: Complex, opts: EigsOptions): EigsResult {
  const tol = opts.tol ?? 1e-10, thetaMin = 1 / opts.radius;
  let m = Math.min(n, Math.max(24, Math.ceil(1.5 * (opts.expected ?? 10)) + 16));
  const V: ComplexVector[] = [];
  let H = cmatrix(1, 0), checks = 0;
  let seed = 2024;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
  const fresh = (): ComplexVector => {
    const v = { re: new Float64Array(n), im: new Float64Array(n) };
    for (let i = 0; i < n; i++) { v.re[i] = rand(); v.im[i] = rand(); }
    return v;
  };
  V.push(fresh());
  scaleTo(V[0], 1 / norm(V[0]));
  const w = { re: new Float64Array(n), im: new Float64Array(n) };
  let built = 0; // columns of H filled
  for (;;) {
    H = grow(H, m + 1, m);
    for (let j = built; j < m; j++) {
      apply(V[j], w);
      const before = norm(w);
      const h = orthogonalise(V, j + 1, w);
      for (let i = 0; i <= j; i++) { H.re[i * m + j] = h.re[i]; H.im[i * m + j] = h.im[i]; }
      let beta = norm(w);
      const v = { re: w.re.slice(), im: w.im.slice() };
      if (!(beta > 1e-12 * before) && j + 1 < n) {
        // an invariant subspace: continue from a fresh direction (H stays block triangular)
        const r = fresh();
        orthogonalise(V, j + 1, r);
        orthogonalise(V, j + 1, r);
        scaleTo(r, 1 / norm(r));
        v.re.set(r.re); v.im.set(r.im);
        beta = 0;
      } else scaleTo(v, beta > 0 ? 1 / beta : 0);
      H.re[(j + 1) * m + j] = beta;
      H.im[(j + 1) * m + j] = 0;
      V.push(v);
    }
    built = m;
    checks++;
    const done = converged(H, m, n, thetaMin, tol);
    if (done) return finish(V, H, m, sigma, done, checks);
    if (m === n) throw new Error(`shiftInvertEigs: the full Krylov space (n = ${n}) did not converge`);
    m = Math.min(n, Math.ceil(1.5 * m));
  }
}

interface Converged { theta: { re: Float64Array; im: Float64Array }; y: CMatrix }

/** The wanted Ritz pairs when all have converged and one converged value lies beyond the disk, else null. */
function converged(H: CMatrix, m: number, n: number, thetaMin: number, tol: number): Converged | null {
  const sq = cmatrix(m, m);
  for (let i = 0; i < m; i++) for (let j = 0; j < m; j++) { sq.re[i * m + j] = H.re[i * m + j]; sq.im[i * m + j] = H.im[i * m + j]; }
  const ev = hessenbergEigenvalues(sq);
  const order = Array.from({ length: m }, (_, i) => i).sort((a, b) => Math.hypot(ev.re[b], ev.im[b]) - Math.hypot(ev.re[a], ev.im[a]));
  const inside = order.filter((i) => Math.hypot(ev.re[i], ev.im[i]) >= thetaMin);
  const probe = order.filter((i) => Math.hypot(ev.re[i], ev.im[i]) < thetaMin).slice(0, 3);
  const pick = [...inside, ...probe];
  const theta = { re: Float64Array.from(pick, (i) => ev.re[i]), im: Float64Array.from(pick, (i) => ev.im[i]) };
  const y = hessenbergEigenvectors(sq, m, theta);
  const beta = Math.hypot(H.re[m * m + m - 1], H.im[m * m + m - 1]), full = m === n;
  const ok = (c: number) => full || beta * Math.hypot(y.re[(m - 1) * pick.length + c], y.im[(m - 1) * pick.length + c]) <= tol * Math.hypot(theta.re[c], theta.im[c]);
  for (let c = 0; c < inside.length; c++) if (!ok(c)) return null;
  if (!full && !probe.some((_, k) => ok(inside.length + k))) return null;
  const keep = inside.length;
  const yk = cmatrix(m, keep);
  for (let i = 0; i < m; i++) for (let c = 0; c < keep; c++) { yk.re[i * keep + c] = y.re[i * pick.length + c]; yk.im[i * keep + c] = y.im[i * pick.length + c]; }
  return { theta: { re: theta.re.slice(0, keep), im: theta.im.slice(0, keep) }, y: yk };
}

function finish(V: ComplexVector[], H: CMatrix, m: number, sigma: Complex, c: Converged, checks: number): EigsResult {
  const k = c.theta.re.length, n = V[0].re.length;
  const mu = { re: new Float64Array(k), im: new Float64Array(k) }, vectors: ComplexVector[] = [];
  for (let q = 0; q < k; q++) {
    const tr = c.theta.re[q], ti = c.theta.im[q], t2 = tr * tr + ti * ti;
    mu.re[q] = sigma.re + tr / t2;
    mu.im[q] = sigma.im - ti / t2;
    const x = { re: new Float64Array(n), im: new Float64Array(n) };
    for (let j = 0; j < m; j++) {
      const yr = c.y.re[j * k + q], yi = c.y.im[j * k + q], vr = V[j].re, vi = V[j].im;
      for (let i = 0; i < n; i++) {
        x.re[i] += vr[i] * yr - vi[i] * yi;
        x.im[i] += vr[i] * yi + vi[i] * yr;
      }
    }
    vectors.push(x);
  }
  void H;
  return { mu, vectors, krylov: m, checks };
}

/** A (rows × cols) copy of H with its old block in the top-left corner. */
function grow(H: CMatrix, rows: number, cols: number): CMatrix {
  const G = cmatrix(rows, cols);
  for (let i = 0; i < H.rows; i++) for (let j = 0; j < H.cols; j++) { G.re[i * cols + j] = H.re[i * H.cols + j]; G.im[i * cols + j] = H.im[i * H.cols + j]; }
  return G;
}

/** w ← w − V Vᴴ w, twice; returns the coefficients of both passes summed. */
function orthogonalise(V: ComplexVector[], count: number, w: ComplexVector): { re: Float64Array; im: Float64Array } {
  const h = { re: new Float64Array(count), im: new Float64Array(count) }, n = w.re.length;
  let before = norm(w);
  const wr = w.re, wi = w.im;
  for (let pass = 0; pass < 2; pass++) {
    const cr = new Float64Array(count), ci = new Float64Array(count);
    for (let j = 0; j < count; j++) {
      const vr = V[j].re, vi = V[j].im;
      let sr = 0, si = 0;
      for (let i = 0; i < n; i++) {
        const a = vr[i], b = vi[i], x = wr[i], y = wi[i];
        sr += a * x + b * y;
        si += a * y - b * x;
      }
      cr[j] = sr; ci[j] = si;
    }
    for (let j = 0; j < count; j++) {
      const vr = V[j].re, vi = V[j].im, sr = cr[j], si = ci[j];
      for (let i = 0; i < n; i++) {
        const a = vr[i], b = vi[i];
        wr[i] -= a * sr - b * si;
        wi[i] -= a * si + b * sr;
      }
      h.re[j] += sr; h.im[j] += si;
    }
    // a second pass only when the first cancelled much of w (Daniel, Gragg, Kaufman & Stewart 1976, η = 1/√2)
    const after = norm(w);
    if (after >= Math.SQRT1_2 * before) break;
    before = after;
  }
  return h;
}

function norm(v: ComplexVector): number {
  let s = 0;
  for (let i = 0; i < v.re.length; i++) s += v.re[i] * v.re[i] + v.im[i] * v.im[i];
  return Math.sqrt(s);
}

function scaleTo(v: ComplexVector, s: number): void {
  for (let i = 0; i < v.re.length; i++) { v.re[i] *= s; v.im[i] *= s; }
}
