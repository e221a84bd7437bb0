/** Cross-section modes of uniform ducts against closed forms: rigid rectangles and bulk-reacting linings. */
import { describe, expect, it } from 'vitest';
import { buildSectionGrid, type Fill } from '../../engine/waveguide/grid.ts';
import { sectionModes, type SlotMedium } from '../../engine/waveguide/modes.ts';
import { linedChannelWavenumber } from '../../engine/waveguide/lined-dispersion.ts';
import { equivalentFluid, porousMedium, porousWave } from '../../engine/acoustics/index.ts';

const rho = 1.2, c = 343, air: SlotMedium = { rhoInv: { re: 1 / rho, im: 0 }, kappaInv: { re: 1 / (rho * c * c), im: 0 } };

/** μ = k_x² of every rigid-duct mode with k_t ≤ K, largest first (Morse & Ingard 1968: k_t² = (mπ/a)² + (nπ/b)²). */
function rigidModes(k: number, a: number, b: number, K: number): number[] {
  const out: number[] = [];
  for (let m = 0; m * Math.PI / a <= K; m++) for (let n = 0; n * Math.PI / b <= K; n++) {
    const kt2 = (m * Math.PI / a) ** 2 + (n * Math.PI / b) ** 2;
    if (kt2 <= K * K) out.push(k * k - kt2);
  }
  return out.sort((x, y) => y - x);
}

describe('rigid rectangular duct', () => {
  const a = 0.3, b = 0.2, f = 2000, omega = 2 * Math.PI * f, k = omega / c, K = 1.4 * k;
  const errors: number[] = [];
  for (const p of [2, 4, 6, 8, 10]) {
    it(`order ${p}: every mode with k_t ≤ 1.4k found, k_x² converging to the closed form`, () => {
      const g = buildSectionGrid({ outer: { y0: 0, y1: a, z0: 0, z1: b }, fills: [], order: p, maxSize: [0.06], dim: 2 });
      const ms = sectionModes(g, [air], { omega, k, cutoff: K }), exact = rigidModes(k, a, b, K);
      // Source: Morse & Ingard, Theoretical Acoustics (1968), modes of a rigid rectangular duct: k_x² = k² − (mπ/a)² − (nπ/b)²
      expect(ms.count).toBe(exact.length);
      const err = Math.max(...exact.map((mu, i) => Math.abs(ms.mu.re[i] - mu) / (k * k)));
      errors.push(err);
      console.log(`p = ${p}: ${g.ndofs} dofs, ${ms.count} modes, max |Δk_x²|/k² = ${err.toExponential(2)}, Krylov ${ms.krylov}`);
      // Source: Morse & Ingard (1968), as above; plane wave k_x = k exactly, and the number propagating is the number with k_t < k
      expect(Math.abs(ms.kx.re[0] - k) / k).toBeLessThan(1e-12);
      expect(ms.propagating).toBe(exact.filter((mu) => mu > 0).length);
      if (p === 10) {
        // common practice: spectral convergence in p; at p = 10 the error is at round-off level
        expect(err).toBeLessThan(1e-11);
        for (let i = 1; i < errors.length; i++) expect(errors[i]).toBeLessThan(errors[i - 1]);
      }
    });
  }

  it('z-separated (1D in y per z-order) gives the same k_x² as the closed form', () => {
    const g = buildSectionGrid({ outer: { y0: 0, y1: a, z0: 0, z1: b }, fills: [], order: 8, maxSize: [0.06], dim: 1 });
    for (const n of [0, 1, 2]) {
      const q2 = (n * Math.PI / b) ** 2, ms = sectionModes(g, [air], { omega, k, cutoff: K, q2 });
      const exact: number[] = [];
      for (let m = 0; q2 + (m * Math.PI / a) ** 2 <= K * K; m++) exact.push(k * k - q2 - (m * Math.PI / a) ** 2);
      // Source: Morse & Ingard (1968): for z-order n, k_x² = k² − (nπ/b)² − (mπ/a)²
      expect(ms.count).toBe(exact.length);
      for (let i = 0; i < exact.length; i++) expect(Math.abs(ms.mu.re[i] - exact[i]) / (k * k)).toBeLessThan(1e-10);
    }
  });
});

