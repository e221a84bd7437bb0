/**
 * The modes of a uniform duct section at one frequency.
 *
 * With e^{+jωt} (DEVELOPERS.md) and p(x, y, z) = ψ(y, z)·e^{−j k_x x}, the Helmholtz equation
 * ∇·((1/ρ)∇p) + (ω²/κ)p = 0 in a section whose media do not vary along x gives, tested with φ(y, z) and
 * integrated by parts over the cross-section Ω (rigid walls and rigid cores: natural condition):
 *
 *     ∫_Ω (1/ρ)∇ψ·∇φ − (ω²/κ) ψ φ dΩ + k_x² ∫_Ω (1/ρ) ψ φ dΩ = 0     for every φ,
 *
 * ρ and κ complex per region (air, or a porous equivalent fluid). Discretised, with μ = k_x²:
 *
 *     C ψ = μ B ψ,   C = ω² M_κ − K_ρ,   B = M_ρ,
 *
 * both complex *symmetric* (bilinear forms, no conjugation), so eigenvectors of distinct eigenvalues are
 * B-orthogonal in the bilinear sense, ψ_mᵀ B ψ_n = 0, and are normalised here to ψᵀ B ψ = 1 (units of
 * ψ: √(kg)/m^{3/2} in 2D). A section separated in z (dim 1) adds q² = (nπ/h)² to the transverse operator:
 * C = ω² M_κ − K_ρ − q² M_ρ.
 *
 * Which modes: all with |μ − k²| ≤ K² for a transverse cut-off K that the duct chooses per frequency
 * (in a rigid air duct μ = k² − k_t², so that is every mode with transverse wavenumber k_t ≤ K: every
 * propagating one when K ≥ k, and the evanescent ones up to K). One K for all sections keeps the mode
 * counts of neighbouring sections in the ratio of their sizes, as mode matching needs for convergence to
 * the right answer (Mittra, Itoh & Li, IEEE Trans. MTT 20, 1972, "relative convergence").
 *
 * Branch: k_x = √μ with Im k_x ≤ 0, and Re k_x > 0 when Im k_x = 0: with e^{+jωt} the mode e^{−j k_x x}
 * then travels or decays towards +x. Modes are returned sorted by attenuation −Im k_x (least first).
 */
import { factor, solve, multiply, type ComplexCsr, type ComplexVector } from '../linalg/index.ts';
import { shiftInvertEigs } from './arnoldi.ts';
import { csqrt } from './dense.ts';
import type { SectionGrid } from './grid.ts';
import type { Complex } from '../core/complex.ts';
import type { Medium } from '../core/medium.ts';

/** The medium of a slot of the section grid (engine/core's Medium). */
export type SlotMedium = Medium;

export interface ModeSet {
  grid: SectionGrid;
  media: readonly SlotMedium[];
  q2: number; // (nπ/h)² of a z-separated family, 0 in 2D
  count: number;
  kx: { re: Float64Array; im: Float64Array }; // sorted by −Im k_x
  mu: { re: Float64Array; im: Float64Array }; // k_x²
  shapes: ComplexVector[]; // on the grid's dofs, ψᵀ M_ρ ψ = 1
  propagating: number; // modes with Re k_x > −Im k_x (all real k_x in a lossless section)
  lossless: boolean;
  krylov: number; // Krylov dimension the eigen-solver needed
}

export interface ModeRequest {
  omega: number;
  k: number; // ω/c of the air, 1/m
  cutoff: number; // K, 1/m
  q2?: number;
}

/** C, B (and their shared pattern) at one frequency. */
export function pencil(g: SectionGrid, media: readonly SlotMedium[], omega: number, q2 = 0): { C: ComplexCsr; B: ComplexCsr } {
  const nnz = g.pattern.colIdx.length, w2 = omega * omega;
  const C = { ...g.pattern, re: new Float64Array(nnz), im: new Float64Array(nnz) }, B = { ...g.pattern, re: new Float64Array(nnz), im: new Float64Array(nnz) };
  if (media.length < g.slots) throw new RangeError(`pencil: ${media.length} media for ${g.slots} slots`);
  for (let s = 0; s < g.slots; s++) {
    const r = media[s].rhoInv, kp = media[s].kappaInv, K = g.stiffness[s], M = g.mass[s];
    for (let q = 0; q < nnz; q++) {
      const kk = K[q], mm = M[q];
      if (kk === 0 && mm === 0) continue;
      C.re[q] += w2 * kp.re * mm - r.re * kk - q2 * r.re * mm;
      C.im[q] += w2 * kp.im * mm - r.im * kk - q2 * r.im * mm;
      B.re[q] += r.re * mm;
      B.im[q] += r.im * mm;
    }
  }
  return { C, B };
}

