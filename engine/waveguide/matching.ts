/**
 * Mode matching between uniform sections joined at planar interfaces, and the scattering-matrix cascade.
 *
 * In a section, p = Σ_m ψ_m (a_m e^{−j k_m x} + b_m e^{+j k_m x}) and, from jωρu = −∇p,
 * u_x = Σ_m (k_m/ω)(ψ_m/ρ)(a_m e^{−j k_m x} − b_m e^{+j k_m x}), with ψᵀM_ρψ = 1 (modes.ts).
 *
 * Interface between a side s whose open area Γ lies within the other side g's (area step, offset port,
 * plain-to-lined, plain-to-baffled): p and u_x continuous on Γ, u_x = 0 on g's wall outside Γ. With c
 * the amplitudes arriving at the interface and d those leaving, and the coupling integral
 *     W_mn = ∫_Γ ψ_m^s ψ_n^g / ρ_s dΓ,
 * pressure continuity tested with ψ^s/ρ_s over Γ and velocity continuity tested with ψ^g over g's area
 * give (B-orthonormal modes, K = diag k_x):
 *     c_s + d_s = W (c_g + d_g),        K_g (d_g − c_g) = Wᵀ K_s (c_s − d_s),
 * hence (K_g + WᵀK_sW) d_g = 2WᵀK_s c_s + (K_g − WᵀK_sW) c_g and d_s = W(c_g + d_g) − c_s. This is the
 * classical weighting of the pressure by the smaller duct's modes and of the velocity by the larger duct's
 * (Miles, J. Acoust. Soc. Am. 17, 1946; Kirby, J. Sound Vib. 2003, for dissipative sections).
 *
 * Sections and interfaces are joined by scattering matrices (Redheffer's star product), which carry only
 * the decaying factors e^{−j k_m L} (|·| ≤ 1), so long sections with evanescent modes stay well conditioned
 * where transfer matrices would overflow (Redheffer, J. Math. Phys. 41, 1962; Ko & Sambles, J. Opt. Soc.
 * Am. A 5, 1988). Scattering matrix of a two-port: [outgoing left; outgoing right] = [S11 S12; S21 S22]
 * [incoming left; incoming right], amplitudes at the port planes.
 */
import { gaussLegendre } from '../fe/quadrature.ts';
import { interpolation, slotAt, type SectionGrid } from './grid.ts';
import { cmatrix, identity, luFactor, luSolve, matmul, transpose, type CMatrix } from './dense.ts';
import type { ModeSet } from './modes.ts';

export interface Scattering { nl: number; nr: number; s11: CMatrix; s12: CMatrix; s21: CMatrix; s22: CMatrix }

const TOL = 1e-9;

function union(a: ArrayLike<number>, b: ArrayLike<number>): number[] {
  const v = [...Array.from(a), ...Array.from(b)].sort((x, y) => x - y), out: number[] = [];
  for (const x of v) if (out.length === 0 || x - out[out.length - 1] > TOL) out.push(x);
  return out;
}

function fluidAt(g: SectionGrid, fills: Parameters<typeof slotAt>[0], y: number, z: number): number {
  const o = g.outer;
  if (y < o.y0 || y > o.y1 || (g.dim === 2 && (z < o.z0 || z > o.z1))) return -1;
  return slotAt(fills, y, z, g.dim);
}

export interface InterfaceSide { modes: ModeSet; fills: Parameters<typeof slotAt>[0] }

export interface Coupling {
  /** Which side's open area lies within the other's: the pressure is weighted by its modes. */
  smaller: 'left' | 'right';
  /** ∫_Γ ψ_m^s ψ_n^g / ρ_s, modes of the smaller side by rows. */
  W: CMatrix;
}

/**
 * W on Γ by Gauss–Legendre quadrature over the common refinement of both grids (each cell of it lies in
 * one element of each side, where both fields are polynomials: max(p)+1 points per axis are exact).
 * Throws when neither side's open area contains the other's.
 */
