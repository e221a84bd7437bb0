/**
 * Right singular vectors of a small dense complex matrix: Householder QR to an n×n triangle, then
 * one-sided Jacobi (Hestenes) on the triangle. The rational fit (aaa.ts) needs the right singular
 * vector of the smallest singular value of its Loewner matrix; Jacobi computes it to high relative
 * accuracy (Demmel & Veselić, Jacobi's method is more accurate than QR, SIAM J. Matrix Anal. Appl.
 * 13 (1992)), and a QR first makes each sweep cost n³ instead of M·n² for a tall M×n matrix.
 *
 * Layout: column-major, split re/im, element (i, j) at i + j·rows.
 */

export interface ComplexMatrix {
  rows: number;
  cols: number;
  re: Float64Array; // rows·cols
  im: Float64Array; // rows·cols
}

export function complexMatrix(rows: number, cols: number): ComplexMatrix {
  return { rows, cols, re: new Float64Array(rows * cols), im: new Float64Array(rows * cols) };
}

export interface RightSingular {
  /** Singular values, descending. */
  values: Float64Array; // n
  /** V, column k the right singular vector of values[k] (column-major n×n). */
  vectors: ComplexMatrix;
}

/**
 * The n×n upper triangle R of A = QR (Householder), A of size M×n. With M < n the missing rows are
 * zero, so R still has n rows and A's null space shows as zero singular values.
 */
export function triangleOf(a: ComplexMatrix): ComplexMatrix {
  const m = Math.max(a.rows, a.cols), n = a.cols;
  const wr = new Float64Array(m * n), wi = new Float64Array(m * n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < a.rows; i++) {
      wr[i + j * m] = a.re[i + j * a.rows];
      wi[i + j * m] = a.im[i + j * a.rows];
    }
  }
  const vr = new Float64Array(m), vi = new Float64Array(m);
  for (let k = 0; k < n && k < m - 1; k++) {
    let norm2 = 0;
    for (let i = k; i < m; i++) norm2 += wr[i + k * m] ** 2 + wi[i + k * m] ** 2;
    const norm = Math.sqrt(norm2);
    if (norm === 0) continue;
    // v = x − α e₁ with α = −e^{i·arg x₀}‖x‖, so that v has no cancellation in its first entry
    const x0r = wr[k + k * m], x0i = wi[k + k * m], x0 = Math.hypot(x0r, x0i);
    const pr = x0 === 0 ? 1 : x0r / x0, pi = x0 === 0 ? 0 : x0i / x0;
    for (let i = k; i < m; i++) {
      vr[i] = wr[i + k * m];
      vi[i] = wi[i + k * m];
    }
    vr[k] += pr * norm;
    vi[k] += pi * norm;
    let vv = 0;
    for (let i = k; i < m; i++) vv += vr[i] ** 2 + vi[i] ** 2;
    for (let j = k; j < n; j++) {
      // s = vᴴ a_j
      let sr = 0, si = 0;
      for (let i = k; i < m; i++) {
        const ar = wr[i + j * m], ai = wi[i + j * m];
        sr += vr[i] * ar + vi[i] * ai;
        si += vr[i] * ai - vi[i] * ar;
      }
      const fr = (2 * sr) / vv, fi = (2 * si) / vv;
      for (let i = k; i < m; i++) {
        wr[i + j * m] -= vr[i] * fr - vi[i] * fi;
        wi[i + j * m] -= vr[i] * fi + vi[i] * fr;
      }
    }
  }
  const r = complexMatrix(n, n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i <= j; i++) {
      r.re[i + j * n] = wr[i + j * m];
      r.im[i + j * n] = wi[i + j * m];
    }
  }
  return r;
}

const MAX_SWEEPS = 80;