/** xᵀ A y (bilinear). */
export function bilinear(A: ComplexCsr, x: ComplexVector, y: ComplexVector): Complex {
  const Ay = multiply(A, y);
  let re = 0, im = 0;
  for (let i = 0; i < A.n; i++) {
    re += x.re[i] * Ay.re[i] - x.im[i] * Ay.im[i];
    im += x.re[i] * Ay.im[i] + x.im[i] * Ay.re[i];
  }
  return { re, im };
}

/** k_x = √μ on the branch Im k_x ≤ 0 (Re k_x > 0 when real). */
export function axialBranch(muRe: number, muIm: number): [number, number] {
  let [r, i] = csqrt(muRe, muIm);
  if (i > 1e-12 * Math.hypot(r, i) || (Math.abs(i) <= 1e-12 * Math.hypot(r, i) && r < 0)) { r = -r; i = -i; }
  return [r, i];
}

export function sectionModes(g: SectionGrid, media: readonly SlotMedium[], req: ModeRequest): ModeSet {
  const { omega, k, cutoff } = req, q2 = req.q2 ?? 0, K2 = cutoff * cutoff;
  const lossless = media.slice(0, g.slots).every((m) => m.rhoInv.im === 0 && m.kappaInv.im === 0);
  const { C, B } = pencil(g, media, omega, q2);
  // a real shift just above the air's k²: no air mode sits there (μ ≤ k²), and the disk around it covers |μ − k²| ≤ K²
  const sigma = k * k + 0.02 * K2, radius = 1.02 * K2;
  const A = { ...g.pattern, re: new Float64Array(C.re.length), im: new Float64Array(C.re.length) };
  for (let q = 0; q < A.re.length; q++) { A.re[q] = C.re[q] - sigma * B.re[q]; A.im[q] = C.im[q] - sigma * B.im[q]; }
  const N = factor(A, g.symbolic);
  const Bx = { re: new Float64Array(g.ndofs), im: new Float64Array(g.ndofs) };
  const apply = (x: ComplexVector, y: ComplexVector) => {
    multiply(B, x, Bx);
    const s = solve(N, Bx);
    y.re.set(s.re); y.im.set(s.im);
  };
  const eigs = shiftInvertEigs(apply, g.ndofs, { re: sigma, im: 0 }, { radius, expected: expectedCount(g, media, k, cutoff, q2) });
  // B-orthonormal bases of repeated eigenvalues first, then each μ refined by the bilinear Rayleigh quotient
  // (second-order accurate for a complex symmetric pencil), then |μ − k²| ≤ K² kept
  const raw = eigs.vectors.map((psi, i) => ({ mu: [eigs.mu.re[i], lossless ? 0 : eigs.mu.im[i]] as [number, number], psi }));
  orthonormalise(B, raw, lossless);
  const picked: { mu: [number, number]; psi: ComplexVector }[] = [];
  for (const r of raw) {
    const num = bilinear(C, r.psi, r.psi), den = bilinear(B, r.psi, r.psi), d2 = den.re * den.re + den.im * den.im;
    const mr = (num.re * den.re + num.im * den.im) / d2, mi = lossless ? 0 : (num.im * den.re - num.re * den.im) / d2;
    if (Math.hypot(mr - k * k, mi) > K2 * (1 + 1e-9)) continue;
    picked.push({ mu: [mr, mi], psi: r.psi });
  }
  const kxs = picked.map((p) => axialBranch(p.mu[0], p.mu[1]));
  const order = picked.map((_, i) => i).sort((a, b) => (-kxs[a][1]) - (-kxs[b][1]) || kxs[b][0] - kxs[a][0]);
  const count = order.length;
  const kx = { re: Float64Array.from(order, (i) => kxs[i][0]), im: Float64Array.from(order, (i) => kxs[i][1]) };
  const mu = { re: Float64Array.from(order, (i) => picked[i].mu[0]), im: Float64Array.from(order, (i) => picked[i].mu[1]) };
  let propagating = 0;
  for (let i = 0; i < count; i++) if (lossless ? mu.re[i] > 0 : kx.re[i] > -kx.im[i]) propagating++;
  return { grid: g, media, q2, count, kx, mu, shapes: order.map((i) => picked[i].psi), propagating, lossless, krylov: eigs.krylov };
}