export function coupling(left: InterfaceSide, right: InterfaceSide, names: [string, string] = ['left', 'right']): Coupling {
  const gl = left.modes.grid, gr = right.modes.grid, dim = gl.dim;
  if (gr.dim !== dim) throw new RangeError('coupling: both sides must have grids of the same dimension');
  const ys = union([...gl.yNodes, gl.outer.y0, gl.outer.y1], [...gr.yNodes, gr.outer.y0, gr.outer.y1]);
  const zs = dim === 1 ? [0, 1] : union([...gl.zNodes, gl.outer.z0, gl.outer.z1], [...gr.zNodes, gr.outer.z0, gr.outer.z1]);
  let leftOnly = false, rightOnly = false;
  const cells: [number, number, number][] = []; // (i, j, slot of the left side)
  const slotsR: number[] = [];
  for (let j = 0; j + 1 < zs.length; j++) for (let i = 0; i + 1 < ys.length; i++) {
    const ym = 0.5 * (ys[i] + ys[i + 1]), zm = 0.5 * (zs[j] + zs[j + 1]);
    const sl = fluidAt(gl, left.fills, ym, zm), sr = fluidAt(gr, right.fills, ym, zm);
    if (sl >= 0 && sr < 0) leftOnly = true;
    if (sr >= 0 && sl < 0) rightOnly = true;
    if (sl >= 0 && sr >= 0) { cells.push([i, j, sl]); slotsR.push(sr); }
  }
  if (leftOnly && rightOnly) {
    throw new RangeError(`the interface between "${names[0]}" and "${names[1]}": neither cross-section's open area contains the other's; mode matching needs one within the other (insert a short section that contains both)`);
  }
  const smaller: 'left' | 'right' = leftOnly ? 'right' : 'left';
  const s = smaller === 'left' ? left : right, g = smaller === 'left' ? right : left;
  const p = Math.max(gl.order, gr.order), rule = gaussLegendre(p + 1), nqa = rule.points.length, nqc = dim === 1 ? nqa : nqa * nqa;
  const qy = new Float64Array(cells.length * nqc), qz = new Float64Array(cells.length * nqc), qwRe = new Float64Array(cells.length * nqc), qwIm = new Float64Array(cells.length * nqc);
  cells.forEach(([i, j, sl], c) => {
    const slot = smaller === 'left' ? sl : slotsR[c], rhoInv = s.modes.media[slot].rhoInv;
    const hy = ys[i + 1] - ys[i], hz = dim === 1 ? 1 : zs[j + 1] - zs[j];
    for (let b = 0; b < (dim === 1 ? 1 : nqa); b++) for (let a = 0; a < nqa; a++) {
      const q = c * nqc + a + nqa * b;
      qy[q] = ys[i] + 0.5 * hy * (rule.points[a] + 1);
      qz[q] = dim === 1 ? 0 : zs[j] + 0.5 * hz * (rule.points[b] + 1);
      const w = 0.5 * hy * rule.weights[a] * (dim === 1 ? 1 : 0.5 * hz * rule.weights[b]);
      qwRe[q] = w * rhoInv.re;
      qwIm[q] = w * rhoInv.im;
    }
  });
  const vs = valuesAt(s.modes, qy, qz), vg = valuesAt(g.modes, qy, qz);
  // W = Vsᵀ diag(w/ρ_s) Vg
  const nq = qy.length, ns = s.modes.count, ng = g.modes.count;
  const Ws = cmatrix(ns, nq);
  for (let m = 0; m < ns; m++) for (let q = 0; q < nq; q++) {
    const ar = vs.re[q * ns + m], ai = vs.im[q * ns + m];
    Ws.re[m * nq + q] = ar * qwRe[q] - ai * qwIm[q];
    Ws.im[m * nq + q] = ar * qwIm[q] + ai * qwRe[q];
  }
  return { smaller, W: matmul(Ws, { rows: nq, cols: ng, re: vg.re, im: vg.im }) };
}

