/**
 * An optional block that does not change the field solution: the source's sound power per octave
 * band (results are scaled to it). The duct linings, which do, are read in validate-linings.ts.
 */
import { bandFromIndex, bandOfNominal } from '../acoustics/index.ts';
import { join, type Checker } from './checker.ts';
import { LIMITS, OCTAVE_BAND_KEYS } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { get, readNumber, readObject, required } from './reader.ts';
import type { NormalisedSourcePower, NormalisedSweep } from './types.ts';

export function readSourcePower(ck: Checker, value: Found, sweep: NormalisedSweep | undefined): NormalisedSourcePower | undefined {
  const block = readObject(ck, value, 'sourcePower', 'the source power');
  if (block === undefined) return undefined;
  const path = 'sourcePower.octaveBandsDb';
  const bands = readObject(ck, required(ck, block, 'sourcePower', 'octaveBandsDb', 'the sound power level per octave band', '{"125": 88, "250": 85}'), path, 'the octave-band levels');
  if (bands === undefined) return undefined;
  const keys = OCTAVE_BAND_KEYS.filter((k) => get(bands, k) !== MISSING);
  if (keys.length === 0 && Object.keys(bands).length === 0) {
    ck.error(path, bands, 'count', 'at least one octave band needs a level', `add levels such as "125": 88 (bands: ${OCTAVE_BAND_KEYS.join(', ')} Hz)`);
    return undefined;
  }
  const levels = keys.map((k) => readNumber(ck, bands[k], join(path, k), `the sound power level at ${k} Hz`, { unit: 'dB re 1 pW', min: LIMITS.minLevelDb, max: LIMITS.maxLevelDb }));
  if (levels.some((l) => l === undefined) || keys.length !== Object.keys(bands).length) return undefined;
  const octaveBands = keys.map((k, i) => ({ nominalHz: Number(k), levelDb: levels[i] as number }));
  if (sweep !== undefined) warnUncovered(ck, octaveBands.map((b) => b.nominalHz), sweep);
  return { octaveBands };
}

/** Frequencies of the sweep in octave bands without a level get no scaled result: say so. */
function warnUncovered(ck: Checker, nominals: number[], sweep: NormalisedSweep): void {
  const edges = nominals.map((n) => {
    const band = bandFromIndex(bandOfNominal(n, 1)!.index, 1);
    return [band.lowHz, band.highHz];
  });
  const outside = sweep.frequenciesHz.filter((f) => !edges.some(([lo, hi]) => f >= lo && f < hi));
  if (outside.length === 0) return;
  ck.warn('sourcePower.octaveBandsDb', nominals, 'source-power-bands',
    `${outside.length} of the ${sweep.frequenciesHz.length} swept frequencies (from ${num(outside[0])} Hz) fall in octave bands without a sound power level, so they get no level from it`,
    'add levels for those octave bands, or narrow the sweep');
}
