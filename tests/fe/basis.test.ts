import { describe, expect, it } from 'vitest';
import { gaussLegendre, gaussLobatto } from '../../engine/fe/quadrature.ts';
import { lobattoNodes, tabulate } from '../../engine/fe/basis.ts';
import { element1D, elementWork, kroneckerElement } from '../../engine/fe/element.ts';
import { quadratureElement } from '../../engine/fe/quadrature3d.ts';
import type { AxisStretch } from '../../engine/fe/stretch.ts';
import { basisAt } from '../../engine/assembly/sources.ts';

const integralOfMonomial = (k: number) => (k % 2 === 1 ? 0 : 2 / (k + 1));

describe('quadrature', () => {
  it('n-point Gauss–Legendre is exact to degree 2n−1 and not 2n', () => {
    for (let n = 1; n <= 10; n++) {
      const r = gaussLegendre(n);
      const q = (k: number) => r.points.reduce((s, x, i) => s + r.weights[i] * x ** k, 0);
      // Source: Abramowitz & Stegun, Handbook of Mathematical Functions (1964), 25.4.29: exact for degree 2n − 1.
      for (let k = 0; k <= 2 * n - 1; k++) expect(q(k)).toBeCloseTo(integralOfMonomial(k), 13);
      expect(Math.abs(q(2 * n) - integralOfMonomial(2 * n))).toBeGreaterThan(1e-6);
    }
  });
  it('n-point Gauss–Lobatto is exact to degree 2n−3, endpoints included', () => {
    for (let n = 2; n <= 10; n++) {
      const r = gaussLobatto(n);
      expect(r.points[0]).toBe(-1);
      expect(r.points[n - 1]).toBe(1);
      const q = (k: number) => r.points.reduce((s, x, i) => s + r.weights[i] * x ** k, 0);
      // Source: Abramowitz & Stegun (1964), 25.4.32: Lobatto integration exact for degree 2n − 3.
      for (let k = 0; k <= 2 * n - 3; k++) expect(q(k)).toBeCloseTo(integralOfMonomial(k), 13);
      expect(Math.abs(q(2 * n - 2) - integralOfMonomial(2 * n - 2))).toBeGreaterThan(1e-6);
    }
  });
});

describe('Lagrange basis on Gauss–Lobatto nodes', () => {
  const pts = Array.from({ length: 17 }, (_, i) => -1 + (2 * i) / 16 + (i % 3 === 1 ? 0.013 : 0));
  for (let p = 1; p <= 6; p++) {
    it(`p = ${p}: interpolates every polynomial of degree ≤ p exactly, partition of unity`, () => {
      const nodes = lobattoNodes(p), t = tabulate(p, pts), n = p + 1;
      for (let q = 0; q < pts.length; q++) {
        let sum = 0, dsum = 0;
        for (let a = 0; a < n; a++) { sum += t.values[q * n + a]; dsum += t.slopes[q * n + a]; }
        // common practice: nodal Lagrange bases sum to one and their derivatives to zero
        expect(sum).toBeCloseTo(1, 13);
        expect(dsum).toBeCloseTo(0, 11);
        for (let m = 0; m <= p; m++) {
          let v = 0, dv = 0;
          for (let a = 0; a < n; a++) { v += nodes[a] ** m * t.values[q * n + a]; dv += nodes[a] ** m * t.slopes[q * n + a]; }
          expect(v).toBeCloseTo(pts[q] ** m, 12);
          expect(dv).toBeCloseTo(m === 0 ? 0 : m * pts[q] ** (m - 1), 10);
        }
      }
    });
  }
  it('3D values are products of 1D factors and their gradients too', () => {
    const p = 3, n = 4, xi: [number, number, number] = [0.3, -0.71, 0.55], h = 1e-6;
    const v = basisAt(p, xi), tx = tabulate(p, [xi[0]]), ty = tabulate(p, [xi[1]]), tz = tabulate(p, [xi[2]]);
    const vx = basisAt(p, [xi[0] + h, xi[1], xi[2]]), vxm = basisAt(p, [xi[0] - h, xi[1], xi[2]]);
    for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) for (let a = 0; a < n; a++) {
      const I = a + n * (b + n * c);
      expect(v[I]).toBeCloseTo(tx.values[a] * ty.values[b] * tz.values[c], 14);
      expect((vx[I] - vxm[I]) / (2 * h)).toBeCloseTo(tx.slopes[a] * ty.values[b] * tz.values[c], 7);
    }
  });
});

describe('Kronecker element matrices against 3D quadrature', () => {
  const c1 = { re: 0.83, im: -0.12 }, c2 = { re: 41.5, im: 3.25 };
  const lo: [number, number, number] = [0.1, -0.2, 0.05], hi: [number, number, number] = [0.35, 0.1, 0.21];
  const none: AxisStretch = { kind: 'none' };
  const full: AxisStretch = { kind: 'constant', re: 1.7, im: -2.3, reduced: false };
  const reduced: AxisStretch = { kind: 'constant', re: 0.9, im: -1.4, reduced: true };
  const smooth: AxisStretch = { kind: 'smooth', origin: -0.2, direction: 1, depth: 0.3, power: 2, alpha: 1.5, beta: 3 };
  const cases: [string, [AxisStretch, AxisStretch, AxisStretch]][] = [
    ['interior', [none, none, none]],
    ['face layer, full rule', [full, none, none]],
    ['face layer, reduced rule', [none, reduced, none]],
    ['edge layer, reduced × smooth', [reduced, smooth, none]],
    ['corner layer, three different rules', [reduced, full, smooth]],
  ];
  for (const p of [1, 2, 4]) for (const [name, st] of cases) {
    it(`p = ${p}, ${name}: equal to 1e-12 (relative to the largest entry)`, () => {
      const X = element1D(p, lo[0], hi[0], st[0]), Y = element1D(p, lo[1], hi[1], st[1]), Z = element1D(p, lo[2], hi[2], st[2]);
      const w = elementWork(p);
      kroneckerElement(X, Y, Z, c1.re, c1.im, c2.re, c2.im, w);
      const q = quadratureElement(p, lo, hi, st, c1, c2);
      let scale = 0, err = 0;
      for (let t = 0; t < w.re.length; t++) {
        scale = Math.max(scale, Math.hypot(q.re[t], q.im[t]));
        err = Math.max(err, Math.hypot(q.re[t] - w.re[t], q.im[t] - w.im[t]));
      }
      // common practice: a separable integrand makes the tensor-product quadrature equal the product of 1D quadratures
      expect(err / scale).toBeLessThan(1e-12);
      // and the matrix is symmetric (bilinear form)
      const n3 = w.n3;
      for (let I = 0; I < n3; I += 3) for (let J = 0; J < n3; J += 5) expect(Math.abs(w.re[I * n3 + J] - w.re[J * n3 + I])).toBeLessThan(1e-12 * scale);
    });
  }
});
