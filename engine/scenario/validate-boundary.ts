/**
 * Boundary conditions shared by the duct outlet and the room walls: a word ("rigid", "anechoic",
 * "open") or a locally reacting surface given by absorption coefficient or normalised impedance.
 */
import { join, type Checker } from './checker.ts';
import { MISSING, type Found } from './issues.ts';
import { get, isObject, readEnum, readNumber, readNumbers, reportUnknownFields } from './reader.ts';
import type { AbsorptionBoundary, ImpedanceBoundary } from './types.ts';

export function readBoundary<W extends string>(ck: Checker, value: Found, path: string, what: string, words: readonly W[]): W | AbsorptionBoundary | ImpedanceBoundary | undefined {
  if (value === MISSING) return undefined;
  if (typeof value === 'string') return readEnum(ck, value, path, what, words);
  const forms = `${words.map((w) => `"${w}"`).join(', ')}, {"absorption": α} or {"impedance": [re, im]}`;
  if (!isObject(value)) {
    ck.error(path, value, 'type', `${what} must be one of ${forms}`, `write one of ${forms}`);
    return undefined;
  }
  reportUnknownFields(ck, value, path, what);
  const hasAbsorption = get(value, 'absorption') !== MISSING;
  const hasImpedance = get(value, 'impedance') !== MISSING;
  if (hasAbsorption === hasImpedance) {
    ck.error(path, value, 'boundary-form', `${what} as an object needs exactly one of "absorption" and "impedance"`,
      hasAbsorption ? 'keep one of the two' : 'add "absorption": α (0 < α ≤ 1) or "impedance": [re, im]');
    return undefined;
  }
  return hasAbsorption ? readAbsorption(ck, value.absorption, path) : readImpedance(ck, value.impedance, path);
}

function readAbsorption(ck: Checker, value: unknown, path: string): AbsorptionBoundary | undefined {
  const absorption = readNumber(ck, value, join(path, 'absorption'), 'the absorption coefficient', { above: 0, max: 1 });
  return absorption === undefined ? undefined : { absorption };
}

function readImpedance(ck: Checker, value: unknown, path: string): ImpedanceBoundary | undefined {
  const p = join(path, 'impedance');
  const parts = readNumbers(ck, value, p, 'the normalised impedance [re, im]', 2, {}, (i) => (i === 0 ? 'the real part' : 'the imaginary part'));
  if (parts === undefined) return undefined;
  if (parts[0] < 0) {
    // A negative resistance would feed energy into the field: no passive surface does that.
    ck.error(`${p}[0]`, parts[0], 'range', 'the real part of the impedance (resistance) must be at least 0 for a passive surface', 'set it to 0 or more');
    return undefined;
  }
  return { impedance: [parts[0], parts[1]] };
}
