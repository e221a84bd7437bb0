/** Lengths are stored in metres (the file's unit) and shown in the unit chosen once for the session. */
export type LengthUnit = 'mm' | 'm';

export const LENGTH_SCALE: Record<LengthUnit, number> = { mm: 1000, m: 1 };

/** A number for a field: at most 6 significant digits, no float noise (0.6·1000 shows as 600, not 600.0000000001). */
export function formatNumber(v: number, digits = 6): string {
  if (!Number.isFinite(v)) return String(v);
  return String(Number(v.toPrecision(digits)));
}

export function formatLength(metres: number, unit: LengthUnit, digits = 6): string {
  return `${formatNumber(metres * LENGTH_SCALE[unit], digits)} ${unit}`;
}

/** The text shown in a field for a stored value, scaled to the display unit; text that never parsed is shown as typed. */
export function displayText(stored: unknown, scale: number): string {
  if (typeof stored === 'number') return formatNumber(stored * scale, 9);
  if (typeof stored === 'string') return stored;
  return '';
}

/**
 * What to store for text typed in a field with the given display scale: a number in file units when it
 * parses, the text itself when it does not (the validator names it), undefined for an empty optional field.
 */
export function storedValue(text: string, scale: number, optional: boolean): number | string | undefined {
  const t = text.trim().replace(/\s+/g, '');
  if (t === '') return optional ? undefined : '';
  const v = Number(t.replace(/,(?=\d+$)/, '.'));
  if (!Number.isFinite(v)) return text;
  // Round away the float noise of the division (60 mm → 0.06, not 0.060000000000000005).
  return Number((v / scale).toPrecision(12));
}

export function formatHz(f: number): string {
  if (f >= 1000) return `${formatNumber(f / 1000, 4)} kHz`;
  return `${formatNumber(f, 4)} Hz`;
}

export function formatBytes(bytes: number): string {
  if (bytes >= 1e9) return `${formatNumber(bytes / 1e9, 3)} GB`;
  if (bytes >= 1e6) return `${formatNumber(bytes / 1e6, 3)} MB`;
  return `${formatNumber(bytes / 1e3, 3)} kB`;
}

export function formatSeconds(s: number): string {
  if (!Number.isFinite(s)) return '–';
  if (s < 60) return `${s < 10 ? s.toFixed(1) : Math.round(s)} s`;
  const m = Math.floor(s / 60), r = Math.round(s - 60 * m);
  if (m < 60) return `${m} min ${String(r).padStart(2, '0')} s`;
  return `${Math.floor(m / 60)} h ${String(m % 60).padStart(2, '0')} min`;
}

/** Elapsed-style clock: 0:07, 12:34, 1:02:03. */
export function formatClock(s: number): string {
  if (!Number.isFinite(s) || s < 0) return '–';
  const t = Math.round(s), h = Math.floor(t / 3600), m = Math.floor((t % 3600) / 60), sec = t % 60;
  const mm = h > 0 ? String(m).padStart(2, '0') : String(m);
  return `${h > 0 ? `${h}:` : ''}${mm}:${String(sec).padStart(2, '0')}`;
}
