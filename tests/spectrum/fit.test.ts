import { describe, expect, it } from 'vitest';
import { aaa, evaluateFit, fitPoint, fitSpectrum, integrate, polesOf, sampleTable, type Sample } from '../../engine/spectrum/index.ts';
import { kronrod15 } from '../../engine/spectrum/quadrature.ts';
import { seeded } from './helpers.ts';

/** Σ_k r_k/(f − p_k) at real f, for known poles p and residues r (complex). */
function partialFractions(poles: [number, number][], residues: [number, number][][]): (f: number, c: number) => [number, number] {
  return (f, c) => {
    let re = 0, im = 0;
    poles.forEach(([pr, pi], k) => {
      const [rr, ri] = residues[k][c], dr = f - pr, di = -pi, d = dr * dr + di * di;
      re += (rr * dr + ri * di) / d;
      im += (ri * dr - rr * di) / d;
    });
    return [re, im];
  };
}

function samplesOf(f: (x: number, c: number) => [number, number], freqs: readonly number[], channels: number): Sample[] {
  return freqs.map((x) => {
    const re: number[] = [], im: number[] = [];
    for (let c = 0; c < channels; c++) [re[c], im[c]] = f(x, c);
    return { frequencyHz: x, re, im };
  });
}

const linspace = (a: number, b: number, n: number) => Array.from({ length: n }, (_, i) => a + ((b - a) * i) / (n - 1));

describe('AAA rational fit', () => {
  it('recovers the poles and residues of a rational function, shared by all outputs', () => {
    const poles: [number, number][] = [[310, 4], [455, 12], [702, 1.5]];
    const residues = [[[3, 1], [0.5, 0]], [[-2, 0.5], [1, 1]], [[0.8, -0.3], [0, 2]]] as [number, number][][];
    const f = partialFractions(poles, residues);
    const t = sampleTable(samplesOf(f, linspace(200, 900, 60), 2));
    const fit = aaa(t.frequencyHz, t.re, t.im, 2);
    const found = polesOf(fit);
    for (const [k, [pr, pi]] of poles.entries()) {
      const p = found.find((q) => Math.hypot(q.re - pr, q.im - pi) < 1e-6 * pr);
      // common practice: a rational function of type (m−1, m−1) is recovered exactly from more than 2m samples (Nakatsukasa, Sète & Trefethen, SIAM J. Sci. Comput. 40 (2018), §2)
      expect(p).toBeDefined();
      for (let c = 0; c < 2; c++) {
        expect(Math.hypot(p!.residueRe[c] - residues[k][c][0], p!.residueIm[c] - residues[k][c][1])).toBeLessThan(1e-6);
      }
    }
    expect(found.length).toBe(3);
  });

  it('finds the poles of tan on the real line between the samples', () => {
    const freqs = linspace(100, 1000, 80);
    const t = sampleTable(freqs.map((x) => ({ frequencyHz: x, re: [Math.tan(x / 150)], im: [0] })));
    const fit = aaa(t.frequencyHz, t.re, t.im, 1);
    const inside = polesOf(fit).filter((p) => p.re > 100 && p.re < 1000);
    // common practice: tan x has simple poles at x = (k + ½)π with residue −1
    expect(inside.map((p) => p.re)).toEqual([1, 2].map((k) => expect.closeTo(150 * (k - 0.5) * Math.PI, 6)));
    for (const p of inside) expect(Math.abs(p.residueRe[0] + 150)).toBeLessThan(1e-6);
    const out = [new Float64Array(1), new Float64Array(1)];
    for (const x of linspace(101, 999, 97)) {
      evaluateFit(fit, x, out[0], out[1]);
      expect(Math.abs(out[0][0] - Math.tan(x / 150))).toBeLessThan(1e-8 * (1 + Math.abs(Math.tan(x / 150))));
    }
  });

  it('returns the sample itself at a support frequency', () => {
    const t = sampleTable(linspace(50, 80, 9).map((x) => ({ frequencyHz: x, re: [Math.cos(x)], im: [Math.sin(x / 3)] })));
    const fit = aaa(t.frequencyHz, t.re, t.im, 1);
    const out = [new Float64Array(1), new Float64Array(1)];
    fit.support.forEach((s, j) => {
      evaluateFit(fit, fit.centre + fit.halfWidth * s, out[0], out[1]);
      expect([out[0][0], out[1][0]]).toEqual([fit.valueRe[j], fit.valueIm[j]]);
    });
  });

  it('removes a Froissart doublet fitted to noise', () => {
    // a smooth function with noise of 1e-9: fitting below the noise makes spurious pole–zero pairs
    const rnd = seeded(29), freqs = linspace(100, 400, 120);
    const t = sampleTable(freqs.map((x) => ({ frequencyHz: x, re: [1 / (1 + (x / 300) ** 2) + 1e-9 * (rnd() - 0.5)], im: [x / 1000] })));
    const clean = aaa(t.frequencyHz, t.re, t.im, 1, { tolerance: 1e-13, cleanupTolerance: 1e-7 });
    for (const p of polesOf(clean)) {
      const residue = Math.hypot(p.residueRe[0], p.residueIm[0]);
      const distance = Math.min(...freqs.map((x) => Math.hypot(x - p.re, p.im)));
      // Source: Nakatsukasa, Sète & Trefethen, SIAM J. Sci. Comput. 40 (2018), §5: spurious poles are those with negligible residues
      expect(residue / distance).toBeGreaterThanOrEqual(1e-7 * 0.99);
    }
  });
});

