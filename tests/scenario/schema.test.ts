// scenarios/schema.json and the hand-written validator describe one format. These tests walk both:
// the schema's properties against the validator's field lists, every schema property through a
// fixture the validator accepts, an unknown field at every object of the format, and the bad inputs
// whose rules the schema can state through a small 2020-12 checker.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { NAME_PATTERN, OCTAVE_BAND_KEYS, SCENARIO_ENUMS, SCENARIO_FIELDS, validateScenario } from '../../engine/scenario/index.ts';
import { BAD_CASES, badScenario } from './bad-inputs.ts';
import { clone, VALID_FIXTURES } from './fixtures.ts';
import { schemaErrors, unknownKeywords } from './mini-schema.ts';

type Node = Record<string, unknown>;
const schemaUrl = new URL('../../scenarios/schema.json', import.meta.url);
const schema = JSON.parse(readFileSync(schemaUrl, 'utf8')) as Node;
const scenarioDir = new URL('../../scenarios/', import.meta.url);
const demos = readdirSync(scenarioDir).filter((f) => f.endsWith('.json') && f !== 'schema.json');

function resolve(ref: string): Node {
  return ref.slice(2).split('/').reduce<unknown>((n, part) => (n as Node)[part], schema) as Node;
}

/** Property names per object path pattern ("duct.sections[]"), through $ref, oneOf/anyOf/allOf and items. */
function schemaFields(node: Node, path: string, out: Map<string, Set<string>>): Map<string, Set<string>> {
  if (typeof node.$ref === 'string') schemaFields(resolve(node.$ref), path, out);
  for (const key of ['oneOf', 'anyOf', 'allOf'] as const) {
    if (Array.isArray(node[key])) for (const alt of node[key] as Node[]) schemaFields(alt, path, out);
  }
  if (node.items !== undefined) schemaFields(node.items as Node, `${path}[]`, out);
  if (node.properties !== undefined) {
    const names = out.get(path) ?? new Set<string>();
    out.set(path, names);
    for (const [name, sub] of Object.entries(node.properties as Record<string, Node>)) {
      names.add(name);
      schemaFields(sub, path === '' ? name : `${path}.${name}`, out);
    }
  }
  return out;
}

/** Enumerated values (enum and const) per path pattern, merged over alternatives. */
function schemaEnums(node: Node, path: string, out: Map<string, Set<string>>): Map<string, Set<string>> {
  const add = (values: unknown[]) => {
    const set = out.get(path) ?? new Set<string>();
    out.set(path, set);
    for (const v of values) set.add(String(v));
  };
  if (Array.isArray(node.enum)) add(node.enum);
  if ('const' in node) add([node.const]);
  if (typeof node.$ref === 'string') schemaEnums(resolve(node.$ref), path, out);
  for (const key of ['oneOf', 'anyOf', 'allOf'] as const) {
    if (Array.isArray(node[key])) for (const alt of node[key] as Node[]) schemaEnums(alt, path, out);
  }
  if (node.items !== undefined) schemaEnums(node.items as Node, `${path}[]`, out);
  for (const [name, sub] of Object.entries((node.properties ?? {}) as Record<string, Node>)) schemaEnums(sub, path === '' ? name : `${path}.${name}`, out);
  return out;
}

/** Walks a JSON value: the path pattern of every property it holds, and of every object. */
function valuePaths(value: unknown, path: string, props: Set<string>, objects: Map<string, string>): void {
  if (Array.isArray(value)) {
    value.forEach((v, i) => valuePaths(v, `${path}[${i}]`, props, objects));
    return;
  }
  if (value === null || typeof value !== 'object') return;
  const pattern = path.replace(/\[\d+\]/g, '[]');
  if (!objects.has(pattern)) objects.set(pattern, path);
  for (const [k, v] of Object.entries(value)) {
    const child = path === '' ? k : `${path}.${k}`;
    props.add(child.replace(/\[\d+\]/g, '[]'));
    valuePaths(v, child, props, objects);
  }
}

const FIELDS = schemaFields(schema, '', new Map());
const fixtureProps = new Set<string>();
const fixtureObjects = new Map<string, string>();
for (const f of Object.values(VALID_FIXTURES)) valuePaths(f, '', fixtureProps, fixtureObjects);