/** The modes' values at points, nq × count (row q: every mode at point q). */
export function valuesAt(ms: ModeSet, ys: Float64Array, zs: Float64Array): CMatrix {
  const I = interpolation(ms.grid, ys, zs), nq = ys.length, n = ms.count, out = cmatrix(nq, n);
  for (let m = 0; m < n; m++) {
    const psi = ms.shapes[m];
    for (let q = 0; q < nq; q++) {
      let sr = 0, si = 0;
      for (let k = I.ptr[q]; k < I.ptr[q + 1]; k++) { sr += I.w[k] * psi.re[I.idx[k]]; si += I.w[k] * psi.im[I.idx[k]]; }
      out.re[q * n + m] = sr;
      out.im[q * n + m] = si;
    }
  }
  return out;
}

/** Rows `rows` and columns `cols` of A. */
export function pick(A: CMatrix, rows: readonly number[], cols: readonly number[]): CMatrix {
  const B = cmatrix(rows.length, cols.length);
  rows.forEach((r, i) => cols.forEach((c, j) => { B.re[i * cols.length + j] = A.re[r * A.cols + c]; B.im[i * cols.length + j] = A.im[r * A.cols + c]; }));
  return B;
}

/** The interface's scattering matrix from W (ns × ng) and the axial wavenumbers of both sides. */
export function interfaceScattering(W: CMatrix, ks: { re: ArrayLike<number>; im: ArrayLike<number> }, kg: { re: ArrayLike<number>; im: ArrayLike<number> }, smaller: 'left' | 'right'): Scattering {
  const ns = W.rows, ng = W.cols;
  // KsW = diag(ks)·W; P = Wᵀ K_s W
  const KsW = cmatrix(ns, ng);
  for (let m = 0; m < ns; m++) for (let n = 0; n < ng; n++) {
    const wr = W.re[m * ng + n], wi = W.im[m * ng + n];
    KsW.re[m * ng + n] = ks.re[m] * wr - ks.im[m] * wi;
    KsW.im[m * ng + n] = ks.re[m] * wi + ks.im[m] * wr;
  }
  const Wt = transpose(W), P = matmul(Wt, KsW);
  const Z = cmatrix(ng, ng), rhs = cmatrix(ng, ns + ng);
  for (let i = 0; i < ng; i++) {
    for (let j = 0; j < ng; j++) {
      const d = i === j ? 1 : 0;
      Z.re[i * ng + j] = P.re[i * ng + j] + d * kg.re[i];
      Z.im[i * ng + j] = P.im[i * ng + j] + d * kg.im[i];
      rhs.re[i * (ns + ng) + ns + j] = d * kg.re[i] - P.re[i * ng + j];
      rhs.im[i * (ns + ng) + ns + j] = d * kg.im[i] - P.im[i * ng + j];
    }
    for (let m = 0; m < ns; m++) {
      // 2 (WᵀK_s)_{im} = 2 W_{mi} k_m
      rhs.re[i * (ns + ng) + m] = 2 * KsW.re[m * ng + i];
      rhs.im[i * (ns + ng) + m] = 2 * KsW.im[m * ng + i];
    }
  }
  const X = luSolve(luFactor(Z), rhs); // d_g = X [c_s; c_g]
  const dgcs = sub(X, 0, ns), dgcg = sub(X, ns, ng);
  const dscs = matmul(W, dgcs); // W·∂d_g/∂c_s − I
  for (let i = 0; i < ns; i++) dscs.re[i * ns + i] -= 1;
  const IplusX = dgcg;
  for (let i = 0; i < ng; i++) IplusX.re[i * ng + i] += 1;
  const dscg = matmul(W, IplusX); // W (I + ∂d_g/∂c_g)
  for (let i = 0; i < ng; i++) IplusX.re[i * ng + i] -= 1;
  return smaller === 'left'
    ? { nl: ns, nr: ng, s11: dscs, s12: dscg, s21: dgcs, s22: dgcg }
    : { nl: ng, nr: ns, s11: dgcg, s12: dgcs, s21: dscg, s22: dscs };
}