/** Singular values and right singular vectors of A (M×n, any M ≥ 1). */
export function rightSingular(a: ComplexMatrix): RightSingular {
  const n = a.cols;
  const b = a.rows > n ? triangleOf(a) : padRows(a);
  const rows = b.rows;
  const v = complexMatrix(n, n);
  for (let j = 0; j < n; j++) v.re[j + j * n] = 1;
  // Rounding leaves b_pᴴb_q at about rows·ε·‖b_p‖‖b_q‖ even for orthogonal columns: a stricter test cycles.
  const tol = Math.max(rows, 1) * 2 ** -52;
  // A column below ε·‖A‖ is null to working accuracy: rotating it only churns rounding (and denormals).
  let frobenius2 = 0;
  for (let i = 0; i < b.re.length; i++) frobenius2 += b.re[i] ** 2 + b.im[i] ** 2;
  const negligible = frobenius2 * 2 ** -104;
  for (let sweep = 0; sweep < MAX_SWEEPS; sweep++) {
    let rotated = false;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        let alpha = 0, beta = 0, gr = 0, gi = 0; // ‖b_p‖², ‖b_q‖², b_pᴴ b_q
        for (let i = 0; i < rows; i++) {
          const pr = b.re[i + p * rows], pi = b.im[i + p * rows], qr = b.re[i + q * rows], qi = b.im[i + q * rows];
          alpha += pr * pr + pi * pi;
          beta += qr * qr + qi * qi;
          gr += pr * qr + pi * qi;
          gi += pr * qi - pi * qr;
        }
        const g = Math.hypot(gr, gi);
        if (g === 0 || g <= tol * Math.sqrt(alpha * beta) || Math.min(alpha, beta) <= negligible) continue;
        rotated = true;
        // Turn b_q by e^{−iφ} so that b_pᴴ b_q = |g| is real, then a real rotation zeroes it.
        const er = gr / g, ei = -gi / g;
        const zeta = (beta - alpha) / (2 * g);
        const t = (zeta >= 0 ? 1 : -1) / (Math.abs(zeta) + Math.sqrt(1 + zeta * zeta));
        const c = 1 / Math.sqrt(1 + t * t), s = c * t;
        rotateColumns(b.re, b.im, rows, p, q, c, s, er, ei);
        rotateColumns(v.re, v.im, n, p, q, c, s, er, ei);
      }
    }
    if (!rotated) break;
  }
  const norms = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let s = 0;
    for (let i = 0; i < rows; i++) s += b.re[i + j * rows] ** 2 + b.im[i + j * rows] ** 2;
    norms[j] = Math.sqrt(s);
  }
  const order = Array.from({ length: n }, (_, j) => j).sort((x, y) => norms[y] - norms[x] || x - y);
  const values = new Float64Array(n), vectors = complexMatrix(n, n);
  order.forEach((j, k) => {
    values[k] = norms[j];
    vectors.re.set(v.re.subarray(j * n, (j + 1) * n), k * n);
    vectors.im.set(v.im.subarray(j * n, (j + 1) * n), k * n);
  });
  return { values, vectors };
}

/** x_p ← c·x_p − s·e·x_q, x_q ← s·x_p + c·e·x_q (e = e^{−iφ}): one Jacobi rotation of two columns. */
function rotateColumns(re: Float64Array, im: Float64Array, rows: number, p: number, q: number, c: number, s: number, er: number, ei: number): void {
  for (let i = 0; i < rows; i++) {
    const pr = re[i + p * rows], pi = im[i + p * rows];
    const qr0 = re[i + q * rows], qi0 = im[i + q * rows];
    const qr = qr0 * er - qi0 * ei, qi = qr0 * ei + qi0 * er;
    re[i + p * rows] = c * pr - s * qr;
    im[i + p * rows] = c * pi - s * qi;
    re[i + q * rows] = s * pr + c * qr;
    im[i + q * rows] = s * pi + c * qi;
  }
}

function padRows(a: ComplexMatrix): ComplexMatrix {
  if (a.rows === a.cols) return { rows: a.rows, cols: a.cols, re: Float64Array.from(a.re), im: Float64Array.from(a.im) };
  const n = a.cols, out = complexMatrix(n, n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < a.rows; i++) {
      out.re[i + j * n] = a.re[i + j * a.rows];
      out.im[i + j * n] = a.im[i + j * a.rows];
    }
  }
  return out;
}
