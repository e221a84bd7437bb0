// The frequencies a scenario is solved at. Band sweeps place points inside
// IEC 61260-1 bands so that band results (aggregate.ts) average over the band
// rather than sampling only its centre.
import { bandsBetween, type Band, type BandFraction } from './bands.ts';
import { requireCount, requirePositive } from './checks.ts';

export type SweepSpec =
  | { fromHz: number; toHz: number; spacing: 'octave' | 'third-octave'; pointsPerBand?: number }
  | { fromHz: number; toHz: number; spacing: 'linear' | 'log'; count: number }
  | { frequenciesHz: readonly number[] };

export interface Sweep {
  /** Ascending, no duplicates. */
  frequenciesHz: number[];
  /** For band spacings: the bands swept, ascending. */
  bands?: Band[];
  /** For band spacings: bandOfPoint[i] indexes `bands` for frequenciesHz[i]. */
  bandOfPoint?: number[];
}

export function sweepFrequencies(spec: SweepSpec): Sweep {
  if ('frequenciesHz' in spec) return explicitSweep(spec.frequenciesHz);
  requirePositive('fromHz', spec.fromHz);
  requirePositive('toHz', spec.toHz);
  if (spec.toHz < spec.fromHz) {
    throw new RangeError(`toHz (${spec.toHz}) must not be below fromHz (${spec.fromHz})`);
  }
  switch (spec.spacing) {
    case 'octave':
      return bandSweep(spec.fromHz, spec.toHz, 1, spec.pointsPerBand ?? 1);
    case 'third-octave':
      return bandSweep(spec.fromHz, spec.toHz, 3, spec.pointsPerBand ?? 1);
    case 'linear':
      return { frequenciesHz: spread(spec.fromHz, spec.toHz, spec.count, (a, b, t) => a + (b - a) * t) };
    case 'log':
      return { frequenciesHz: spread(spec.fromHz, spec.toHz, spec.count, (a, b, t) => a * (b / a) ** t) };
  }
}

/** n points evenly in log f inside a band: f_low·(f_high/f_low)^((i + ½)/n). */
export function pointsInBand(band: Band, n: number): number[] {
  requireCount('pointsPerBand', n, 1);
  // One point is the exact midband itself, not a rounded power of the edges.
  if (n === 1) return [band.exactHz];
  const ratio = band.highHz / band.lowHz;
  const points: number[] = [];
  for (let i = 0; i < n; i++) points.push(band.lowHz * ratio ** ((i + 0.5) / n));
  return points;
}

function bandSweep(fromHz: number, toHz: number, fraction: BandFraction, n: number): Sweep {
  requireCount('pointsPerBand', n, 1);
  const bands = bandsBetween(fromHz, toHz, fraction);
  const frequenciesHz: number[] = [];
  const bandOfPoint: number[] = [];
  bands.forEach((band, b) => {
    for (const f of pointsInBand(band, n)) {
      frequenciesHz.push(f);
      bandOfPoint.push(b);
    }
  });
  return { frequenciesHz, bands, bandOfPoint };
}

// count = 1 gives the midpoint of the range in the spacing's own measure.
function spread(a: number, b: number, count: number, at: (a: number, b: number, t: number) => number): number[] {
  requireCount('count', count, 1);
  if (count === 1) return [at(a, b, 0.5)];
  const out: number[] = [];
  for (let i = 0; i < count; i++) out.push(i === count - 1 ? b : at(a, b, i / (count - 1)));
  return dedupeSorted(out);
}

function explicitSweep(list: readonly number[]): Sweep {
  list.forEach((f, i) => requirePositive(`frequenciesHz[${i}]`, f));
  return { frequenciesHz: dedupeSorted([...list].sort((x, y) => x - y)) };
}

function dedupeSorted(sorted: number[]): number[] {
  return sorted.filter((f, i) => i === 0 || f !== sorted[i - 1]);
}
