/**
 * Thousands of random and mutated scenarios through the parser, the validator and the geometry: each is
 * either accepted (and then its geometry and size estimate build) or refused with messages that name a
 * field; nothing else ever escapes — no other exception, no hang.
 */
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { buildGeometry, parseScenarioText, ScenarioError, validateScenario } from '../../engine/scenario/index.ts';
import { estimateSize } from '../../engine/solve/size.ts';

const demos = readdirSync('scenarios').filter((f) => f.endsWith('.json') && f !== 'schema.json').map((f) => JSON.parse(readFileSync(`scenarios/${f}`, 'utf8')));

type Json = null | boolean | number | string | Json[] | { [k: string]: Json };

/** Every path to a value in a JSON tree. */
function paths(v: Json, at: (string | number)[] = []): (string | number)[][] {
  const out = [at];
  if (Array.isArray(v)) v.forEach((x, i) => out.push(...paths(x, [...at, i])));
  else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) out.push(...paths(x, [...at, k]));
  return out;
}

function mutate(root: Json, path: (string | number)[], op: number, value: Json): Json {
  const copy = structuredClone(root) as Json;
  if (path.length === 0) return value;
  let parent = copy as Record<string | number, Json>;
  for (const k of path.slice(0, -1)) parent = parent[k] as Record<string | number, Json>;
  const last = path[path.length - 1];
  if (op === 0) parent[last] = value; // replace
  else if (op === 1 && !Array.isArray(parent)) delete parent[last]; // remove a field
  else if (op === 2 && !Array.isArray(parent)) parent[`${String(last)}X`] = value; // an unknown field next to it
  else if (typeof parent[last] === 'number') parent[last] = [-1, 0, 1e12, -1e-12, Number.MAX_VALUE][Math.abs(Math.round(Number(value) || 0)) % 5] * (parent[last] as number); // bad numbers
  else parent[last] = value;
  return copy;
}

const mutated = fc.tuple(fc.constantFrom(...demos), fc.nat(), fc.nat(3), fc.jsonValue()).map(([demo, pick, op, value]) => {
  const ps = paths(demo);
  return mutate(demo, ps[pick % ps.length], op, value as Json);
});

function check(value: unknown): void {
  const r = validateScenario(value);
  if (r.ok) {
    const g = buildGeometry(r.scenario);
    expect(g.boxes.length).toBeGreaterThan(0);
    const dofs = estimateSize(r.scenario, g).dofs; // may be Infinity for absurd sizes: the size guard then refuses the run
    expect(dofs).toBeGreaterThan(0);
    expect(Number.isNaN(dofs)).toBe(false);
    return;
  }
  expect(r.errors.length).toBeGreaterThan(0);
  for (const e of r.errors) {
    expect(typeof e.path).toBe('string');
    expect(e.message.length).toBeGreaterThan(10);
    expect(e.fix.length).toBeGreaterThan(0);
    // the message says where: the path (or "the file" for the whole document)
    if (e.path) expect(e.message).toContain(e.path);
  }
}

describe('validator under random and mutated input', () => {
  it('mutated demo scenarios: accepted with a geometry, or refused naming the field', () => {
    fc.assert(fc.property(mutated, (v) => check(v)), { numRuns: 3000, seed: 20261201 });
  });
  it('arbitrary JSON values', () => {
    fc.assert(fc.property(fc.jsonValue(), (v) => check(v)), { numRuns: 1000, seed: 7 });
  });
  it('arbitrary and truncated text: only ScenarioError, with a message', () => {
    const text = fc.oneof(fc.string(), fc.constantFrom(...demos).chain((d) => fc.nat().map((n) => { const t = JSON.stringify(d); return t.slice(0, n % t.length); })));
    fc.assert(fc.property(text, (t) => {
      try {
        check(parseScenarioText(t));
      } catch (e) {
        expect(e).toBeInstanceOf(ScenarioError);
        expect((e as Error).message.length).toBeGreaterThan(10);
      }
    }), { numRuns: 1000, seed: 11 });
  });
});

describe('size guard', () => {
  it('refuses a scenario far larger than intended, naming the numbers and the levers, before allocating anything', async () => {
    const { prepareProblem } = await import('../../engine/solve/prepare.ts');
    const { ProblemTooLarge } = await import('../../engine/solve/size.ts');
    const r = validateScenario({ ...demos.find((d) => d.duct)!, sweep: { frequenciesHz: [100] } });
    if (!r.ok) throw new Error('demo invalid');
    const s = structuredClone(r.scenario);
    if (s.kind !== 'duct') throw new Error('not a duct');
    s.duct.sections[0].length = 4e11; // metres typed for millimetres, many times over
    expect(() => prepareProblem(s)).toThrow(ProblemTooLarge);
    expect(() => prepareProblem(s)).toThrow(/unknowns .* check the lengths are in metres.*--yes/);
  });
});
