/** Rooms through the scenario path: a free field (all six walls open) and a closed rigid room. */
import { describe, expect, it } from 'vitest';
import { readScenario } from '../../engine/scenario/index.ts';
import { prepareProblem } from '../../engine/solve/prepare.ts';
import type { Problem } from '../../engine/solve/problem.ts';
import { SolverFailure } from '../../engine/solve/linear.ts';

const c = 343, rho = 1.2;
const now = () => performance.now();

function room(size: number[], walls: string, sources: object[], receivers: object[], f: number[], ppw = 8, layers = 2): Problem {
  const w = Object.fromEntries(['x-', 'x+', 'y-', 'y+', 'z-', 'z+'].map((k) => [k, walls]));
  return prepareProblem(readScenario(JSON.stringify({
    format: 'quietgrid/1', air: { soundSpeed: c, density: rho }, sweep: { frequenciesHz: f }, mesh: { order: 4, pointsPerWavelength: ppw }, absorber: { layers },
    room: { size, walls: w, sources, receivers },
  })).scenario);
}

function spl(p: Problem, f: number): { re: number; im: number }[] {
  const r = p.solve(f, now);
  if (r.kind !== 'room') throw new Error('not a room');
  return r.receivers.map((x) => x.pressure);
}

describe('free field: every wall open (face, edge and corner layers on all six sides)', () => {
  it('|p| within 2 % of ρω|Q|/(4πr) at r > λ/2', () => {
    const f = 343, Q = 1e-3, L = 1.2, h = L / 2, r = 0.55; // λ = 1 m; the source sits at an element centre
    const dirs = [[1, 0.5, 0.2], [0.3, 1, 0.8], [0.7, 0.6, 1], [-1, 0.9, 0.1], [-0.4, -0.7, 1], [0.8, -1, -0.6]];
    const receivers = dirs.map(([x, y, z], i) => { const n = Math.hypot(x, y, z); return { name: `r${i}`, position: [h + (r * x) / n, h + (r * y) / n, h + (r * z) / n] }; });
    const p = room([L, L, L], 'open', [{ name: 'Q', position: [h, h, h], volumeVelocity: Q }], receivers, [f]);
    const analytic = (rho * 2 * Math.PI * f * Q) / (4 * Math.PI * r);
    const worst = Math.max(...spl(p, f).map((x) => Math.abs(Math.hypot(x.re, x.im) / analytic - 1)));
    console.log(`free-field room, ${p.info.dofs} dofs: worst |p| error ${(100 * worst).toFixed(2)} %`);
    // Source: Kinsler, Frey, Coppens & Sanders, Fundamentals of Acoustics, 4th ed. (2000), §7.4: |p| = ρω|Q|/(4πr)
    expect(worst).toBeLessThan(0.02);
  });
});

describe('rigid room', () => {
  const [Lx, Ly, Lz] = [1.0, 0.7, 0.5];
  const p = room([Lx, Ly, Lz], 'rigid', [{ name: 'Q', position: [0.13, 0.09, 0.07], volumeVelocity: 1e-4 }], [{ name: 'corner', position: [0.97, 0.66, 0.46] }], [450], 8, 1);
  /** 1/Im p at the receiver: real for a lossless room, through zero at a resonance; a refused (singular) solve is the resonance itself. */
  const inverse = (f: number) => { try { return 1 / spl(p, f)[0].im; } catch (e) { if (e instanceof SolverFailure) return 0; throw e; } };
  for (const [l, m, n] of [[1, 0, 0], [0, 1, 0], [1, 1, 0]]) {
    const analytic = (c / 2) * Math.hypot(l / Lx, m / Ly, n / Lz);
    it(`mode (${l}, ${m}, ${n}) at ${analytic.toFixed(1)} Hz within 0.5 %`, () => {
      let a = 0.98 * analytic, b = 1.02 * analytic, fa = inverse(a), fb = inverse(b);
      expect(Math.sign(fa)).not.toBe(Math.sign(fb));
      for (let it = 0; it < 40 && b - a > 1e-6 * analytic; it++) {
        const x = b - (fb * (b - a)) / (fb - fa), fx = inverse(x);
        if (fx === 0) { a = b = x; break; }
        if (Math.sign(fx) === Math.sign(fb)) { b = x; fb = fx; fa /= 2; } else { a = x; fa = fx; fb /= 2; }
      }
      const found = 0.5 * (a + b);
      // Source: Morse & Ingard, Theoretical Acoustics (1968), §9.4: f = (c/2)√((l/Lx)² + (m/Ly)² + (n/Lz)²)
      expect(Math.abs(found - analytic) / analytic).toBeLessThan(0.005);
    });
  }
});
