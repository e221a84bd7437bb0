/**
 * Solved points as the spectrum fit reads them: a frequency and the complex value of each output
 * channel there (for a duct, e.g. the outlet's modal amplitudes per unit incident amplitude; for a
 * room, the receiver pressures). Points from several runs of one scenario join by union: the fit and
 * the band integrals depend on the set of points only, never on their order or on which run solved
 * which, so a union gives the band values of one run over the same points.
 */

export interface Sample {
  frequencyHz: number;
  /** One value per output channel. */
  re: ArrayLike<number>;
  im: ArrayLike<number>;
}

/** Samples in flat arrays, ascending and distinct in frequency. */
export interface SampleTable {
  channels: number;
  frequencyHz: Float64Array; // n
  re: Float64Array; // n·channels, sample-major
  im: Float64Array; // n·channels
}

/** Relative difference below which two solutions of one frequency count as the same result. */
export const DEFAULT_AGREEMENT = 1e-6;

/**
 * The samples as one sorted table. A frequency given twice must carry agreeing values (within
 * `agreement`, relative to the larger magnitude of that channel over all samples); the first is kept.
 */
export function sampleTable(samples: readonly Sample[], agreement = DEFAULT_AGREEMENT): SampleTable {
  const channels = samples.length > 0 ? samples[0].re.length : 0;
  samples.forEach((s, i) => {
    if (!(Number.isFinite(s.frequencyHz) && s.frequencyHz > 0)) throw new RangeError(`sample ${i}: frequencyHz must be a positive finite number (got ${s.frequencyHz})`);
    if (s.re.length !== channels || s.im.length !== channels) throw new RangeError(`sample at ${s.frequencyHz} Hz has ${s.re.length} real and ${s.im.length} imaginary values; every sample needs ${channels} of each`);
    for (let c = 0; c < channels; c++) {
      if (!Number.isFinite(s.re[c]) || !Number.isFinite(s.im[c])) throw new RangeError(`sample at ${s.frequencyHz} Hz: channel ${c} is not a finite number (leave failed solves out of the samples)`);
    }
  });
  const order = samples.map((_, i) => i).sort((a, b) => samples[a].frequencyHz - samples[b].frequencyHz || a - b);
  const scale = new Float64Array(channels);
  for (const s of samples) for (let c = 0; c < channels; c++) scale[c] = Math.max(scale[c], Math.hypot(s.re[c], s.im[c]));
  const kept: number[] = [];
  for (const i of order) {
    const last = kept[kept.length - 1];
    if (last !== undefined && samples[last].frequencyHz === samples[i].frequencyHz) {
      const why = disagreement(samples[last], samples[i], scale, agreement);
      if (why !== null) throw new RangeError(`${samples[i].frequencyHz} Hz was solved twice with different results (${why}): solve it once more, or leave one of them out`);
      continue;
    }
    kept.push(i);
  }
  const n = kept.length, table: SampleTable = { channels, frequencyHz: new Float64Array(n), re: new Float64Array(n * channels), im: new Float64Array(n * channels) };
  kept.forEach((i, k) => {
    const s = samples[i];
    table.frequencyHz[k] = s.frequencyHz;
    for (let c = 0; c < channels; c++) {
      table.re[k * channels + c] = s.re[c];
      table.im[k * channels + c] = s.im[c];
    }
  });
  return table;
}

/** The union of several runs' samples (same channels), checked for agreement where they overlap. */
export function mergeSamples(runs: readonly (readonly Sample[])[], agreement = DEFAULT_AGREEMENT): Sample[] {
  const table = sampleTable(runs.flat(), agreement);
  return samplesOf(table);
}

export function samplesOf(table: SampleTable): Sample[] {
  const C = table.channels;
  return Array.from(table.frequencyHz, (frequencyHz, k) => ({
    frequencyHz,
    re: table.re.slice(k * C, (k + 1) * C),
    im: table.im.slice(k * C, (k + 1) * C),
  }));
}

function disagreement(a: Sample, b: Sample, scale: Float64Array, agreement: number): string | null {
  for (let c = 0; c < a.re.length; c++) {
    const d = Math.hypot(a.re[c] - b.re[c], a.im[c] - b.im[c]);
    if (d > agreement * scale[c]) return `channel ${c}: ${a.re[c]}${sign(a.im[c])}j against ${b.re[c]}${sign(b.im[c])}j`;
  }
  return null;
}

function sign(x: number): string {
  return x < 0 ? `${x}` : `+${x}`;
}