function sub(X: CMatrix, c0: number, cols: number): CMatrix {
  const B = cmatrix(X.rows, cols);
  for (let i = 0; i < X.rows; i++) for (let j = 0; j < cols; j++) { B.re[i * cols + j] = X.re[i * X.cols + c0 + j]; B.im[i * cols + j] = X.im[i * X.cols + c0 + j]; }
  return B;
}

/** A uniform section of length L as a two-port: each mode carried across with e^{−j k_m L}. */
export function propagation(k: { re: ArrayLike<number>; im: ArrayLike<number> }, length: number): Scattering {
  const n = k.re.length, D = cmatrix(n, n);
  for (let m = 0; m < n; m++) {
    // e^{−j k L} = e^{Im(k) L}·e^{−j Re(k) L}, Im k ≤ 0
    const mag = Math.exp(k.im[m] * length), ph = -k.re[m] * length;
    D.re[m * n + m] = mag * Math.cos(ph);
    D.im[m * n + m] = mag * Math.sin(ph);
  }
  return { nl: n, nr: n, s11: cmatrix(n, n), s12: D, s21: { ...D, re: D.re.slice(), im: D.im.slice() }, s22: cmatrix(n, n) };
}

/**
 * A followed by a uniform section: the star product with [0 D; D 0], D = diag(e^{−j k_m L}), in O(n²):
 * S11 = A11, S12 = A12 D, S21 = D A21, S22 = D A22 D.
 */
export function starPropagation(A: Scattering, k: { re: ArrayLike<number>; im: ArrayLike<number> }, length: number): Scattering {
  const n = k.re.length;
  if (A.nr !== n) throw new RangeError(`starPropagation: ${A.nr} modes meet ${n}`);
  const dr = new Float64Array(n), di = new Float64Array(n);
  for (let m = 0; m < n; m++) {
    const mag = Math.exp(k.im[m] * length), ph = -k.re[m] * length;
    dr[m] = mag * Math.cos(ph);
    di[m] = mag * Math.sin(ph);
  }
  const s12 = cmatrix(A.nl, n), s21 = cmatrix(n, A.nl), s22 = cmatrix(n, n);
  for (let i = 0; i < A.nl; i++) for (let j = 0; j < n; j++) {
    const ar = A.s12.re[i * n + j], ai = A.s12.im[i * n + j];
    s12.re[i * n + j] = ar * dr[j] - ai * di[j];
    s12.im[i * n + j] = ar * di[j] + ai * dr[j];
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < A.nl; j++) {
    const ar = A.s21.re[i * A.nl + j], ai = A.s21.im[i * A.nl + j];
    s21.re[i * A.nl + j] = dr[i] * ar - di[i] * ai;
    s21.im[i * A.nl + j] = dr[i] * ai + di[i] * ar;
  }
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    const ar = A.s22.re[i * n + j], ai = A.s22.im[i * n + j];
    const pr = dr[i] * dr[j] - di[i] * di[j], pi = dr[i] * di[j] + di[i] * dr[j];
    s22.re[i * n + j] = ar * pr - ai * pi;
    s22.im[i * n + j] = ar * pi + ai * pr;
  }
  return { nl: A.nl, nr: n, s11: A.s11, s12, s21, s22 };
}

function addInto(A: CMatrix, B: CMatrix): CMatrix {
  for (let i = 0; i < A.re.length; i++) { A.re[i] += B.re[i]; A.im[i] += B.im[i]; }
  return A;
}

function iMinus(A: CMatrix): CMatrix {
  const n = A.rows, B = identity(n);
  for (let i = 0; i < n * n; i++) { B.re[i] -= A.re[i]; B.im[i] -= A.im[i]; }
  return B;
}

