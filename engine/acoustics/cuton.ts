// Higher-order modes of a rigid rectangular duct: where the plane-wave model
// (planewave.ts) stops being the whole story, and how fast the modes below
// cut-on die away. Modes cos(mπy/a)·cos(nπz/b), Morse & Ingard, Theoretical
// Acoustics (1968), on sound in ducts.
import { requireCount, requireNonNegative, requirePositive } from './checks.ts';
import type { Complex } from '../core/complex.ts';

export interface DuctMode {
  m: number;
  n: number;
  frequencyHz: number;
}

/** Default upper limit of cutOnFrequencies: the top of the audio range. */
export const DEFAULT_MAX_CUTON_HZ = 20_000;
const MAX_LISTED_MODES = 100_000;

/** f_mn = (c/2)·√((m/a)² + (n/b)²). */
export function cutOnFrequency(a: number, b: number, c: number, m: number, n: number): number {
  return (c / 2) * Math.hypot(m / a, n / b);
}

/** Modes (m, n) ≠ (0, 0) with f_mn ≤ maxHz, ascending in f (ties by m, then n). */
export function cutOnFrequencies(a: number, b: number, c: number, maxHz = DEFAULT_MAX_CUTON_HZ): DuctMode[] {
  requirePositive('a', a);
  requirePositive('b', b);
  requirePositive('c', c);
  requirePositive('maxHz', maxHz);
  const mMax = Math.floor((2 * a * maxHz) / c);
  const nMax = Math.floor((2 * b * maxHz) / c);
  if ((mMax + 1) * (nMax + 1) > MAX_LISTED_MODES) {
    throw new RangeError(`more than ${MAX_LISTED_MODES} candidate modes below ${maxHz} Hz: pass a lower maxHz`);
  }
  const modes: DuctMode[] = [];
  for (let m = 0; m <= mMax; m++) {
    for (let n = 0; n <= nMax; n++) {
      const frequencyHz = cutOnFrequency(a, b, c, m, n);
      if ((m > 0 || n > 0) && frequencyHz <= maxHz) modes.push({ m, n, frequencyHz });
    }
  }
  return modes.sort((p, q) => p.frequencyHz - q.frequencyHz || p.m - q.m || p.n - q.n);
}

/** Lowest cut-on frequency c/(2·max(a, b)), Hz: below it only the plane wave propagates. */
export function firstCutOn(a: number, b: number, c: number): number {
  requirePositive('a', a);
  requirePositive('b', b);
  requirePositive('c', c);
  return c / (2 * Math.max(a, b));
}

/**
 * Axial wavenumber of mode (m, n) at wavenumber k: √(k² − k_t²), k_t² = (mπ/a)² + (nπ/b)²,
 * above cut-on, −j·κ below it. With e^{+jωt} the mode travels as e^{−j·kx·x},
 * so −jκ gives the decaying e^{−κx}. The one wavenumber of a rigid rectangular duct's modes: the
 * solver's incident wave, its absorbing-layer range and reflection estimate all use it.
 */
export function axialWavenumber(k: number, a: number, b: number, m: number, n: number): Complex {
  requireNonNegative('k', k);
  requirePositive('a', a);
  requirePositive('b', b);
  requireCount('m', m, 0);
  requireCount('n', n, 0);
  const kt2 = ((m * Math.PI) / a) ** 2 + ((n * Math.PI) / b) ** 2, kx2 = k * k - kt2;
  return kx2 >= 0 ? { re: Math.sqrt(kx2), im: 0 } : { re: 0, im: -Math.sqrt(-kx2) };
}

