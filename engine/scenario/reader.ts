/**
 * Typed reads of one field at a time. Each read either returns a usable value or records exactly one
 * error naming the field and returns undefined, so the callers can go on and find further problems.
 */
import { join, type Checker } from './checker.ts';
import { fieldsAt, LIMITS, NAME_REGEXP } from './fields.ts';
import { MISSING, num, type Found } from './issues.ts';
import { didYouMean } from './suggest.ts';

export type Json = Record<string, unknown>;

export function isObject(value: unknown): value is Json {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/** The field's value, or MISSING; own properties only, so inherited names never count. */
export function get(obj: Json, key: string): Found {
  return Object.hasOwn(obj, key) ? obj[key] : MISSING;
}

/** An object with only the fields the format allows at `path`; unknown ones are errors with a suggestion. */
export function readObject(ck: Checker, value: Found, path: string, what: string): Json | undefined {
  if (value === MISSING) return undefined;
  if (!isObject(value)) {
    ck.error(path, value, 'type', `${what} must be an object {…}`, `write ${what} as {"field": value, …}`);
    return undefined;
  }
  reportUnknownFields(ck, value, path, what);
  return value;
}

export function reportUnknownFields(ck: Checker, obj: Json, path: string, what: string): void {
  const allowed = fieldsAt(path);
  for (const key of Object.keys(obj)) {
    if (allowed.includes(key)) continue;
    ck.error(join(path, key), obj[key], 'unknown-field', `"${key}" is not a field of ${what}`,
      `${didYouMean(key, allowed)}the fields here are: ${allowed.join(', ')}`);
  }
}

export function required(ck: Checker, obj: Json, path: string, key: string, what: string, example: string): Found {
  const value = get(obj, key);
  if (value === MISSING) ck.error(join(path, key), MISSING, 'required', `${what} is required`, `add "${key}": ${example}`);
  return value;
}

export interface NumberRule {
  /** Unit for messages, e.g. "m", "Hz". */
  unit?: string;
  integer?: boolean;
  /** Inclusive bounds. */
  min?: number;
  max?: number;
  /** Exclusive bounds. */
  above?: number;
  below?: number;
}

/** A finite number obeying `rule`, or undefined (with an error unless the field is absent). */
export function readNumber(ck: Checker, value: Found, path: string, what: string, rule: NumberRule): number | undefined {
  if (value === MISSING) return undefined;
  const key = settable(path);
  if (typeof value !== 'number') {
    const fix = typeof value === 'string' && Number.isFinite(Number(value)) && value.trim() !== ''
      ? `write ${value.trim()} without quotes` : `set ${key} to a number${withRange(rule)}`;
    ck.error(path, value, 'type', `${what} must be a number${unitText(rule)}`, fix);
    return undefined;
  }
  if (!Number.isFinite(value)) {
    ck.error(path, value, 'finite', `${what} must be a finite number`, `set ${key} to a number${withRange(rule)}`);
    return undefined;
  }
  if (rule.integer && !Number.isInteger(value)) {
    ck.error(path, value, 'integer', `${what} must be a whole number`, `use a whole number${withRange(rule)}, e.g. ${num(clamp(Math.round(value), rule))}`);
    return undefined;
  }
  if (!inRange(value, rule)) {
    ck.error(path, value, 'range', `${what} must be ${rangeText(rule)}`, `set ${key} to a value ${rangeText(rule)}`);
    return undefined;
  }
  return value;
}

function inRange(v: number, r: NumberRule): boolean {
  return (r.min === undefined || v >= r.min) && (r.max === undefined || v <= r.max)
    && (r.above === undefined || v > r.above) && (r.below === undefined || v < r.below);
}

function clamp(v: number, r: NumberRule): number {
  const lo = r.min ?? (r.above !== undefined ? r.above + 1 : -Infinity);
  const hi = r.max ?? (r.below !== undefined ? r.below - 1 : Infinity);
  return Math.min(hi, Math.max(lo, v));
}

/** "between 1 and 6", "greater than 0 m", "greater than 0 and at most 1". */
export function rangeText(r: NumberRule): string {
  const u = unitSuffix(r);
  if (r.min !== undefined && r.max !== undefined) return `between ${num(r.min)} and ${num(r.max)}${u}`;
  const lower = r.above !== undefined ? `greater than ${num(r.above)}` : r.min !== undefined ? `at least ${num(r.min)}` : '';
  const upper = r.below !== undefined ? `less than ${num(r.below)}` : r.max !== undefined ? `at most ${num(r.max)}` : '';
  if (lower === '' && upper === '') return u === '' ? '' : `in${u}`;
  return `${[lower, upper].filter((t) => t !== '').join(' and ')}${u}`;
}

function unitSuffix(r: NumberRule): string {
  return r.unit === undefined ? '' : ` ${r.unit}`;
}

function unitText(r: NumberRule): string {
  return r.unit === undefined ? '' : ` (${r.unit})`;
}

function withRange(r: NumberRule): string {
  const text = rangeText(r);
  return text === '' ? '' : ` ${text}`;
}

/** How a fix names the field: by its key when that reads as a word ("set at …"), else "it" (array items, "125"). */
function settable(path: string): string {
  const match = /(?:^|\.)([A-Za-z]\w*)$/.exec(path);
  return match === null ? 'it' : match[1];
}

/** A number with a default: absent → the default, recorded with the reason. */
export function readNumberOr(ck: Checker, value: Found, path: string, what: string, rule: NumberRule, fallback: number, why: string): number | undefined {
  if (value === MISSING) {
    ck.usedDefault(path, fallback, why);
    return fallback;
  }
  return readNumber(ck, value, path, what, rule);
}

/** One of `options`, or undefined. */
export function readEnum<T extends string>(ck: Checker, value: Found, path: string, what: string, options: readonly T[]): T | undefined {
  if (value === MISSING) return undefined;
  if (typeof value === 'string' && (options as readonly string[]).includes(value)) return value as T;
  const list = options.map((o) => `"${o}"`).join(', ');
  const guess = typeof value === 'string' ? didYouMean(value, options) : '';
  ck.error(path, value, 'enum', `${what} must be one of ${list}`, `${guess}use one of ${list}`);
  return undefined;
}

export function readEnumOr<T extends string>(ck: Checker, value: Found, path: string, what: string, options: readonly T[], fallback: T, why: string): T | undefined {
  if (value === MISSING) {
    ck.usedDefault(path, fallback, why);
    return fallback;
  }
  return readEnum(ck, value, path, what, options);
}

export interface StringRule {
  maxLength: number;
  pattern?: RegExp;
  /** What the pattern means, for the message. */
  patternText?: string;
}

export function readString(ck: Checker, value: Found, path: string, what: string, rule: StringRule): string | undefined {
  if (value === MISSING) return undefined;
  if (typeof value !== 'string') {
    ck.error(path, value, 'type', `${what} must be a string in double quotes`, `write ${what} as "…"`);
    return undefined;
  }
  if (value.length > rule.maxLength) {
    ck.error(path, value, 'length', `${what} must be at most ${rule.maxLength} characters long (it has ${value.length})`, 'shorten it');
    return undefined;
  }
  if (rule.pattern !== undefined && !rule.pattern.test(value)) {
    ck.error(path, value, 'pattern', `${what} ${rule.patternText ?? 'has characters that are not allowed'}`, 'use letters, digits, spaces and punctuation, without leading or trailing spaces');
    return undefined;
  }
  return value;
}

const NAME_RULE: StringRule = { maxLength: LIMITS.maxNameLength, pattern: NAME_REGEXP, patternText: 'must not be empty, start or end with a space, or hold control characters' };

/** The required "name" of a section, branch, source or receiver. */
export function readName(ck: Checker, obj: Json, path: string, what: string): string | undefined {
  return readString(ck, required(ck, obj, path, 'name', `the ${what}'s name`, '"inlet"'), join(path, 'name'), `the ${what}'s name`, NAME_RULE);
}

export interface ArrayRule {
  minItems: number;
  maxItems: number;
  /** What one item is, for messages ("section"). */
  itemWhat: string;
  /** Plural of itemWhat, when not itemWhat + "s". */
  itemsWhat?: string;
}

function counted(n: number, rule: ArrayRule): string {
  return `${n} ${n === 1 ? rule.itemWhat : (rule.itemsWhat ?? `${rule.itemWhat}s`)}`;
}

export function readArray(ck: Checker, value: Found, path: string, what: string, rule: ArrayRule): unknown[] | undefined {
  if (value === MISSING) return undefined;
  if (!Array.isArray(value)) {
    ck.error(path, value, 'type', `${what} must be an array […]`, `write ${what} as a list: [${rule.itemWhat}, …]`);
    return undefined;
  }
  if (value.length < rule.minItems || value.length > rule.maxItems) {
    const exact = rule.minItems === rule.maxItems;
    const range = exact ? `exactly ${rule.minItems}` : `between ${rule.minItems} and ${rule.maxItems}`;
    const fix = exact ? `give exactly ${counted(rule.minItems, rule)}`
      : value.length < rule.minItems ? `give at least ${counted(rule.minItems, rule)}` : `remove items down to ${rule.maxItems}`;
    ck.error(path, value, 'count', `${what} must have ${range} items (it has ${value.length})`, fix);
    return undefined;
  }
  return value;
}

/** A fixed-length array of numbers, each read with `rule`; undefined if any is bad (all are reported). */
export function readNumbers(ck: Checker, value: Found, path: string, what: string, length: number, rule: NumberRule, itemWhat: (i: number) => string): number[] | undefined {
  const items = readArray(ck, value, path, what, { minItems: length, maxItems: length, itemWhat: 'number' });
  if (items === undefined) return undefined;
  const numbers = items.map((v, i) => readNumber(ck, v, `${path}[${i}]`, itemWhat(i), rule));
  return numbers.every((n) => n !== undefined) ? (numbers as number[]) : undefined;
}
