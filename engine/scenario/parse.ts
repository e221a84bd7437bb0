/**
 * Scenario text → plain JSON value, safely. A hand-written reader rather than JSON.parse, because a
 * scenario may come from anywhere (mail, a shared drive) and the reader must
 * - refuse oversized text before doing any work,
 * - bound nesting so that no input can exhaust the stack,
 * - refuse the keys "__proto__", "constructor" and "prototype", and never assign any key onto an
 *   object (properties are defined, so no setter or prototype is ever touched),
 * - refuse duplicate keys, which JSON.parse silently resolves to the last one,
 * - report every syntax error with line and column, whatever the JavaScript engine.
 * Nothing is evaluated. Every failure is a ScenarioError.
 */
import { ScenarioError } from './issues.ts';
import type { Issue } from './types.ts';

export interface ParseOptions {
  /** Largest accepted text, UTF-8 bytes. Default 5 MB. */
  maxBytes?: number;
}

export const DEFAULT_MAX_BYTES = 5_000_000;
/** Deepest accepted nesting of objects and arrays; a valid scenario needs 5. */
export const MAX_NESTING_DEPTH = 64;
export const FORBIDDEN_KEYS: readonly string[] = ['__proto__', 'constructor', 'prototype'];

export function parseScenarioText(text: string, opts: ParseOptions = {}): unknown {
  const maxBytes = opts.maxBytes ?? DEFAULT_MAX_BYTES;
  if (!(Number.isInteger(maxBytes) && maxBytes > 0)) throw new RangeError(`maxBytes must be a positive integer (got ${maxBytes})`);
  if (typeof text !== 'string') {
    fail('', 'text-type', `the scenario must be given as text, not ${typeof text}`, 'pass the contents of the .json file as a string');
  }
  checkSize(text, maxBytes);
  return new JsonReader(text).readDocument();
}

function fail(path: string, rule: string, statement: string, fix: string): never {
  const issue: Issue = { path, rule, fix, message: `${statement}; fix: ${fix}` };
  throw new ScenarioError([issue]);
}

function checkSize(text: string, maxBytes: number): void {
  // UTF-8 needs at least one byte per UTF-16 unit and at most three, so the exact count is rarely needed.
  const bytes = text.length > maxBytes || 3 * text.length <= maxBytes ? text.length : utf8Length(text);
  if (bytes > maxBytes) {
    fail('', 'text-size', `the scenario text is ${megabytes(bytes)} (at least ${bytes} bytes), more than the ${megabytes(maxBytes)} a scenario may have`,
      'a scenario describes geometry and settings only and is a few kilobytes: check that this is the right file');
  }
}

function utf8Length(text: string): number {
  let bytes = 0;
  for (let i = 0; i < text.length; i++) {
    const unit = text.charCodeAt(i);
    // A surrogate pair is 4 bytes, 2 per unit.
    bytes += unit < 0x80 ? 1 : unit < 0x800 ? 2 : unit >= 0xd800 && unit <= 0xdfff ? 2 : 3;
  }
  return bytes;
}

function megabytes(bytes: number): string {
  return `${(bytes / 1e6).toFixed(1)} MB`;
}

const WHITESPACE = new Set([0x20, 0x09, 0x0a, 0x0d]);
const SIMPLE_ESCAPES: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };
const NUMBER = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;

type Path = readonly (string | number)[];

class JsonReader {
  private pos = 0;
  constructor(private readonly text: string) {
    // A byte-order mark is what some editors write first; it is not content.
    if (text.charCodeAt(0) === 0xfeff) this.pos = 1;
  }

  readDocument(): unknown {
    this.skipWhitespace();
    if (this.pos >= this.text.length) this.syntax('the text is empty', 'give the scenario as one JSON object, {"format": "quietgrid/1", ...}');
    const value = this.readValue([], 0);
    this.skipWhitespace();
    if (this.pos < this.text.length) {
      this.syntax('there is more text after the end of the JSON value', 'remove what follows the closing brace, or merge it into the object');
    }
    return value;
  }

  private readValue(path: Path, depth: number): unknown {
    const c = this.text[this.pos];
    if (c === '{') return this.readObject(path, depth + 1);
    if (c === '[') return this.readArray(path, depth + 1);
    if (c === '"') return this.readString();
    if (c === '-' || (c >= '0' && c <= '9')) return this.readNumber();
    for (const [word, value] of [['true', true], ['false', false], ['null', null]] as const) {
      if (this.text.startsWith(word, this.pos)) {
        this.pos += word.length;
        return value;
      }
    }
    return this.unexpected('a value (object, array, string, number, true, false or null)');
  }

  private enter(depth: number, path: Path): void {
    if (depth > MAX_NESTING_DEPTH) {
      this.syntax(`objects and arrays are nested deeper than ${MAX_NESTING_DEPTH} levels (at ${showPath(path)})`,
        'a scenario is nested only a few levels deep: check that this is the right file');
    }
  }

  private readObject(path: Path, depth: number): Record<string, unknown> {
    this.enter(depth, path);
    const open = this.pos++;
    const object: Record<string, unknown> = {};
    this.skipWhitespace();
    if (this.eat('}')) return object;
    for (;;) {
      this.skipWhitespace();
      if (this.text[this.pos] !== '"') this.unexpected('a property name in double quotes', open);
      const keyAt = this.pos;
      const key = this.readString();
      this.checkKey(object, key, [...path, key], keyAt);
      this.skipWhitespace();
      if (!this.eat(':')) this.unexpected(`':' after the property name "${key}"`, open);
      this.skipWhitespace();
      const value = this.readValue([...path, key], depth);
      // defineProperty, not assignment: no setter, no prototype, whatever the key.
      Object.defineProperty(object, key, { value, enumerable: true, writable: true, configurable: true });
      this.skipWhitespace();
      if (this.eat('}')) return object;
      if (!this.eat(',')) this.unexpected(`',' or '}' after the value of "${key}"`, open);
      this.refuseTrailingComma('}');
    }
  }

