/**
 * Small dense complex linear algebra for the waveguide module: products, LU with partial pivoting,
 * Householder reduction to Hessenberg form, the shifted QR algorithm for the eigenvalues of a complex
 * upper Hessenberg matrix, and inverse iteration for its eigenvectors.
 *
 * Layout: row-major, split re/im (`CMatrix`), entry (i, j) at i·cols + j. Sizes here are the Krylov
 * dimension of an Arnoldi run or the mode count of a section (tens to a few thousand), so plain loops
 * in cache-friendly order are enough.
 *
 * The QR algorithm: Francis's single-shift form for complex matrices with Wilkinson's shift and
 * deflation on negligible subdiagonals (Golub & Van Loan, Matrix Computations, 4th ed. (2013),
 * §7.5; Wilkinson, The Algebraic Eigenvalue Problem (1965), ch. 8). Eigenvectors by inverse iteration
 * on the Hessenberg matrix, with clusters of (nearly) equal eigenvalues made orthogonal to one another
 * so that a repeated eigenvalue still yields a full basis of its eigenspace (Golub & Van Loan §7.6.1;
 * Peters & Wilkinson, "Inverse iteration, ill-conditioned equations and Newton's method", SIAM Review
 * 21, 1979).
 */

export interface CMatrix {
  rows: number;
  cols: number;
  re: Float64Array; // rows × cols
  im: Float64Array; // rows × cols
}

export function cmatrix(rows: number, cols: number): CMatrix {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

export function identity(n: number): CMatrix {
  const m = cmatrix(n, n);
  for (let i = 0; i < n; i++) m.re[i * n + i] = 1;
  return m;
}

/** C = A·B (no conjugation). */
export function matmul(A: CMatrix, B: CMatrix): CMatrix {
  if (A.cols !== B.rows) throw new RangeError(`matmul: ${A.rows}×${A.cols} by ${B.rows}×${B.cols}`);
  const C = cmatrix(A.rows, B.cols), n = B.cols;
  for (let i = 0; i < A.rows; i++) {
    const ci = i * n;
    for (let k = 0; k < A.cols; k++) {
      const ar = A.re[i * A.cols + k], ai = A.im[i * A.cols + k];
      if (ar === 0 && ai === 0) continue;
      const bk = k * n;
      for (let j = 0; j < n; j++) {
        const br = B.re[bk + j], bi = B.im[bk + j];
        C.re[ci + j] += ar * br - ai * bi;
        C.im[ci + j] += ar * bi + ai * br;
      }
    }
  }
  return C;
}

/** Aᵀ (plain transpose). */
export function transpose(A: CMatrix): CMatrix {
  const T = cmatrix(A.cols, A.rows);
  for (let i = 0; i < A.rows; i++) for (let j = 0; j < A.cols; j++) {
    T.re[j * A.rows + i] = A.re[i * A.cols + j];
    T.im[j * A.rows + i] = A.im[i * A.cols + j];
  }
  return T;
}

/** The leading rows × cols block. */
export function block(A: CMatrix, rows: number, cols: number, r0 = 0, c0 = 0): CMatrix {
  const B = cmatrix(rows, cols);
  for (let i = 0; i < rows; i++) for (let j = 0; j < cols; j++) {
    B.re[i * cols + j] = A.re[(r0 + i) * A.cols + c0 + j];
    B.im[i * cols + j] = A.im[(r0 + i) * A.cols + c0 + j];
  }
  return B;
}

// ---- LU with partial pivoting ----

export interface LU { n: number; lu: CMatrix; piv: Int32Array }

/** PA = LU, row pivoting by modulus (Golub & Van Loan §3.4). Throws on an exactly singular matrix. */
export function luFactor(A: CMatrix): LU {
  const n = A.rows;
  if (A.cols !== n) throw new RangeError('luFactor: square matrix required');
  const lu = { rows: n, cols: n, re: A.re.slice(), im: A.im.slice() }, piv = new Int32Array(n);
  const { re, im } = lu;
  for (let k = 0; k < n; k++) {
    let p = k, best = -1;
    for (let i = k; i < n; i++) {
      const m = re[i * n + k] ** 2 + im[i * n + k] ** 2;
      if (m > best) { best = m; p = i; }
    }
    piv[k] = p;
    if (best === 0) throw new RangeError(`luFactor: the matrix is singular (column ${k})`);
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const a = k * n + j, b = p * n + j;
        let t = re[a]; re[a] = re[b]; re[b] = t;
        t = im[a]; im[a] = im[b]; im[b] = t;
      }
    }
    const dr = re[k * n + k], di = im[k * n + k], d2 = dr * dr + di * di;
    const ir = dr / d2, ii = -di / d2;
    for (let i = k + 1; i < n; i++) {
      const ar = re[i * n + k], ai = im[i * n + k];
      if (ar === 0 && ai === 0) continue;
      const lr = ar * ir - ai * ii, li = ar * ii + ai * ir;
      re[i * n + k] = lr;
      im[i * n + k] = li;
      for (let j = k + 1; j < n; j++) {
        const ur = re[k * n + j], ui = im[k * n + j];
        re[i * n + j] -= lr * ur - li * ui;
        im[i * n + j] -= lr * ui + li * ur;
      }
    }
  }
  return { n, lu, piv };
}

