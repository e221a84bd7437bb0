import { describe, expect, it } from 'vitest';
import { parseScenarioText, readScenario, ScenarioError } from '../../engine/scenario/index.ts';
import { ISSUE_EXAMPLE } from './fixtures.ts';

const ISSUE_TEXT = JSON.stringify(ISSUE_EXAMPLE, null, 2);

/** The ScenarioError that `run` throws; fails the test if it throws anything else or nothing. */
function refusal(run: () => unknown): ScenarioError {
  try {
    run();
  } catch (e) {
    if (e instanceof ScenarioError) return e;
    throw new Error(`expected a ScenarioError, got ${String(e)}`);
  }
  throw new Error('expected a ScenarioError, nothing was thrown');
}

describe('parseScenarioText reads JSON as JSON.parse does', () => {
  const documents = [
    ISSUE_TEXT,
    '{"a": [1, -2.5e-3, 0, 1E+2, true, false, null], "b": {"c": "x\\n\\"y\\" \\u00e9 \\ud83d\\ude00 \\/ \\\\"}}',
    '[]', '{}', '  "text"  ', '-0', '\t[ {"k" : [ ] } ]\r\n',
  ];
  // Source: ECMA-404, The JSON Data Interchange Syntax (2nd edition, 2017) — JSON.parse implements it.
  it.each(documents)('%s', (text) => expect(parseScenarioText(text)).toEqual(JSON.parse(text)));

  it('skips a leading byte-order mark', () => {
    expect(parseScenarioText('\ufeff{"a": 1}')).toEqual({ a: 1 });
  });

  it('builds ordinary objects', () => {
    expect(Object.getPrototypeOf(parseScenarioText('{"a": {}}'))).toBe(Object.prototype);
  });
});

describe('hostile text fails cleanly', () => {
  it.each(['__proto__', 'constructor', 'prototype'])('refuses the key %s, at any depth, without touching prototypes', (key) => {
    const text = `{"format": "quietgrid/1", "duct": {"${key}": {"polluted": true}}}`;
    const e = refusal(() => parseScenarioText(text));
    expect(e.issues[0]).toMatchObject({ rule: 'forbidden-key', path: `duct.${key}` });
    expect(e.message).toContain(`"${key}" is not allowed`);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  });

  it('refuses 10 000-deep nesting without exhausting the stack', () => {
    for (const text of ['['.repeat(10_000) + ']'.repeat(10_000), '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000)]) {
      const e = refusal(() => parseScenarioText(text));
      expect(e.issues[0].rule).toBe('json-syntax');
      expect(e.message).toContain('nested deeper than 64 levels');
    }
  });

  it('accepts nesting up to the limit', () => {
    expect(() => parseScenarioText('['.repeat(64) + ']'.repeat(64))).not.toThrow();
    expect(() => parseScenarioText('['.repeat(65) + ']'.repeat(65))).toThrow(ScenarioError);
  });

  it('refuses 6 MB of text before reading it', () => {
    const text = `{"notes": "${'x'.repeat(6_000_000)}"}`;
    const e = refusal(() => parseScenarioText(text));
    expect(e.issues[0].rule).toBe('text-size');
    expect(e.message).toContain('more than the 5.0 MB');
  });

  it('counts the limit in UTF-8 bytes', () => {
    const text = `"${'é'.repeat(600)}"`; // 602 characters, 1202 bytes
    expect(refusal(() => parseScenarioText(text, { maxBytes: 1000 })).issues[0].rule).toBe('text-size');
    expect(parseScenarioText(text, { maxBytes: 1202 })).toBe('é'.repeat(600));
  });

  it('reports every truncation of a scenario with a line and column', () => {
    for (let cut = 0; cut < ISSUE_TEXT.length; cut++) {
      const e = refusal(() => parseScenarioText(ISSUE_TEXT.slice(0, cut)));
      expect(e.issues[0].rule).toBe('json-syntax');
      expect(e.message).toMatch(/line \d+, column \d+|the text is empty/);
    }
  });

  it('says where a truncated object was opened', () => {
    const e = refusal(() => parseScenarioText('{\n  "duct": {\n    "sections": [1, 2'));
    expect(e.message).toContain("the array '[' opened at line 3, column 17 is not closed");
  });

  it('places a syntax error at its line and column', () => {
    const e = refusal(() => parseScenarioText('{\n  "a": 1,\n  "b" 2\n}'));
    expect(e.message).toContain('line 3, column 7');
    expect(e.message).toContain("expected ':' after the property name \"b\"");
  });

  it.each([
    ['{"a": 1,}', 'comma directly before'],
    ['{"a": 1 // why\n}', 'JSON has no comments'],
    ["{'a': 1}", 'double quotes'],
    ['{"a": NaN}', 'expected a value'],
    ['{"a": 01}', "expected ',' or '}'"],
    ['{"a": "tab\there"}', 'control character'],
    ['{"a": "\\x41"}', 'unknown escape'],
    ['{"a": 1} {"b": 2}', 'more text after the end'],
    ['', 'the text is empty'],
    ['{"a": 1, "a": 2}', 'appears twice'],
  ])('%s', (text, words) => {
    expect(refusal(() => parseScenarioText(text)).message).toContain(words);
  });

  it('refuses a non-string argument', () => {
    expect(refusal(() => parseScenarioText(42 as unknown as string)).issues[0].rule).toBe('text-type');
  });

  it('reads 1e999 as a number the validator then refuses as infinite', () => {
    const text = ISSUE_TEXT.replace('"length": 0.6', '"length": 1e999');
    const e = refusal(() => readScenario(text));
    expect(e.issues[0]).toMatchObject({ path: 'duct.sections[0].length', rule: 'finite' });
  });
});

describe('readScenario', () => {
  it('reads the issue example', () => {
    expect(readScenario(ISSUE_TEXT).scenario.title).toBe('Plant-room supply duct, silencer option B');
  });

  it('throws only ScenarioError on randomly damaged text', () => {
    // A fixed linear congruential generator (Numerical Recipes constants) makes the damage repeatable.
    let seed = 12345;
    const next = () => (seed = (seed * 1664525 + 1013904223) >>> 0) / 2 ** 32;
    const alphabet = '{}[]":,0123456789.-eE tfnrul\\"_/x';
    let refused = 0;
    for (let trial = 0; trial < 1500; trial++) {
      const chars = [...ISSUE_TEXT];
      for (let k = 0; k < 1 + Math.floor(next() * 3); k++) chars[Math.floor(next() * chars.length)] = alphabet[Math.floor(next() * alphabet.length)];
      try {
        readScenario(chars.join(''));
      } catch (e) {
        expect(e).toBeInstanceOf(ScenarioError);
        expect((e as ScenarioError).issues.length).toBeGreaterThan(0);
        refused++;
      }
    }
    expect(refused).toBeGreaterThan(500);
  });
});