  private checkKey(object: Record<string, unknown>, key: string, path: Path, keyAt: number): void {
    if (FORBIDDEN_KEYS.includes(key)) {
      this.pos = keyAt;
      fail(showPath(path), 'forbidden-key', `${this.where()}: the property name "${key}" is not allowed in a scenario (it could alter objects in the program that reads it)`,
        `remove "${key}"`);
    }
    if (Object.hasOwn(object, key)) {
      this.pos = keyAt;
      fail(showPath(path), 'duplicate-key', `${this.where()}: the property "${key}" appears twice in the same object (at ${showPath(path)})`,
        'keep one of the two and delete the other');
    }
  }

  private readArray(path: Path, depth: number): unknown[] {
    this.enter(depth, path);
    const open = this.pos++;
    const array: unknown[] = [];
    this.skipWhitespace();
    if (this.eat(']')) return array;
    for (;;) {
      this.skipWhitespace();
      array.push(this.readValue([...path, array.length], depth));
      this.skipWhitespace();
      if (this.eat(']')) return array;
      if (!this.eat(',')) this.unexpected("',' or ']' after an array item", open);
      this.refuseTrailingComma(']');
    }
  }

  private refuseTrailingComma(close: string): void {
    this.skipWhitespace();
    if (this.text[this.pos] === close) {
      this.syntax(`a comma directly before '${close}' is not allowed in JSON`, 'remove the last comma');
    }
  }

  private readString(): string {
    const open = this.pos++;
    const parts: string[] = [];
    let from = this.pos;
    for (;;) {
      if (this.pos >= this.text.length) this.unexpected('the closing \'"\' of a string', open);
      const unit = this.text.charCodeAt(this.pos);
      if (unit === 0x22) break;
      if (unit < 0x20) this.syntax('a control character (such as a line break or tab) stands inside a string', 'write it as an escape such as \\n or \\t, or close the string');
      if (unit === 0x5c) {
        parts.push(this.text.slice(from, this.pos));
        parts.push(this.readEscape());
        from = this.pos;
      } else {
        this.pos++;
      }
    }
    parts.push(this.text.slice(from, this.pos++));
    return parts.join('');
  }

  private readEscape(): string {
    const letter = this.text[this.pos + 1];
    if (letter !== undefined && Object.hasOwn(SIMPLE_ESCAPES, letter)) {
      this.pos += 2;
      return SIMPLE_ESCAPES[letter];
    }
    const hex = this.text.slice(this.pos + 2, this.pos + 6);
    if (letter === 'u' && /^[0-9a-fA-F]{4}$/.test(hex)) {
      this.pos += 6;
      return String.fromCharCode(parseInt(hex, 16));
    }
    return this.syntax('an unknown escape sequence stands inside a string', 'use one of \\" \\\\ \\/ \\b \\f \\n \\r \\t \\uXXXX');
  }

  private readNumber(): number {
    NUMBER.lastIndex = this.pos;
    const match = NUMBER.exec(this.text);
    if (match === null) return this.unexpected('a number');
    this.pos += match[0].length;
    return Number(match[0]);
  }

  private skipWhitespace(): void {
    while (this.pos < this.text.length && WHITESPACE.has(this.text.charCodeAt(this.pos))) this.pos++;
    if (this.text.startsWith('//', this.pos) || this.text.startsWith('/*', this.pos)) {
      this.syntax('JSON has no comments', 'remove the comment, or move the remark into the "notes" field');
    }
  }

  private eat(c: string): boolean {
    if (this.text[this.pos] !== c) return false;
    this.pos++;
    return true;
  }

  /** What was expected, and what stands there instead; at the end of the text, which bracket is unclosed. */
  private unexpected(expected: string, openedAt?: number): never {
    if (this.pos >= this.text.length) {
      const opened = openedAt === undefined ? '' : ` (the ${describeOpen(this.text[openedAt])} opened at ${this.where(openedAt)} is not closed)`;
      return this.syntax(`the text ends where ${expected} was expected${opened}`, 'the file looks cut short: complete it, or save it again from its source');
    }
    const found = this.text[this.pos];
    const hint = found === "'" ? ' (JSON strings and names take double quotes)' : '';
    return this.syntax(`expected ${expected} but found ${JSON.stringify(found)}${hint}`, 'correct the JSON at this point (often a missing comma, quote or bracket just before it)');
  }

  private syntax(statement: string, fix: string): never {
    return fail('', 'json-syntax', `${this.where()}: ${statement}`, fix);
  }

  private where(at = this.pos): string {
    let line = 1;
    let lineStart = 0;
    for (let i = 0; i < at && i < this.text.length; i++) {
      if (this.text.charCodeAt(i) === 0x0a) {
        line++;
        lineStart = i + 1;
      }
    }
    return `line ${line}, column ${at - lineStart + 1}`;
  }
}

function describeOpen(bracket: string | undefined): string {
  return bracket === '{' ? "object '{'" : bracket === '[' ? "array '['" : "string '\"'";
}

/** ["duct", "sections", 0, "name"] → "duct.sections[0].name" */
export function showPath(path: Path): string {
  let out = '';
  for (const part of path) out += typeof part === 'number' ? `[${part}]` : out === '' ? part : `.${part}`;
  return out;
}
