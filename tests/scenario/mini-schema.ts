// A small JSON Schema (draft 2020-12) checker covering exactly the keywords scenarios/schema.json
// uses, so the tests can hold the hand-written validator and the schema to the same answers without
// a dependency. An unknown keyword is an error: the schema cannot quietly outgrow this checker.
// Semantics follow the JSON Schema 2020-12 Core and Validation specifications (json-schema.org).

type Schema = Record<string, unknown>;

const ANNOTATIONS = new Set(['$schema', '$id', '$defs', 'title', 'description']);
const ASSERTIONS = new Set([
  '$ref', 'type', 'const', 'enum', 'properties', 'required', 'additionalProperties', 'minProperties', 'items', 'prefixItems',
  'minItems', 'maxItems', 'uniqueItems', 'minimum', 'maximum', 'exclusiveMinimum', 'exclusiveMaximum', 'minLength', 'maxLength',
  'pattern', 'oneOf', 'anyOf', 'allOf', 'not', 'dependentSchemas',
]);

export function unknownKeywords(schema: unknown, path = '#'): string[] {
  if (Array.isArray(schema)) return schema.flatMap((s, i) => unknownKeywords(s, `${path}/${i}`));
  if (schema === null || typeof schema !== 'object') return [];
  const out: string[] = [];
  for (const [key, value] of Object.entries(schema as Schema)) {
    if (!ANNOTATIONS.has(key) && !ASSERTIONS.has(key)) out.push(`${path}/${key}`);
    if (key === 'properties' || key === '$defs' || key === 'dependentSchemas') {
      for (const [name, sub] of Object.entries(value as Schema)) out.push(...unknownKeywords(sub, `${path}/${key}/${name}`));
    } else if (key === 'items' || key === 'not' || key === 'additionalProperties') {
      out.push(...unknownKeywords(value, `${path}/${key}`));
    } else if (key === 'prefixItems' || key === 'oneOf' || key === 'anyOf' || key === 'allOf') {
      out.push(...unknownKeywords(value, `${path}/${key}`));
    }
  }
  return out;
}

export function schemaErrors(root: Schema, value: unknown): string[] {
  const errors: string[] = [];
  check(root, root, value, '', errors);
  return errors;
}

function resolve(root: Schema, ref: string): Schema {
  if (!ref.startsWith('#/')) throw new Error(`only local $ref supported: ${ref}`);
  return ref.slice(2).split('/').reduce<unknown>((node, part) => (node as Schema)[part], root) as Schema;
}

function typeOf(v: unknown): string {
  if (v === null) return 'null';
  if (Array.isArray(v)) return 'array';
  if (typeof v === 'number') return Number.isInteger(v) ? 'integer' : 'number';
  return typeof v;
}

function matchesType(v: unknown, type: string): boolean {
  const t = typeOf(v);
  return t === type || (type === 'number' && t === 'integer');
}

function check(root: Schema, s: Schema, v: unknown, at: string, errors: string[]): void {
  const fail = (why: string) => errors.push(`${at || '(root)'}: ${why}`);
  const sub = (schema: unknown, value: unknown, where: string) => check(root, schema as Schema, value, where, errors);
  const passes = (schema: unknown, value: unknown) => schemaErrorsAt(root, schema as Schema, value) === 0;
  if (typeof s.$ref === 'string') sub(resolve(root, s.$ref), v, at);
  if (typeof s.type === 'string' && !matchesType(v, s.type)) fail(`not ${s.type}`);
  if ('const' in s && v !== s.const) fail(`not ${JSON.stringify(s.const)}`);
  if (Array.isArray(s.enum) && !s.enum.includes(v)) fail('not in enum');
  if (Array.isArray(s.oneOf) && s.oneOf.filter((o) => passes(o, v)).length !== 1) fail('not exactly one of oneOf');
  if (Array.isArray(s.anyOf) && !s.anyOf.some((o) => passes(o, v))) fail('none of anyOf');
  if (Array.isArray(s.allOf)) s.allOf.forEach((o) => sub(o, v, at));
  if (s.not !== undefined && passes(s.not, v)) fail('matches not');
  if (typeof v === 'number') checkNumber(s, v, fail);
  if (typeof v === 'string') checkString(s, v, fail);
  if (Array.isArray(v)) checkArray(s, v, at, fail, sub);
  if (typeOf(v) === 'object') checkObject(s, v as Schema, at, fail, sub);
}

function schemaErrorsAt(root: Schema, s: Schema, v: unknown): number {
  const errors: string[] = [];
  check(root, s, v, '', errors);
  return errors.length;
}

function checkNumber(s: Schema, v: number, fail: (why: string) => void): void {
  if (typeof s.minimum === 'number' && v < s.minimum) fail(`below minimum ${s.minimum}`);
  if (typeof s.maximum === 'number' && v > s.maximum) fail(`above maximum ${s.maximum}`);
  if (typeof s.exclusiveMinimum === 'number' && v <= s.exclusiveMinimum) fail(`not above ${s.exclusiveMinimum}`);
  if (typeof s.exclusiveMaximum === 'number' && v >= s.exclusiveMaximum) fail(`not below ${s.exclusiveMaximum}`);
}

function checkString(s: Schema, v: string, fail: (why: string) => void): void {
  if (typeof s.minLength === 'number' && [...v].length < s.minLength) fail('too short');
  if (typeof s.maxLength === 'number' && [...v].length > s.maxLength) fail('too long');
  if (typeof s.pattern === 'string' && !new RegExp(s.pattern, 'u').test(v)) fail('pattern');
}

type Sub = (schema: unknown, value: unknown, where: string) => void;

function checkArray(s: Schema, v: unknown[], at: string, fail: (why: string) => void, sub: Sub): void {
  if (typeof s.minItems === 'number' && v.length < s.minItems) fail('too few items');
  if (typeof s.maxItems === 'number' && v.length > s.maxItems) fail('too many items');
  if (s.uniqueItems === true && new Set(v.map((x) => JSON.stringify(x))).size !== v.length) fail('items not unique');
  const prefix = Array.isArray(s.prefixItems) ? s.prefixItems : [];
  v.forEach((item, i) => {
    if (i < prefix.length) sub(prefix[i], item, `${at}[${i}]`);
    else if (s.items !== undefined) sub(s.items, item, `${at}[${i}]`);
  });
}

function checkObject(s: Schema, v: Schema, at: string, fail: (why: string) => void, sub: Sub): void {
  const props = (s.properties ?? {}) as Schema;
  if (Array.isArray(s.required)) for (const key of s.required as string[]) if (!Object.hasOwn(v, key)) fail(`missing ${key}`);
  if (typeof s.minProperties === 'number' && Object.keys(v).length < s.minProperties) fail('too few properties');
  for (const [key, value] of Object.entries(v)) {
    const where = at === '' ? key : `${at}.${key}`;
    if (Object.hasOwn(props, key)) sub(props[key], value, where);
    else if (s.additionalProperties === false) fail(`unknown property ${key}`);
  }
  const dependent = (s.dependentSchemas ?? {}) as Schema;
  for (const [key, schema] of Object.entries(dependent)) if (Object.hasOwn(v, key)) sub(schema, v, at);
}