/** X = A⁻¹ B for every column of B, in place of a copy of B. */
export function luSolve(F: LU, B: CMatrix): CMatrix {
  const { n, lu, piv } = F, m = B.cols;
  if (B.rows !== n) throw new RangeError(`luSolve: right-hand side has ${B.rows} rows, expected ${n}`);
  const X = { rows: n, cols: m, re: B.re.slice(), im: B.im.slice() }, { re, im } = X;
  for (let k = 0; k < n; k++) {
    const p = piv[k];
    if (p !== k) for (let j = 0; j < m; j++) {
      const a = k * m + j, b = p * m + j;
      let t = re[a]; re[a] = re[b]; re[b] = t;
      t = im[a]; im[a] = im[b]; im[b] = t;
    }
  }
  for (let k = 0; k < n; k++) for (let i = k + 1; i < n; i++) {
    const lr = lu.re[i * n + k], li = lu.im[i * n + k];
    if (lr === 0 && li === 0) continue;
    for (let j = 0; j < m; j++) {
      const xr = re[k * m + j], xi = im[k * m + j];
      re[i * m + j] -= lr * xr - li * xi;
      im[i * m + j] -= lr * xi + li * xr;
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    const dr = lu.re[k * n + k], di = lu.im[k * n + k], d2 = dr * dr + di * di;
    const ir = dr / d2, ii = -di / d2;
    for (let j = 0; j < m; j++) {
      const xr = re[k * m + j], xi = im[k * m + j];
      re[k * m + j] = xr * ir - xi * ii;
      im[k * m + j] = xr * ii + xi * ir;
    }
    for (let i = 0; i < k; i++) {
      const ur = lu.re[i * n + k], ui = lu.im[i * n + k];
      if (ur === 0 && ui === 0) continue;
      for (let j = 0; j < m; j++) {
        const xr = re[k * m + j], xi = im[k * m + j];
        re[i * m + j] -= ur * xr - ui * xi;
        im[i * m + j] -= ur * xi + ui * xr;
      }
    }
  }
  return X;
}

export function solveDense(A: CMatrix, B: CMatrix): CMatrix {
  return luSolve(luFactor(A), B);
}

// ---- eigenvalues ----

/** Householder reduction A = Q H Qᴴ to upper Hessenberg form (Golub & Van Loan, Alg. 7.4.2); H is returned, Q is not kept. */
export function hessenberg(A: CMatrix): CMatrix {
  const n = A.rows, H = { rows: n, cols: n, re: A.re.slice(), im: A.im.slice() }, { re, im } = H;
  const vr = new Float64Array(n), vi = new Float64Array(n);
  for (let k = 0; k < n - 2; k++) {
    let alpha2 = 0;
    for (let i = k + 1; i < n; i++) alpha2 += re[i * n + k] ** 2 + im[i * n + k] ** 2;
    const alpha = Math.sqrt(alpha2);
    if (alpha === 0) continue;
    // v = x + e^{jθ}‖x‖ e₁ with θ the phase of x₁: no cancellation
    const x1r = re[(k + 1) * n + k], x1i = im[(k + 1) * n + k], x1 = Math.hypot(x1r, x1i);
    const pr = x1 === 0 ? 1 : x1r / x1, pi = x1 === 0 ? 0 : x1i / x1;
    let v2 = 0;
    for (let i = k + 1; i < n; i++) {
      vr[i] = re[i * n + k];
      vi[i] = im[i * n + k];
    }
    vr[k + 1] += pr * alpha;
    vi[k + 1] += pi * alpha;
    for (let i = k + 1; i < n; i++) v2 += vr[i] ** 2 + vi[i] ** 2;
    const beta = 2 / v2;
    // H ← (I − β v vᴴ) H: rows k+1..n−1
    for (let j = 0; j < n; j++) {
      let sr = 0, si = 0; // vᴴ H[:, j]
      for (let i = k + 1; i < n; i++) {
        const hr = re[i * n + j], hi = im[i * n + j];
        sr += vr[i] * hr + vi[i] * hi;
        si += vr[i] * hi - vi[i] * hr;
      }
      sr *= beta; si *= beta;
      for (let i = k + 1; i < n; i++) {
        re[i * n + j] -= vr[i] * sr - vi[i] * si;
        im[i * n + j] -= vr[i] * si + vi[i] * sr;
      }
    }
    // H ← H (I − β v vᴴ): columns k+1..n−1
    for (let i = 0; i < n; i++) {
      let sr = 0, si = 0; // H[i, :] v
      for (let j = k + 1; j < n; j++) {
        const hr = re[i * n + j], hi = im[i * n + j];
        sr += hr * vr[j] - hi * vi[j];
        si += hr * vi[j] + hi * vr[j];
      }
      sr *= beta; si *= beta;
      for (let j = k + 1; j < n; j++) {
        // −= s·conj(v_j)
        re[i * n + j] -= sr * vr[j] + si * vi[j];
        im[i * n + j] -= si * vr[j] - sr * vi[j];
      }
    }
    for (let i = k + 2; i < n; i++) {
      re[i * n + k] = 0;
      im[i * n + k] = 0;
    }
  }
  return H;
}

export interface Eigenvalues { re: Float64Array; im: Float64Array }

const EPS = 2.220446049250313e-16;

/**
 * Eigenvalues of an upper Hessenberg matrix (only the upper Hessenberg part of H is read) by the shifted
 * QR algorithm with Givens rotations. The matrix is copied. Throws if an eigenvalue needs more than
 * 60 sweeps (never seen; the exceptional shifts at 10 and 20 break the known cycles).
 */
export function hessenbergEigenvalues(H0: CMatrix): Eigenvalues {
  const n = H0.rows, re = H0.re.slice(), im = H0.im.slice();
  const out: Eigenvalues = { re: new Float64Array(n), im: new Float64Array(n) };
  const cs = new Float64Array(n), sr = new Float64Array(n), si = new Float64Array(n);
  let hi = n - 1, iter = 0;
  while (hi >= 0) {
    // find the bottom of the active unreduced block
    let lo = hi;
    while (lo > 0) {
      const sub = Math.hypot(re[lo * n + lo - 1], im[lo * n + lo - 1]);
      const diag = Math.hypot(re[lo * n + lo], im[lo * n + lo]) + Math.hypot(re[(lo - 1) * n + lo - 1], im[(lo - 1) * n + lo - 1]);
      if (sub <= EPS * (diag === 0 ? 1 : diag)) {
        re[lo * n + lo - 1] = 0;
        im[lo * n + lo - 1] = 0;
        break;
      }
      lo--;
    }
    if (lo === hi) {
      out.re[hi] = re[hi * n + hi];
      out.im[hi] = im[hi * n + hi];
      hi--;
      iter = 0;
      continue;
    }
    if (++iter > 60) throw new Error(`hessenbergEigenvalues: no convergence at row ${hi} of ${n}`);
    // Wilkinson's shift: the eigenvalue of the trailing 2×2 block nearer its last diagonal entry
    let mur: number, mui: number;
    const ar = re[(hi - 1) * n + hi - 1], ai = im[(hi - 1) * n + hi - 1], br = re[(hi - 1) * n + hi], bi = im[(hi - 1) * n + hi];
    const cr = re[hi * n + hi - 1], ci = im[hi * n + hi - 1], dr = re[hi * n + hi], di = im[hi * n + hi];
    if (iter % 10 === 0) {
      mur = dr + Math.abs(cr) + (hi >= 2 ? Math.abs(re[(hi - 1) * n + hi - 2]) : 0);
      mui = di;
    } else {
      const tr = 0.5 * (ar - dr), ti = 0.5 * (ai - di); // (a − d)/2
      const qr = tr * tr - ti * ti + (br * cr - bi * ci), qi = 2 * tr * ti + (br * ci + bi * cr);
      const [sqr, sqi] = csqrt(qr, qi);
      // μ = d − bc/((a−d)/2 ± √…), the sign that makes the denominator large
      let er = tr + sqr, ei = ti + sqi;
      if (er * er + ei * ei < (tr - sqr) ** 2 + (ti - sqi) ** 2) { er = tr - sqr; ei = ti - sqi; }
      const e2 = er * er + ei * ei;
      if (e2 === 0) { mur = dr; mui = di; } else {
        const bcr = br * cr - bi * ci, bci = br * ci + bi * cr;
        mur = dr - (bcr * er + bci * ei) / e2;
        mui = di - (bci * er - bcr * ei) / e2;
      }
    }
    for (let k = lo; k <= hi; k++) { re[k * n + k] -= mur; im[k * n + k] -= mui; }
    // H − μI = QR by rotations of rows k, k+1 (columns k..hi of the active block)
    for (let k = lo; k < hi; k++) {
      const xr = re[k * n + k], xi = im[k * n + k], yr = re[(k + 1) * n + k], yi = im[(k + 1) * n + k];
      const ax = Math.hypot(xr, xi), nu = Math.hypot(ax, Math.hypot(yr, yi));
      let c: number, s_r: number, s_i: number;
      if (nu === 0) { c = 1; s_r = 0; s_i = 0; } else if (ax === 0) { c = 0; s_r = yr / nu; s_i = -yi / nu; } else {
        c = ax / nu;
        // s = (x/|x|)·conj(y)/ν
        const ur = xr / ax, ui = xi / ax;
        s_r = (ur * yr + ui * yi) / nu;
        s_i = (ui * yr - ur * yi) / nu;
      }
      cs[k] = c; sr[k] = s_r; si[k] = s_i;
      for (let j = k; j <= hi; j++) {
        const pr = re[k * n + j], pi = im[k * n + j], qr = re[(k + 1) * n + j], qi = im[(k + 1) * n + j];
        re[k * n + j] = c * pr + s_r * qr - s_i * qi;
        im[k * n + j] = c * pi + s_r * qi + s_i * qr;
        // −conj(s)·p + c·q
        re[(k + 1) * n + j] = -(s_r * pr + s_i * pi) + c * qr;
        im[(k + 1) * n + j] = -(s_r * pi - s_i * pr) + c * qi;
      }
    }
    // R Q: columns k, k+1 by Gᴴ (rows lo..min(k+2, hi))
    for (let k = lo; k < hi; k++) {
      const c = cs[k], s_r = sr[k], s_i = si[k], top = Math.min(k + 2, hi);
      for (let i = lo; i <= top; i++) {
        const pr = re[i * n + k], pi = im[i * n + k], qr = re[i * n + k + 1], qi = im[i * n + k + 1];
        // col k: c·p + conj(s)·q ; col k+1: −s·p + c·q
        re[i * n + k] = c * pr + s_r * qr + s_i * qi;
        im[i * n + k] = c * pi + s_r * qi - s_i * qr;
        re[i * n + k + 1] = -(s_r * pr - s_i * pi) + c * qr;
        im[i * n + k + 1] = -(s_r * pi + s_i * pr) + c * qi;
      }
    }
    for (let k = lo; k <= hi; k++) { re[k * n + k] += mur; im[k * n + k] += mui; }
  }
  return out;
}

/** Principal square root of a complex number. */
export function csqrt(x: number, y: number): [number, number] {
  const r = Math.hypot(x, y);
  if (r === 0) return [0, 0];
  const a = Math.sqrt(0.5 * (r + Math.abs(x))), b = (0.5 * y) / a;
  return x >= 0 ? [a, b] : [Math.abs(b), y >= 0 ? a : -a];
}

/** Every eigenvalue of a general square complex matrix: Hessenberg reduction, then QR. */
export function eigenvalues(A: CMatrix): Eigenvalues {
  return hessenbergEigenvalues(hessenberg(A));
}

/**
 * Unit eigenvectors y of the leading n × n Hessenberg block of H (H may carry one extra row, as an
 * Arnoldi matrix does) for the given eigenvalues, by inverse iteration with (H − λI) factored by
 * Gaussian elimination with partial pivoting (O(n²) for a Hessenberg matrix). Eigenvalues closer than
 * `clusterTol`·max|λ| to an earlier one are treated as one cluster: each new vector is made orthogonal
 * to the cluster's earlier ones, so a repeated eigenvalue gives independent vectors. Returns an n × count
 * matrix (column i for lambdas[i]).
 */
export function hessenbergEigenvectors(H: CMatrix, n: number, lambdas: Eigenvalues, clusterTol = 1e-8): CMatrix {
  const count = lambdas.re.length, Y = cmatrix(n, count);
  let scale = 0;
  for (let i = 0; i < count; i++) scale = Math.max(scale, Math.hypot(lambdas.re[i], lambdas.im[i]));
  let hnorm = 0;
  for (let i = 0; i < n; i++) for (let j = Math.max(0, i - 1); j < n; j++) hnorm = Math.max(hnorm, Math.hypot(H.re[i * H.cols + j], H.im[i * H.cols + j]));
  const work = cmatrix(n, n), piv = new Int32Array(n);
  const xr = new Float64Array(n), xi = new Float64Array(n);
  let seed = 12345;
  const rand = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
  for (let c = 0; c < count; c++) {
    const lr = lambdas.re[c], li = lambdas.im[c];
    const cluster: number[] = [];
    for (let d = 0; d < c; d++) if (Math.hypot(lambdas.re[d] - lr, lambdas.im[d] - li) <= clusterTol * Math.max(scale, hnorm)) cluster.push(d);
    // a tiny offset keeps H − λI invertible when λ is exact to round-off
    const off = EPS * Math.max(hnorm, 1e-300) * 10;
    hessenbergLu(H, n, lr + off, li + off, work, piv);
    for (let i = 0; i < n; i++) { xr[i] = rand(); xi[i] = rand(); }
    for (let it = 0; it < 3; it++) {
      hessenbergLuSolve(work, piv, n, xr, xi);
      for (const d of cluster) orthogonaliseAgainst(Y, d, xr, xi);
      normalise(xr, xi);
    }
    for (let i = 0; i < n; i++) { Y.re[i * count + c] = xr[i]; Y.im[i * count + c] = xi[i]; }
  }
  return Y;
}

function orthogonaliseAgainst(Y: CMatrix, col: number, xr: Float64Array, xi: Float64Array): void {
  const n = Y.rows, m = Y.cols;
  let dr = 0, di = 0; // yᴴ x
  for (let i = 0; i < n; i++) {
    const yr = Y.re[i * m + col], yi = Y.im[i * m + col];
    dr += yr * xr[i] + yi * xi[i];
    di += yr * xi[i] - yi * xr[i];
  }
  for (let i = 0; i < n; i++) {
    const yr = Y.re[i * m + col], yi = Y.im[i * m + col];
    xr[i] -= dr * yr - di * yi;
    xi[i] -= dr * yi + di * yr;
  }
}

function normalise(xr: Float64Array, xi: Float64Array): void {
  let s = 0;
  for (let i = 0; i < xr.length; i++) s += xr[i] * xr[i] + xi[i] * xi[i];
  const inv = s > 0 ? 1 / Math.sqrt(s) : 0;
  for (let i = 0; i < xr.length; i++) { xr[i] *= inv; xi[i] *= inv; }
}

/** (H − λI) = P L U for the leading n × n Hessenberg block: one multiplier per column. */
function hessenbergLu(H: CMatrix, n: number, lr: number, li: number, W: CMatrix, piv: Int32Array): void {
  const { re, im } = W, hc = H.cols;
  re.fill(0); im.fill(0);
  for (let i = 0; i < n; i++) for (let j = Math.max(0, i - 1); j < n; j++) {
    re[i * n + j] = H.re[i * hc + j] - (i === j ? lr : 0);
    im[i * n + j] = H.im[i * hc + j] - (i === j ? li : 0);
  }
  let tiny = 0;
  for (let i = 0; i < n * n; i++) tiny = Math.max(tiny, Math.abs(re[i]) + Math.abs(im[i]));
  tiny = Math.max(tiny * EPS, 1e-300);
  for (let k = 0; k < n; k++) {
    let p = k;
    if (k + 1 < n && Math.hypot(re[(k + 1) * n + k], im[(k + 1) * n + k]) > Math.hypot(re[k * n + k], im[k * n + k])) p = k + 1;
    piv[k] = p;
    if (p !== k) for (let j = k; j < n; j++) {
      const a = k * n + j, b = p * n + j;
      let t = re[a]; re[a] = re[b]; re[b] = t;
      t = im[a]; im[a] = im[b]; im[b] = t;
    }
    if (Math.hypot(re[k * n + k], im[k * n + k]) < tiny) re[k * n + k] = tiny;
    if (k + 1 < n) {
      const dr = re[k * n + k], di = im[k * n + k], d2 = dr * dr + di * di;
      const ar = re[(k + 1) * n + k], ai = im[(k + 1) * n + k];
      const mr = (ar * dr + ai * di) / d2, mi = (ai * dr - ar * di) / d2;
      re[(k + 1) * n + k] = mr; im[(k + 1) * n + k] = mi;
      for (let j = k + 1; j < n; j++) {
        const ur = re[k * n + j], ui = im[k * n + j];
        re[(k + 1) * n + j] -= mr * ur - mi * ui;
        im[(k + 1) * n + j] -= mr * ui + mi * ur;
      }
    }
  }
}

function hessenbergLuSolve(W: CMatrix, piv: Int32Array, n: number, xr: Float64Array, xi: Float64Array): void {
  const { re, im } = W;
  for (let k = 0; k < n - 1; k++) {
    if (piv[k] !== k) {
      let t = xr[k]; xr[k] = xr[k + 1]; xr[k + 1] = t;
      t = xi[k]; xi[k] = xi[k + 1]; xi[k + 1] = t;
    }
    const mr = re[(k + 1) * n + k], mi = im[(k + 1) * n + k];
    xr[k + 1] -= mr * xr[k] - mi * xi[k];
    xi[k + 1] -= mr * xi[k] + mi * xr[k];
  }
  for (let k = n - 1; k >= 0; k--) {
    let sr = xr[k], si = xi[k];
    for (let j = k + 1; j < n; j++) {
      const ur = re[k * n + j], ui = im[k * n + j];
      sr -= ur * xr[j] - ui * xi[j];
      si -= ur * xi[j] + ui * xr[j];
    }
    const dr = re[k * n + k], di = im[k * n + k], d2 = dr * dr + di * di;
    xr[k] = (sr * dr + si * di) / d2;
    xi[k] = (si * dr - sr * di) / d2;
  }
}
