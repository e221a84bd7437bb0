/**
 * A closed rigid box: its lowest resonances found from the response to a point source, against
 * f = (c/2)√((l/Lx)² + (m/Ly)² + (n/Lz)²) (Morse & Ingard, Theoretical Acoustics, 1968, §9.4).
 * At a resonance of a lossless closed box the system is singular: the solver must then either return a
 * solution whose residual it checked or stop with a clear error, never a silent wrong answer.
 */
import { describe, expect, it } from 'vitest';
import { RoomProblem, type RoomModel } from '../../engine/solve/room.ts';
import { analyzeMesh, solveAt, SolverFailure } from '../../engine/solve/linear.ts';
import { relativeResidual } from '../../engine/linalg/sparse.ts';

const c = 343, rho = 1.2, [Lx, Ly, Lz] = [1.0, 0.7, 0.5];
const model: RoomModel = {
  box: { x0: 0, x1: Lx, y0: 0, y1: Ly, z0: 0, z1: Lz }, open: [], surfaces: [],
  sources: [{ name: 'Q', position: [0.13, 0.09, 0.07], volumeVelocity: 1e-4 }], receivers: [{ name: 'corner', position: [0.97, 0.66, 0.46] }],
  soundSpeed: c, density: rho, order: 4, pointsPerWavelength: 8, maxFrequencyHz: 450, absorber: { kind: 'discrete', layers: 1 },
};
const prep = new RoomProblem(model);
const now = () => performance.now();

/** j·p at the receiver is real for a lossless box (the load jωQ is imaginary): its poles are the resonances; 1/p changes sign through zero there. */
function inverseResponse(f: number): number {
  try {
    const p = prep.solve(f, now).receivers[0].pressure;
    return 1 / p.im;
  } catch (e) {
    if (e instanceof SolverFailure) return 0; // refused as singular: this frequency is the resonance to solver precision
    throw e;
  }
}

function resonanceNear(f0: number): number {
  let a = f0 * 0.98, b = f0 * 1.02, fa = inverseResponse(a), fb = inverseResponse(b);
  if (Math.sign(fa) === Math.sign(fb)) throw new Error(`no sign change of 1/p around ${f0} Hz`);
  for (let it = 0; it < 40 && b - a > 1e-7 * f0; it++) { // regula falsi with the Illinois modification
    const m = b - (fb * (b - a)) / (fb - fa), fm = inverseResponse(m);
    if (fm === 0) return m;
    if (Math.sign(fm) === Math.sign(fb)) { b = m; fb = fm; fa /= 2; } else { a = m; fa = fm; fb /= 2; }
  }
  return 0.5 * (a + b);
}

describe('rigid box resonances', () => {
  const modes: [number, number, number][] = [[1, 0, 0], [0, 1, 0], [1, 1, 0], [0, 0, 1]];
  const found: number[] = [];
  for (const [l, m, n] of modes) {
    const analytic = (c / 2) * Math.hypot(l / Lx, m / Ly, n / Lz);
    it(`mode (${l}, ${m}, ${n}) at ${analytic.toFixed(2)} Hz within 0.5 %`, () => {
      const f = resonanceNear(analytic);
      found.push(f);
      console.log(`(${l},${m},${n}): analytic ${analytic.toFixed(3)} Hz, found ${f.toFixed(3)} Hz, ${((100 * (f - analytic)) / analytic).toFixed(4)} %`);
      // Source: Morse & Ingard, Theoretical Acoustics (1968), §9.4: f = (c/2)√((l/Lx)² + (m/Ly)² + (n/Lz)²)
      expect(Math.abs(f - analytic) / analytic).toBeLessThan(0.005);
    });
  }
  it('at the discrete resonance itself: a checked solution or a clear error', () => {
    const f = found[0] ?? resonanceNear(c / (2 * Lx));
    const { A, b } = prep.system(f);
    try {
      const x = solveAt(A, analyzeMesh(prep.mesh, A), b, f, now).x;
      // common practice: a returned solution must satisfy its system
      expect(relativeResidual(A, x, b)).toBeLessThan(1e-8);
    } catch (e) {
      expect(e).toBeInstanceOf(SolverFailure);
      expect((e as Error).message).toMatch(/singular or nearly so at f = .* Hz: a resonance of a closed, lossless space/);
    }
  });
});
