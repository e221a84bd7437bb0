/**
 * Points worth a second look, each with the reason in words. The flags are the engine's own
 * (engine/solve/assess.ts), exactly those the command line writes in spectrum.csv, with the meanings the
 * run's description carries; this file only chooses which mark a point on screen: 'plane_wave_invalid' is
 * not a doubt about the 3D result (only about the plane-wave estimate beside it), so it does not.
 */
import type { AssessedPoint } from '../../../engine/solve/points.ts';

const NOT_A_DOUBT = new Set(['plane_wave_invalid']);

export function pointFlags(p: AssessedPoint, meanings: Readonly<Record<string, string>> = {}): string[] {
  return p.accuracy.flags.filter((f) => !NOT_A_DOUBT.has(f)).map((f) => (meanings[f] ? `${f}: ${meanings[f]}` : f));
}
