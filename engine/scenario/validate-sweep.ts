/**
 * The sweep: a band sweep (octave or third-octave, points per band), an even spread (linear or log,
 * a count) or an explicit list. The frequencies themselves come from acoustics/sweep so that band
 * results and the solved points agree on what a band is.
 */
import { bandsBetween, sweepFrequencies } from '../acoustics/index.ts';
import { item, join, type Checker } from './checker.ts';
import { BAND_SPACINGS, LIMITS, SPACINGS } from './fields.ts';
import { MISSING, num } from './issues.ts';
import { get, readArray, readEnum, readNumber, readNumberOr, readObject, required, type Json, type NumberRule } from './reader.ts';
import type { BandSweep, NormalisedSweep, Spacing } from './types.ts';

const FREQUENCY: NumberRule = { unit: 'Hz', above: 0, max: LIMITS.maxFrequencyHz };
const RANGE_FIELDS = ['fromHz', 'toHz', 'spacing', 'pointsPerBand', 'count'];
const EXAMPLE = '{"fromHz": 63, "toHz": 500, "spacing": "third-octave"}';

export function readSweep(ck: Checker, root: Json): NormalisedSweep | undefined {
  const sweep = readObject(ck, required(ck, root, '', 'sweep', 'the frequency sweep', EXAMPLE), 'sweep', 'the sweep');
  if (sweep === undefined) return undefined;
  if (get(sweep, 'frequenciesHz') !== MISSING) return readList(ck, sweep);
  return readRange(ck, sweep);
}

function readList(ck: Checker, sweep: Json): NormalisedSweep | undefined {
  let clean = true;
  for (const key of RANGE_FIELDS) {
    if (get(sweep, key) === MISSING) continue;
    clean = false;
    ck.error(join('sweep', key), sweep[key], 'sweep-form', 'a sweep either lists frequenciesHz or gives fromHz, toHz and spacing, not both',
      `remove "${key}", or remove "frequenciesHz"`);
  }
  const path = 'sweep.frequenciesHz';
  const list = readArray(ck, sweep.frequenciesHz, path, 'the list of frequencies', { minItems: 1, maxItems: LIMITS.maxFrequencies, itemWhat: 'frequency', itemsWhat: 'frequencies' });
  if (list === undefined) return undefined;
  const frequencies = list.map((f, i) => readNumber(ck, f, item(path, i), 'a frequency', FREQUENCY));
  frequencies.forEach((f, i) => {
    const before = frequencies[i - 1];
    if (i === 0 || f === undefined || before === undefined || f > before) return;
    clean = false;
    ck.error(item(path, i), f, 'ascending', `the frequencies must rise strictly from one to the next (the one before is ${num(before)} Hz)`,
      'sort the list in ascending order and remove repeated frequencies');
  });
  if (!clean || frequencies.some((f) => f === undefined)) return undefined;
  return { spacing: 'list', frequenciesHz: frequencies as number[] };
}

function readRange(ck: Checker, sweep: Json): NormalisedSweep | undefined {
  const fromHz = readNumber(ck, required(ck, sweep, 'sweep', 'fromHz', 'the lowest frequency', '50'), 'sweep.fromHz', 'the lowest frequency', FREQUENCY);
  const toHz = readNumber(ck, required(ck, sweep, 'sweep', 'toHz', 'the highest frequency', '500'), 'sweep.toHz', 'the highest frequency', FREQUENCY);
  const spacing = readEnum(ck, required(ck, sweep, 'sweep', 'spacing', 'the spacing', '"third-octave"'), 'sweep.spacing', 'the spacing', SPACINGS);
  if (fromHz !== undefined && toHz !== undefined && !(fromHz < toHz)) {
    ck.error('sweep.toHz', toHz, 'sweep-order', `the highest frequency must be above the lowest (fromHz = ${num(fromHz)} Hz)`,
      `set toHz above ${num(fromHz)}, or swap fromHz and toHz`);
    return undefined;
  }
  if (spacing === undefined) return undefined;
  const isBand = BAND_SPACINGS.includes(spacing);
  refuseField(ck, sweep, isBand ? 'count' : 'pointsPerBand', spacing);
  const count = isBand ? readPointsPerBand(ck, sweep) : readCount(ck, sweep);
  if (fromHz === undefined || toHz === undefined || count === undefined) return undefined;
  return isBand ? bandSweep(ck, spacing as BandSweep['spacing'], fromHz, toHz, count) : spreadSweep(spacing as 'linear' | 'log', fromHz, toHz, count);
}

function refuseField(ck: Checker, sweep: Json, key: string, spacing: Spacing): void {
  if (get(sweep, key) === MISSING) return;
  const belongs = key === 'count' ? 'linear and log spacing (octave bands take pointsPerBand)' : 'octave and third-octave spacing (linear and log take count)';
  ck.error(join('sweep', key), sweep[key], 'sweep-form', `"${key}" belongs to ${belongs}, and this sweep is "${spacing}"`, `remove "${key}"`);
}

function readPointsPerBand(ck: Checker, sweep: Json): number | undefined {
  return readNumberOr(ck, get(sweep, 'pointsPerBand'), 'sweep.pointsPerBand', 'the number of points per band',
    { integer: true, min: 1 }, 1, 'not given: one point per band, at its exact centre');
}

function readCount(ck: Checker, sweep: Json): number | undefined {
  const what = 'the number of frequencies';
  return readNumber(ck, required(ck, sweep, 'sweep', 'count', what, '12'), 'sweep.count', what, { integer: true, min: 1, max: LIMITS.maxFrequencies });
}

function bandSweep(ck: Checker, spacing: BandSweep['spacing'], fromHz: number, toHz: number, pointsPerBand: number): NormalisedSweep | undefined {
  const bandName = spacing === 'octave' ? 'octave' : 'third-octave';
  // Count the bands before making points, so a huge pointsPerBand costs nothing.
  const bandCount = bandsBetween(fromHz, toHz, spacing === 'octave' ? 1 : 3).length;
  if (bandCount === 0) {
    ck.error('sweep', { fromHz, toHz, spacing }, 'sweep-empty', `no ${bandName} band has its nominal centre between ${num(fromHz)} and ${num(toHz)} Hz`,
      `widen fromHz–toHz to include a nominal ${bandName} centre, or use "spacing": "linear"`);
    return undefined;
  }
  if (bandCount * pointsPerBand > LIMITS.maxFrequencies) {
    ck.error('sweep.pointsPerBand', pointsPerBand, 'sweep-count',
      `${bandCount} bands of ${pointsPerBand} points exceed the ${LIMITS.maxFrequencies} frequencies a sweep may have (each is a full 3D solve)`,
      `set pointsPerBand to at most ${Math.floor(LIMITS.maxFrequencies / bandCount)}, or narrow fromHz–toHz`);
    return undefined;
  }
  const result = sweepFrequencies({ fromHz, toHz, spacing, pointsPerBand });
  return { spacing, fromHz, toHz, pointsPerBand, frequenciesHz: result.frequenciesHz, bands: result.bands ?? [], bandOfPoint: result.bandOfPoint ?? [] };
}

function spreadSweep(spacing: 'linear' | 'log', fromHz: number, toHz: number, count: number): NormalisedSweep {
  const { frequenciesHz } = sweepFrequencies({ fromHz, toHz, spacing, count });
  return { spacing, fromHz, toHz, count, frequenciesHz };
}
