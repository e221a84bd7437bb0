/**
 * The general path: the element matrix of a(p, v) by full 3D tensor quadrature, the integrand
 * c₁ Σ_a (S/s_a²) ∂_a φ_I ∂_a φ_J − c₂ S φ_I φ_J evaluated point by point with each axis's own rule.
 * It is the oracle the Kronecker path (element.ts) is tested against, and the fallback for coefficients
 * that do not separate by axis.
 */
import { tabulate } from './basis.ts';
import { ruleFor, stretchAt, type AxisStretch } from './stretch.ts';
import type { Complex } from '../core/complex.ts';

export function quadratureElement(p: number, lo: [number, number, number], hi: [number, number, number], st: [AxisStretch, AxisStretch, AxisStretch], c1: Complex, c2: Complex): { re: Float64Array; im: Float64Array } {
  const n = p + 1, n3 = n * n * n;
  const rules = st.map((s) => ruleFor(s, p)), tabs = rules.map((r) => tabulate(p, r.points));
  const h = [0, 1, 2].map((d) => hi[d] - lo[d]);
  const re = new Float64Array(n3 * n3), im = new Float64Array(n3 * n3);
  const val = new Float64Array(n3), grad = [new Float64Array(n3), new Float64Array(n3), new Float64Array(n3)];
  const s = [new Float64Array(2), new Float64Array(2), new Float64Array(2)];
  const q = [0, 0, 0];
  for (q[2] = 0; q[2] < rules[2].points.length; q[2]++) for (q[1] = 0; q[1] < rules[1].points.length; q[1]++) for (q[0] = 0; q[0] < rules[0].points.length; q[0]++) {
    let wt = 1;
    for (let d = 0; d < 3; d++) {
      wt *= (rules[d].weights[q[d]] * h[d]) / 2;
      stretchAt(st[d], lo[d] + 0.5 * h[d] * (rules[d].points[q[d]] + 1), s[d]);
    }
    for (let c = 0; c < n; c++) for (let b = 0; b < n; b++) for (let a = 0; a < n; a++) {
      const I = a + n * (b + n * c), ab = [a, b, c];
      const v = ab.map((m, d) => tabs[d].values[q[d] * n + m]), g = ab.map((m, d) => (tabs[d].slopes[q[d] * n + m] * 2) / h[d]);
      val[I] = v[0] * v[1] * v[2];
      grad[0][I] = g[0] * v[1] * v[2];
      grad[1][I] = v[0] * g[1] * v[2];
      grad[2][I] = v[0] * v[1] * g[2];
    }
    // S and S/s_a²
    const Sr = s[0][0] * s[1][0] - s[0][1] * s[1][1], Si = s[0][0] * s[1][1] + s[0][1] * s[1][0];
    const SSr = Sr * s[2][0] - Si * s[2][1], SSi = Sr * s[2][1] + Si * s[2][0];
    const coef = s.map((sa) => {
      const m2 = (sa[0] * sa[0] - sa[1] * sa[1]) ** 2 + (2 * sa[0] * sa[1]) ** 2;
      const s2r = sa[0] * sa[0] - sa[1] * sa[1], s2i = 2 * sa[0] * sa[1];
      const qr = (SSr * s2r + SSi * s2i) / m2, qi = (SSi * s2r - SSr * s2i) / m2;
      return [c1.re * qr - c1.im * qi, c1.re * qi + c1.im * qr];
    });
    const mr = c2.re * SSr - c2.im * SSi, mi = c2.re * SSi + c2.im * SSr;
    for (let I = 0; I < n3; I++) for (let J = 0; J < n3; J++) {
      let ar = -mr * val[I] * val[J], ai = -mi * val[I] * val[J];
      for (let d = 0; d < 3; d++) {
        const gg = grad[d][I] * grad[d][J];
        ar += coef[d][0] * gg;
        ai += coef[d][1] * gg;
      }
      re[I * n3 + J] += wt * ar;
      im[I * n3 + J] += wt * ai;
    }
  }
  return { re, im };
}
