/**
 * The exact transverse eigenvalue equation of a two-dimensional duct lined on both walls with a
 * bulk-reacting layer, and a root finder for it: the closed form the waveguide's numerical modes are
 * checked against.
 *
 * Air for |y| < h, a porous equivalent fluid (ρ_p, k_p) for h < |y| < h + d, rigid walls at |y| = h + d.
 * A symmetric mode p = ψ(y) e^{−j k_x x} is ψ = cos(k_y y) in the air and ∝ cos(k_py (h + d − |y|)) in the
 * layer (∂ψ/∂y = 0 at the wall), k_y² = k² − k_x², k_py² = k_p² − k_x². Continuity of pressure and of
 * normal velocity (1/ρ)∂ψ/∂y at |y| = h gives
 *     (k_y/ρ₀) tan(k_y h) + (k_py/ρ_p) tan(k_py d) = 0,
 * (Scott, Proc. Phys. Soc. 58, 1946; Morse & Ingard, Theoretical Acoustics, 1968, on ducts with bulk-reacting
 * linings), used here multiplied through by cos(k_y h)·cos(k_py d) so that no pole interrupts the search:
 *     F(μ) = (k_y/ρ₀) sin(k_y h) cos(k_py d) + (k_py/ρ_p) sin(k_py d) cos(k_y h),   μ = k_x²,
 * an even function of k_y and of k_py, so of μ alone.
 *
 * The root that continues the plane wave is found by continuation: the layer's ρ_p and k_p² move from the
 * air's values (where μ = k² is a root) to their own in small steps, each finished by Newton's method with a
 * complex-step-free central difference. Time dependence e^{+jωt}; k_x on the branch Im k_x ≤ 0.
 */
import { axialBranch } from './modes.ts';
import type { Complex } from '../core/complex.ts';

type C = Complex;

const c = (re: number, im = 0): C => ({ re, im });
const add = (a: C, b: C): C => c(a.re + b.re, a.im + b.im);
const sub = (a: C, b: C): C => c(a.re - b.re, a.im - b.im);
const mul = (a: C, b: C): C => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
const div = (a: C, b: C): C => { const d = b.re * b.re + b.im * b.im; return c((a.re * b.re + a.im * b.im) / d, (a.im * b.re - a.re * b.im) / d); };
const sqrtC = (a: C): C => { const r = Math.hypot(a.re, a.im), x = Math.sqrt(0.5 * (r + a.re)), y = Math.sqrt(Math.max(0, 0.5 * (r - a.re))); return c(x, a.im < 0 ? -y : y); };
const sinC = (a: C): C => c(Math.sin(a.re) * Math.cosh(a.im), Math.cos(a.re) * Math.sinh(a.im));
const cosC = (a: C): C => c(Math.cos(a.re) * Math.cosh(a.im), -Math.sin(a.re) * Math.sinh(a.im));

export interface LinedChannel {
  halfWidth: number; // h, the air's half-width, m
  thickness: number; // d, each layer's thickness, m
  airDensity: number;
  k: number; // ω/c₀
  porousDensity: C; // ρ_p, complex
  porousWavenumber: C; // k_p, Im ≤ 0
}

/** F(μ) of the header, with the layer's ρ_p and k_p² given. */
function residual(ch: LinedChannel, mu: C, rhoP: C, kp2: C): C {
  const ky = sqrtC(sub(c(ch.k * ch.k), mu)), kpy = sqrtC(sub(kp2, mu));
  const a = div(mul(ky, sinC(mul(ky, c(ch.halfWidth)))), c(ch.airDensity));
  const b = div(mul(kpy, sinC(mul(kpy, c(ch.thickness)))), rhoP);
  return add(mul(a, cosC(mul(kpy, c(ch.thickness)))), mul(b, cosC(mul(ky, c(ch.halfWidth)))));
}

function newton(ch: LinedChannel, start: C, rhoP: C, kp2: C): C {
  let mu = start;
  const scale = Math.max(1, Math.hypot(start.re, start.im));
  for (let it = 0; it < 60; it++) {
    const f = residual(ch, mu, rhoP, kp2), h = 1e-6 * scale;
    const df = div(sub(residual(ch, add(mu, c(h)), rhoP, kp2), residual(ch, sub(mu, c(h)), rhoP, kp2)), c(2 * h));
    const step = div(f, df);
    mu = sub(mu, step);
    if (Math.hypot(step.re, step.im) <= 1e-14 * scale) break;
  }
  return mu;
}

/** One root, continued from the rigid duct's symmetric mode n (k_y = nπ/(h + d)) as the layer turns from air into the material. */
function continued(ch: LinedChannel, n: number, steps: number): C {
  const k2 = c(ch.k * ch.k), rho0 = c(ch.airDensity), kp2 = mul(ch.porousWavenumber, ch.porousWavenumber);
  let mu = c(ch.k * ch.k - ((n * Math.PI) / (ch.halfWidth + ch.thickness)) ** 2);
  for (let s = 1; s <= steps; s++) {
    const t = s / steps;
    const rhoP = add(rho0, mul(c(t), sub(ch.porousDensity, rho0))), kk = add(k2, mul(c(t), sub(kp2, k2)));
    mu = newton(ch, mu, rhoP, kk);
  }
  return mu;
}

/**
 * The least attenuated symmetric mode: the roots continued from the rigid duct's first `branches` symmetric
 * modes (each path may cross others on its way), the one of smallest −Im k_x.
 */
export function linedChannelWavenumber(ch: LinedChannel, branches = 6, steps = 200): { kx: C; mu: C; residual: number } {
  let best: { kx: C; mu: C } | null = null;
  for (let n = 0; n < branches; n++) {
    const mu = continued(ch, n, steps), [re, im] = axialBranch(mu.re, mu.im);
    if (!Number.isFinite(re) || !Number.isFinite(im)) continue;
    if (best === null || -im < -best.kx.im) best = { kx: c(re, im), mu };
  }
  if (best === null) throw new Error('linedChannelWavenumber: no root found');
  const f = residual(ch, best.mu, ch.porousDensity, mul(ch.porousWavenumber, ch.porousWavenumber));
  return { ...best, residual: Math.hypot(f.re, f.im) };
}