describe('spectrum fit error estimate', () => {
  it('is the data floor at solved frequencies and bounds the true error between them', () => {
    const f = (x: number): [number, number] => [1 / (1 + ((x - 500) / 20) ** 2), Math.sin(x / 90)];
    const freqs = linspace(300, 700, 17);
    const fit = fitSpectrum(sampleTable(freqs.map((x) => ({ frequencyHz: x, re: [f(x)[0]], im: [f(x)[1]] }))));
    const p = fitPoint(1);
    fit.at(freqs[3], p);
    expect(p.solved).toBe(true);
    expect(p.error[0]).toBe(fit.floor[0]);
    let bounded = 0, n = 0;
    for (const x of linspace(300.5, 699.5, 400)) {
      fit.at(x, p);
      const [re, im] = f(x);
      n++;
      if (Math.hypot(p.re[0] - re, p.im[0] - im) <= p.error[0]) bounded++;
    }
    // the estimate is a cross-validation figure, not a proof: most of the time is the claim
    expect(bounded / n).toBeGreaterThan(0.9);
  });

  it('knows nothing without data to leave out', () => {
    const fit = fitSpectrum(sampleTable([{ frequencyHz: 100, re: [1], im: [0] }, { frequencyHz: 200, re: [2], im: [0] }]));
    const p = fitPoint(1);
    fit.at(150, p);
    expect(p.error[0]).toBe(Infinity);
  });
});

describe('adaptive Gauss–Kronrod quadrature', () => {
  it('integrates polynomials of degree 22 exactly with one 15-point rule', () => {
    for (let d = 0; d <= 22; d++) {
      const r = kronrod15((x) => x ** d, -0.3, 1.7);
      // common practice: the 15-point Kronrod extension of 7-point Gauss is exact to degree 3·7 + 1 = 22 (Piessens et al., QUADPACK, 1983)
      const exact = (1.7 ** (d + 1) - (-0.3) ** (d + 1)) / (d + 1);
      expect(Math.abs(r.value - exact)).toBeLessThan(1e-14 * Math.abs(exact));
    }
  });

  it('integrates a sharp resonance to its closed form, within its own error estimate', () => {
    // ∫ 1/((x − x₀)² + γ²) dx = (atan(u) − atan(v))/γ, u = (b − x₀)/γ, v = (a − x₀)/γ; for uv > −1 as atan((u − v)/(1 + uv)) to avoid cancellation
    for (const [x0, gamma] of [[430.3, 0.05], [430.3, 2], [200, 1e-3]]) {
      const u = (500 - x0) / gamma, v = (400 - x0) / gamma;
      const exact = (u * v > -1 ? Math.atan((u - v) / (1 + u * v)) : Math.atan(u) - Math.atan(v)) / gamma;
      const g = (x: number) => 1 / ((x - x0) ** 2 + gamma ** 2);
      const withBreak = integrate(g, 400, 500, { breakpoints: [x0 - gamma, x0, x0 + gamma] });
      expect(Math.abs(withBreak.value - exact)).toBeLessThanOrEqual(Math.max(withBreak.error, 1e-12 * exact));
      expect(Math.abs(withBreak.value - exact)).toBeLessThan(1e-8 * exact);
      const without = integrate(g, 400, 500, { maxIntervals: 2000 });
      expect(Math.abs(without.value - exact)).toBeLessThan(1e-6 * exact);
    }
  });
});