/** Redheffer's star product: the two-port A followed by B (A's right port joined to B's left). */
export function star(A: Scattering, B: Scattering): Scattering {
  if (A.nr !== B.nl) throw new RangeError(`star: ${A.nr} modes meet ${B.nl}`);
  const F1 = luFactor(iMinus(matmul(B.s11, A.s22))); // I − B11 A22
  const F2 = luFactor(iMinus(matmul(A.s22, B.s11))); // I − A22 B11
  const X = luSolve(F1, matmul(B.s11, A.s21)); // (I − B11 A22)⁻¹ B11 A21
  const Y = luSolve(F1, B.s12); // (I − B11 A22)⁻¹ B12
  const U = luSolve(F2, A.s21); // (I − A22 B11)⁻¹ A21
  const V = luSolve(F2, matmul(A.s22, B.s12)); // (I − A22 B11)⁻¹ A22 B12
  return {
    nl: A.nl, nr: B.nr,
    s11: addInto(matmul(A.s12, X), A.s11),
    s12: matmul(A.s12, Y),
    s21: matmul(B.s21, U),
    s22: addInto(matmul(B.s21, V), B.s22),
  };
}

/** G_mn = ∫ ψ_m conj(ψ_n) conj(1/ρ) over the section: the Hermitian form of the axial power. */
export function powerGram(ms: ModeSet, indices: readonly number[]): CMatrix {
  const g = ms.grid, n = indices.length, G = cmatrix(n, n), nnz = g.pattern.colIdx.length;
  const Mr = new Float64Array(nnz), Mi = new Float64Array(nnz);
  for (let s = 0; s < g.slots; s++) {
    const r = ms.media[s].rhoInv;
    for (let q = 0; q < nnz; q++) { Mr[q] += r.re * g.mass[s][q]; Mi[q] -= r.im * g.mass[s][q]; }
  }
  const { rowPtr, colIdx } = g.pattern;
  const tr = new Float64Array(g.ndofs), ti = new Float64Array(g.ndofs);
  for (let b = 0; b < n; b++) {
    const psi = ms.shapes[indices[b]];
    // t = M conj(ψ_b)
    for (let i = 0; i < g.ndofs; i++) {
      let sr = 0, si = 0;
      for (let k = rowPtr[i]; k < rowPtr[i + 1]; k++) {
        const xr = psi.re[colIdx[k]], xi = -psi.im[colIdx[k]];
        sr += Mr[k] * xr - Mi[k] * xi;
        si += Mr[k] * xi + Mi[k] * xr;
      }
      tr[i] = sr; ti[i] = si;
    }
    for (let a = 0; a < n; a++) {
      const pa = ms.shapes[indices[a]];
      let sr = 0, si = 0;
      for (let i = 0; i < g.ndofs; i++) { sr += pa.re[i] * tr[i] - pa.im[i] * ti[i]; si += pa.re[i] * ti[i] + pa.im[i] * tr[i]; }
      G.re[a * n + b] = sr;
      G.im[a * n + b] = si;
    }
  }
  return G;
}

/**
 * Time-averaged power through a cross-section towards +x, W = ½ Re ∫ p u_x* dS, from the amplitudes a (towards
 * +x) and b (towards −x) at that plane: W = ½ Re Σ_mn (a+b)_m conj((k_n/ω)(a−b)_n) G_mn.
 */
export function axialPower(G: CMatrix, k: { re: ArrayLike<number>; im: ArrayLike<number> }, omega: number, a: { re: ArrayLike<number>; im: ArrayLike<number> }, b?: { re: ArrayLike<number>; im: ArrayLike<number> }): number {
  const n = G.rows;
  let w = 0;
  for (let m = 0; m < n; m++) {
    const pr = a.re[m] + (b ? b.re[m] : 0), pi = a.im[m] + (b ? b.im[m] : 0);
    for (let q = 0; q < n; q++) {
      const dr = a.re[q] - (b ? b.re[q] : 0), di = a.im[q] - (b ? b.im[q] : 0);
      const ur = (k.re[q] * dr - k.im[q] * di) / omega, ui = (k.re[q] * di + k.im[q] * dr) / omega;
      // (p_m)·conj(u_q)·G_mq
      const xr = pr * ur + pi * ui, xi = pi * ur - pr * ui;
      w += xr * G.re[m * n + q] - xi * G.im[m * n + q];
    }
  }
  return 0.5 * w;
}