describe('duct lined on two opposite walls with a bulk-reacting layer', () => {
  const h = 0.05, d = 0.05, sigma = 10_000, width = 2 * (h + d), height = 0.1;
  const fills: Fill[] = [{ rect: { y0: 0, y1: d, z0: 0, z1: height }, material: 0 }, { rect: { y0: 2 * h + d, y1: width, z0: 0, z1: height }, material: 0 }];
  for (const f of [250, 1000, 2000]) {
    it(`at ${f} Hz the least attenuated mode's k_x matches the exact transverse eigenvalue equation (1D and 2D grids)`, () => {
      const omega = 2 * Math.PI * f, k = omega / c, wave = porousWave('miki', f, sigma, { density: rho, soundSpeed: c });
      const exact = linedChannelWavenumber({ halfWidth: h, thickness: d, airDensity: rho, k, porousDensity: equivalentFluid(wave, omega).density, porousWavenumber: wave.kc });
      const media = [air, porousMedium('miki', f, sigma, { density: rho, soundSpeed: c })];
      for (const dim of [1, 2] as const) {
        const g = buildSectionGrid({ outer: { y0: 0, y1: width, z0: 0, z1: height }, fills, order: 6, maxSize: [0.025, 0.0125], dim });
        const ms = sectionModes(g, media, { omega, k, cutoff: 1.5 * k + 40 });
        const rel = Math.hypot(ms.kx.re[0] - exact.kx.re, ms.kx.im[0] - exact.kx.im) / Math.hypot(exact.kx.re, exact.kx.im);
        console.log(`${f} Hz, dim ${dim}: k_x = ${ms.kx.re[0].toFixed(6)} ${ms.kx.im[0].toFixed(6)}j, exact ${exact.kx.re.toFixed(6)} ${exact.kx.im.toFixed(6)}j, rel. ${rel.toExponential(2)}`);
        // Source: Scott, Proc. Phys. Soc. 58 (1946); Morse & Ingard, Theoretical Acoustics (1968): (k_y/ρ₀)tan(k_y h) + (k_py/ρ_p)tan(k_py d) = 0
        expect(rel).toBeLessThan(0.005);
        // common practice: with e^{+jωt} a wave travelling towards +x decays, Im k_x ≤ 0 for every mode
        expect(Math.max(...ms.kx.im)).toBeLessThanOrEqual(0);
        for (let i = 1; i < ms.count; i++) expect(-ms.kx.im[i]).toBeGreaterThanOrEqual(-ms.kx.im[i - 1]);
      }
    });
  }
});

describe('the shift-invert Arnoldi solver', () => {
  it('finds every eigenvalue of a lossy lined 2D section with a rigid core inside the wanted disk, as a dense solve of B⁻¹C does', async () => {
    const { pencil } = await import('../../engine/waveguide/modes.ts');
    const { cmatrix, eigenvalues, solveDense } = await import('../../engine/waveguide/dense.ts');
    const f = 3000, omega = 2 * Math.PI * f, k = omega / c, K = 1.6 * k;
    const media = [air, porousMedium('delany-bazley', f, 15_000, { density: rho, soundSpeed: c })];
    const g = buildSectionGrid({ outer: { y0: 0, y1: 0.3, z0: 0, z1: 0.2 }, fills: [{ rect: { y0: 0, y1: 0.06, z0: 0, z1: 0.2 }, material: 0 }, { rect: { y0: 0.2, y1: 0.25, z0: 0.05, z1: 0.1 }, material: 'rigid' }], order: 3, maxSize: [0.05, 0.04], dim: 2 });
    const ms = sectionModes(g, media, { omega, k, cutoff: K });
    const { C, B } = pencil(g, media, omega), n = g.ndofs, dense = (A: typeof C) => {
      const M = cmatrix(n, n);
      for (let i = 0; i < n; i++) for (let q = A.rowPtr[i]; q < A.rowPtr[i + 1]; q++) { M.re[i * n + A.colIdx[q]] = A.re[q]; M.im[i * n + A.colIdx[q]] = A.im[q]; }
      return M;
    };
    const ev = eigenvalues(solveDense(dense(B), dense(C)));
    const inside: [number, number][] = [];
    for (let i = 0; i < n; i++) if (Math.hypot(ev.re[i] - k * k, ev.im[i]) <= K * K * (1 - 1e-6)) inside.push([ev.re[i], ev.im[i]]);
    console.log(`${n} dofs: ${inside.length} eigenvalues in the disk by the dense solve, ${ms.count} by Arnoldi (Krylov ${ms.krylov})`);
    // common practice: a dense QR eigen-solve of the same pencil is the oracle of a Krylov method's completeness
    expect(ms.count).toBe(inside.length);
    for (const [re, im] of inside) {
      const d = Math.min(...Array.from(ms.mu.re, (x, i) => Math.hypot(x - re, ms.mu.im[i] - im)));
      expect(d / (k * k)).toBeLessThan(1e-8);
    }
  });
});