/** Weyl's estimate of the modes with transverse wavenumber below the cut-off (air) plus the porous regions' own. */
function expectedCount(g: SectionGrid, media: readonly SlotMedium[], k: number, K: number, q2: number): number {
  let n = 0;
  for (let s = 0; s < g.slots; s++) {
    const a = g.slotArea[s];
    if (a === 0) continue;
    // the medium's own wavenumber² relative to the air's, |ρ/κ|·c²
    const rk = Math.hypot(media[s].rhoInv.re, media[s].rhoInv.im), kk = Math.hypot(media[s].kappaInv.re, media[s].kappaInv.im);
    const extra = Math.max(0, (omegaRatio(kk, rk, media[0]) - 1) * k * k);
    const kt2 = Math.max(0, K * K + extra - q2);
    n += g.dim === 2 ? (a * kt2) / (4 * Math.PI) : (a * Math.sqrt(kt2)) / Math.PI;
  }
  return Math.ceil(1.2 * n) + 4;
}

function omegaRatio(kappaInvAbs: number, rhoInvAbs: number, air: SlotMedium): number {
  const airRatio = Math.hypot(air.kappaInv.re, air.kappaInv.im) / Math.hypot(air.rhoInv.re, air.rhoInv.im);
  return kappaInvAbs / rhoInvAbs / airRatio;
}

/**
 * ψᵀBψ = 1, and B-orthogonal (bilinear) within clusters of equal μ, where a repeated eigenvalue leaves
 * the eigen-solver's vectors any basis of the eigenspace. In a lossless section the modes are made real:
 * of the real and imaginary parts of each vector (both eigenvectors of the real pencil), the one that
 * keeps more after orthogonalisation against the cluster's earlier members. Sign: the largest entry has a
 * positive real part.
 */
function orthonormalise(B: ComplexCsr, modes: { mu: [number, number]; psi: ComplexVector }[], real: boolean): void {
  const scale = Math.max(1, ...modes.map((m) => Math.hypot(m.mu[0], m.mu[1])));
  for (let i = 0; i < modes.length; i++) {
    const earlier = modes.slice(0, i).filter((m) => Math.hypot(m.mu[0] - modes[i].mu[0], m.mu[1] - modes[i].mu[1]) <= 1e-6 * scale);
    const v = modes[i].psi;
    const candidates = real ? [{ re: v.re.slice(), im: new Float64Array(v.re.length) }, { re: v.im.slice(), im: new Float64Array(v.re.length) }] : [v];
    let best = candidates[0], bestNorm = -1;
    for (const c of candidates) {
      const before = Math.sqrt(Math.abs(bilinear(B, c, c).re));
      for (const o of earlier) {
        const d = bilinear(B, o.psi, c);
        for (let t = 0; t < c.re.length; t++) {
          c.re[t] -= d.re * o.psi.re[t] - d.im * o.psi.im[t];
          c.im[t] -= d.re * o.psi.im[t] + d.im * o.psi.re[t];
        }
      }
      const nn = bilinear(B, c, c), after = Math.sqrt(Math.hypot(nn.re, nn.im)) / (before || 1);
      if (after > bestNorm) { bestNorm = after; best = c; }
    }
    const psi = best;
    const nn = bilinear(B, psi, psi), [sr, si] = csqrt(nn.re, nn.im), s2 = sr * sr + si * si;
    let ir = sr / s2, ii = -si / s2;
    let big = 0, at = 0;
    for (let t = 0; t < psi.re.length; t++) {
      const m = psi.re[t] ** 2 + psi.im[t] ** 2;
      if (m > big) { big = m; at = t; }
    }
    if (psi.re[at] * ir - psi.im[at] * ii < 0) { ir = -ir; ii = -ii; }
    for (let t = 0; t < psi.re.length; t++) {
      const a = psi.re[t], b = psi.im[t];
      psi.re[t] = a * ir - b * ii;
      psi.im[t] = real ? 0 : a * ii + b * ir;
    }
    modes[i].psi = psi;
  }
}
