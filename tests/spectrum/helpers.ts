// Oracles and a stand-in scheduler for the spectrum tests: plane-wave four-pole chains play the
// solver (a "solve" is one evaluation of the chain), closed forms integrated densely are the reference.
import { airProperties, closedSideBranchTl, expansionChamberTl, planeWaveTransmission, type Band, type Chain } from '../../engine/acoustics/index.ts';
import { gaussLegendre } from '../../engine/fe/quadrature.ts';
import type { BandQuantity, Sample, SamplingPolicy } from '../../engine/spectrum/index.ts';

export const AIR = airProperties({ temperatureC: 20 });
export const C0 = AIR.soundSpeed;
export const PIPE_AREA = 0.04;

export function seeded(seed: number): () => number {
  let s = seed;
  return () => (s = (s * 16807) % 2147483647) / 2147483647;
}

export const waveNumber = (f: number) => (2 * Math.PI * f) / C0;

/** Expansion chamber of area ratio m and length L between equal pipes. */
export function chamberChain(m: number, length: number): Chain {
  return [
    { kind: 'duct', length: 0.3, area: PIPE_AREA },
    { kind: 'duct', length, area: m * PIPE_AREA },
    { kind: 'duct', length: 0.3, area: PIPE_AREA },
  ];
}

/** Closed side branch of area ratio a = S_b/S and length L on a uniform pipe. */
export function stubChain(areaRatio: number, length: number): Chain {
  return [
    { kind: 'duct', length: 0.3, area: PIPE_AREA },
    { kind: 'branch', area: areaRatio * PIPE_AREA, length, end: 'closed' },
    { kind: 'duct', length: 0.3, area: PIPE_AREA },
  ];
}

/** A "solver": the chain's complex transmission ratio p_t/p_i as one output channel, counted. */
export function chainSolver(chain: Chain): { solve: (f: number) => Sample; count: () => number } {
  let n = 0;
  return {
    solve: (f) => {
      n++;
      const t = planeWaveTransmission(chain, { frequencyHz: f, air: AIR });
      return { frequencyHz: f, re: [t.re], im: [t.im] };
    },
    count: () => n,
  };
}

/** τ(f) of the expansion chamber from the closed form of Davis et al. (1954). */
export const chamberTau = (m: number, length: number) => (f: number) => 10 ** (-expansionChamberTl(m, waveNumber(f), length) / 10);

/** τ(f) of the closed side branch from its closed form (Munjal 1987). */
export const stubTau = (areaRatio: number, length: number) => (f: number) => 10 ** (-closedSideBranchTl(PIPE_AREA, areaRatio * PIPE_AREA, waveNumber(f), length) / 10);

/** Dense reference: composite 10-point Gauss–Legendre on `panels` equal panels of the band (10·panels points). */
export function denseBandMean(g: (f: number) => number, band: Pick<Band, 'lowHz' | 'highHz'>, panels = 40, density?: (f: number) => number): { mean: number; points: number } {
  const rule = gaussLegendre(10), h = (band.highHz - band.lowHz) / panels;
  let num = 0, den = 0;
  for (let p = 0; p < panels; p++) {
    for (let k = 0; k < rule.points.length; k++) {
      const f = band.lowHz + h * (p + (rule.points[k] + 1) / 2), s = density ? density(f) : 1;
      num += rule.weights[k] * s * g(f);
      den += rule.weights[k] * s;
    }
  }
  return { mean: num / den, points: panels * rule.points.length };
}

/** Runs a policy as the sweep scheduler would with `workers` workers, solving synchronously. */
export function runPolicy(policy: SamplingPolicy, solve: (f: number) => Sample, limit = 2000): Sample[] {
  const samples: Sample[] = [];
  while (!policy.done(samples) && samples.length < limit) {
    const next = policy.next(samples);
    if (next.length === 0) break;
    for (const f of next) samples.push(solve(f));
  }
  return samples;
}

export function bandDb(q: BandQuantity, mean: number): number {
  return q.db.sign * 10 * Math.log10(mean / q.db.reference);
}