describe('schema.json', () => {
  it('is draft 2020-12 and uses only keywords the test checker understands', () => {
    expect(schema.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(unknownKeywords(schema)).toEqual([]);
  });

  it('describes every property, with units where it is a quantity', () => {
    const undocumented: string[] = [];
    const walk = (node: unknown, at: string) => {
      if (node === null || typeof node !== 'object') return;
      const props = (node as Node).properties as Record<string, Node> | undefined;
      for (const [name, sub] of Object.entries(props ?? {})) {
        const text = typeof sub.description === 'string' ? sub.description : '';
        if (text.length < 8) undocumented.push(`${at}/${name}`);
      }
      for (const v of Object.values(node as Node)) walk(v, at);
    };
    walk(schema, '#');
    expect(undocumented).toEqual([]);
  });

  it('closes every object of the format', () => {
    const open: string[] = [];
    const walk = (node: unknown, at: string) => {
      if (node === null || typeof node !== 'object') return;
      const n = node as Node;
      if (n.properties !== undefined && n.additionalProperties !== false) open.push(at);
      for (const [k, v] of Object.entries(n)) walk(v, `${at}/${k}`);
    };
    walk(schema, '#');
    expect(open).toEqual([]);
  });

  it('shares the name pattern and the octave keys with the validator', () => {
    expect((schema.$defs as Record<string, Node>).name.pattern).toBe(NAME_PATTERN);
    const bands = (((schema.properties as Record<string, Node>).sourcePower.properties as Record<string, Node>).octaveBandsDb.properties) as Node;
    // Object key order puts integer-like keys first, so compare as sets.
    expect(Object.keys(bands).sort()).toEqual([...OCTAVE_BAND_KEYS].sort());
  });
});

describe('schema ↔ validator', () => {
  it('has the same objects with the same fields', () => {
    const fromSchema = Object.fromEntries([...FIELDS].map(([path, names]) => [path, [...names].sort()]));
    const fromValidator = Object.fromEntries(Object.entries(SCENARIO_FIELDS).map(([path, names]) => [path, [...names].sort()]));
    expect(fromSchema).toEqual(fromValidator);
  });

  it('has the same enumerations', () => {
    const fromSchema = Object.fromEntries([...schemaEnums(schema, '', new Map())].map(([path, values]) => [path, [...values].sort()]));
    const fromValidator = Object.fromEntries(Object.entries(SCENARIO_ENUMS).map(([path, values]) => [path, [...values].sort()]));
    expect(fromSchema).toEqual(fromValidator);
  });

  it('every schema property appears in a fixture the validator accepts', () => {
    // Wall conditions are one definition used six times: one wall of each form stands for all.
    const collapse = (p: string) => p.replace(/^room\.walls\.[xyz][+-]\./, 'room.walls.*.');
    const covered = new Set([...fixtureProps].map(collapse));
    const props = [...FIELDS].flatMap(([path, names]) => [...names].map((n) => collapse(path === '' ? n : `${path}.${n}`)));
    expect(props.filter((p) => !covered.has(p))).toEqual([]);
    for (const f of Object.values(VALID_FIXTURES)) expect(validateScenario(clone(f)).ok).toBe(true);
  });

  it('the validator refuses an unknown field in every object of the format', () => {
    const patterns = Object.keys(SCENARIO_FIELDS);
    const wallObject = [...fixtureObjects.keys()].find((p) => /^room\.walls\.[xyz][+-]$/.test(p))!;
    for (const pattern of patterns) {
      const at = fixtureObjects.get(pattern) ?? (/^room\.walls\.[xyz][+-]$/.test(pattern) ? fixtureObjects.get(wallObject) : undefined);
      expect(at, `no fixture holds an object at ${pattern}`).toBeDefined();
      const fixture = Object.values(VALID_FIXTURES).find((f) => lookup(f, at!) !== undefined)!;
      const s = clone(fixture);
      (lookup(s, at!) as Node).zzUnexpected = 1;
      const result = validateScenario(s);
      const expected = at === '' ? 'zzUnexpected' : `${at}.zzUnexpected`;
      expect(result.ok ? [] : result.errors.map((e) => `${e.path} ${e.rule}`), pattern).toContain(`${expected} unknown-field`);
    }
  });

  it('the schema accepts every fixture and demo scenario', () => {
    for (const f of Object.values(VALID_FIXTURES)) expect(schemaErrors(schema, f)).toEqual([]);
    for (const file of demos) expect(schemaErrors(schema, JSON.parse(readFileSync(new URL(file, scenarioDir), 'utf8'))), file).toEqual([]);
  });

  it.each(BAD_CASES.filter((c) => c.schema).map((c) => [c.name, c] as const))('the schema refuses too: %s', (_, c) => {
    expect(schemaErrors(schema, badScenario(c))).not.toEqual([]);
  });
});

/** The value at a concrete path such as "duct.sections[0]" or "room.walls.y-". */
function lookup(root: unknown, path: string): unknown {
  if (path === '') return root;
  const parts = path.match(/[^.[\]]+|\[\d+\]/g) ?? [];
  return parts.reduce<unknown>((node, part) => {
    if (node === null || typeof node !== 'object') return undefined;
    return part.startsWith('[') ? (node as unknown[])[Number(part.slice(1, -1))] : (node as Node)[part];
  }, root);
}
