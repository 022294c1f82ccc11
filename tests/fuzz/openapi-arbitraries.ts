/**
 * Request generators driven by the OpenAPI document: the list of operations, and fast-check arbitraries
 * for well-formed values of a JSON Schema (OpenAPI 3.1 dialect as zod-to-openapi writes it), adversarial
 * values, mutations of a valid value (from the documented examples or the schema), and body encodings
 * (JSON, wrong content types, malformed text, empty). A route registered later is fuzzed with no change here.
 */
import fc from 'fast-check';

export type JsonSchema = {
  $ref?: string;
  type?: string | string[];
  enum?: unknown[];
  const?: unknown;
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  allOf?: JsonSchema[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: boolean | JsonSchema;
  items?: JsonSchema;
  prefixItems?: JsonSchema[];
  minItems?: number;
  maxItems?: number;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  exclusiveMaximum?: number;
  minLength?: number;
  maxLength?: number;
  format?: string;
  pattern?: string;
  example?: unknown;
  examples?: unknown[];
  default?: unknown;
};

export interface OpenApiDocument {
  paths?: Record<string, Record<string, OperationObject>>;
  components?: { schemas?: Record<string, JsonSchema> };
}

interface ParameterObject {
  name: string;
  in: 'path' | 'query' | 'header' | 'cookie';
  required?: boolean;
  schema?: JsonSchema;
}

interface OperationObject {
  security?: Array<Record<string, string[]>>;
  parameters?: ParameterObject[];
  requestBody?: { required?: boolean; content?: Record<string, { schema?: JsonSchema; example?: unknown; examples?: Record<string, { value?: unknown }> }> };
  responses?: Record<string, unknown>;
}

export interface Operation {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  /** How the route authenticates, from its `security`. */
  auth: 'api-key' | 'session' | 'none';
  bodySchema?: JsonSchema;
  bodyTypes: string[];
  /** Documented request examples (operation examples, then the body schema's own example). */
  examples: unknown[];
  pathParams: ParameterObject[];
  queryParams: ParameterObject[];
}

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const;

export function listOperations(doc: OpenApiDocument): Operation[] {
  const out: Operation[] = [];
  for (const [path, item] of Object.entries(doc.paths ?? {})) {
    for (const method of METHODS) {
      const op = item[method];
      if (!op) continue;
      const schemes = (op.security ?? []).flatMap((s) => Object.keys(s));
      const auth = schemes.includes('ApiKey') ? 'api-key' : schemes.includes('ConsoleSession') ? 'session' : 'none';
      const content = op.requestBody?.content ?? {};
      const json = content['application/json'];
      const examples: unknown[] = [];
      if (json?.examples) for (const e of Object.values(json.examples)) if (e.value !== undefined) examples.push(e.value);
      if (json?.example !== undefined) examples.push(json.example);
      const bodySchema = json?.schema;
      const resolved = bodySchema ? resolve(doc, bodySchema) : undefined;
      if (resolved?.example !== undefined) examples.push(resolved.example);
      out.push({
        method,
        path,
        auth,
        bodySchema,
        bodyTypes: Object.keys(content),
        examples,
        pathParams: (op.parameters ?? []).filter((p) => p.in === 'path'),
        queryParams: (op.parameters ?? []).filter((p) => p.in === 'query'),
      });
    }
  }
  return out;
}

export function resolve(doc: OpenApiDocument, schema: JsonSchema): JsonSchema {
  let s = schema;
  for (let i = 0; s.$ref && i < 20; i += 1) {
    const name = s.$ref.replace('#/components/schemas/', '');
    const target = doc.components?.schemas?.[name];
    if (!target) throw new Error(`unresolvable $ref ${s.$ref}`);
    s = target;
  }
  return s;
}

// ---------------------------------------------------------------- well-formed values of a schema

const MAX_DEPTH = 6;

/** Values that satisfy the schema's structure and bounds (patterns and cross-field rules may still fail). */
export function valueOf(doc: OpenApiDocument, schema: JsonSchema, depth = 0): fc.Arbitrary<unknown> {
  const s = resolve(doc, schema);
  if (s.const !== undefined) return fc.constant(s.const);
  if (s.enum) return fc.constantFrom(...s.enum);
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives) return fc.oneof(...alternatives.map((a) => valueOf(doc, a, depth + 1)));
  if (s.allOf) {
    const parts = s.allOf.map((a) => resolve(doc, a));
    return valueOf(doc, { type: 'object', properties: Object.assign({}, ...parts.map((p) => p.properties ?? {})), required: parts.flatMap((p) => p.required ?? []) }, depth + 1);
  }
  const type = Array.isArray(s.type) ? s.type : s.type ? [s.type] : undefined;
  if (type && type.length > 1) return fc.oneof(...type.map((t) => valueOf(doc, { ...s, type: t }, depth)));
  const example = s.example !== undefined ? [fc.constant(s.example)] : [];
  switch (type?.[0]) {
    case 'null':
      return fc.constant(null);
    case 'boolean':
      return fc.boolean();
    case 'integer': {
      const min = Math.ceil(Math.max(s.minimum ?? (s.exclusiveMinimum !== undefined ? s.exclusiveMinimum + 1 : -1e6), -1e9));
      const max = Math.floor(Math.min(s.maximum ?? (s.exclusiveMaximum !== undefined ? s.exclusiveMaximum - 1 : 1e6), 1e9));
      return min <= max ? fc.oneof(fc.integer({ min, max }), ...example) : fc.constant(min);
    }
    case 'number': {
      const min = s.minimum ?? s.exclusiveMinimum ?? -1e6;
      const max = s.maximum ?? s.exclusiveMaximum ?? 1e6;
      const numbers = fc
        .double({ min, max, noNaN: true, noDefaultInfinity: true, minExcluded: s.exclusiveMinimum !== undefined, maxExcluded: s.exclusiveMaximum !== undefined })
        .map((x) => (Object.is(x, -0) ? 0 : x));
      return fc.oneof(numbers, ...example);
    }
    case 'string': {
      if (s.format === 'email') return fc.emailAddress();
      if (s.format === 'uuid') return fc.uuid();
      if (s.format === 'date-time') return fc.date({ min: new Date('2000-01-01'), max: new Date('2100-01-01') }).map((d) => d.toISOString());
      if (s.pattern && s.example !== undefined) return fc.constant(s.example);
      const minLength = s.minLength ?? 0;
      const maxLength = Math.min(s.maxLength ?? 40, Math.max(minLength, 40));
      return fc.oneof(fc.string({ minLength, maxLength }), ...example);
    }
    case 'array': {
      if (depth >= MAX_DEPTH) return fc.constant([]);
      const minLength = s.minItems ?? 0;
      const maxLength = Math.min(s.maxItems ?? 4, Math.max(minLength, 4));
      if (s.prefixItems) return fc.tuple(...s.prefixItems.map((p) => valueOf(doc, p, depth + 1)));
      return fc.array(s.items ? valueOf(doc, s.items, depth + 1) : fc.jsonValue({ maxDepth: 1 }), { minLength, maxLength });
    }
    case 'object':
    default: {
      if (!s.properties) return type ? fc.dictionary(fc.string({ maxLength: 8 }), fc.jsonValue({ maxDepth: 1 }), { maxKeys: 3 }) : fc.jsonValue({ maxDepth: 2 });
      if (depth >= MAX_DEPTH) return fc.constant({});
      const props = Object.fromEntries(Object.entries(s.properties).map(([k, v]) => [k, valueOf(doc, v, depth + 1)]));
      return fc.record(props, { requiredKeys: (s.required ?? []).filter((k) => k in props) });
    }
  }
}

// ---------------------------------------------------------------- adversarial values

export const nastyStrings = [
  '',
  ' ',
  'NaN',
  'Infinity',
  '-Infinity',
  '1e999',
  '-0',
  '0x1F',
  ' 12 ',
  '١٢٣',
  '１２',
  '\u0000',
  '\ud800',
  '\u202eevil',
  'ﬀ',
  '🔋⚡️',
  "' OR '1'='1' --",
  '"; DROP TABLE users; --',
  '<script>alert(1)</script>',
  '../../../../etc/passwd',
  '%00%2e%2e',
  '${jndi:ldap://x}',
  '{{7*7}}',
  '__proto__',
  'constructor',
  'null',
  'true',
  '{}',
  '[]',
  'owner',
  'a'.repeat(5_000),
  '∞',
];

/**
 * Number tokens JSON.stringify cannot write (JSON.parse reads 1e400 as Infinity, long integers lose
 * precision): carried as marker strings and spliced into the JSON text by `toJsonText`.
 */
const rawNumberTokens = ['1e400', '-1e400', '123456789012345678901234567890', '-0.0', '1E+2', '1.0e-400', '0.00000000000000000000000000000000000001', '9007199254740993'];
const RAW = /"@@raw:([^"@]+)@@"/g;
const raw = (token: string) => `@@raw:${token}@@`;

/** JSON text of a value, with raw number tokens spliced in. */
export function toJsonText(value: unknown): string {
  return value === undefined ? '' : JSON.stringify(value).replace(RAW, '$1');
}

export const nastyNumbers = [0, -0, -1, 1, 1e308, -1e308, 2 ** 53 + 2, -(2 ** 53) - 2, Number.MIN_VALUE, 1e-320, 2 ** 31, -(2 ** 31) - 1, 0.1 + 0.2, 123456789.123456789, 4000.0000001];

/** A value nested `depth` times inside arrays or objects. */
export function nested(depth: number, kind: 'array' | 'object'): unknown {
  let v: unknown = 1;
  for (let i = 0; i < depth; i += 1) v = kind === 'array' ? [v] : { a: v };
  return v;
}

export const adversarialValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom<unknown>(...nastyStrings) },
  { weight: 3, arbitrary: fc.constantFrom<unknown>(...nastyNumbers) },
  { weight: 1, arbitrary: fc.constantFrom<unknown>(null, true, false, [], {}, [null], [[]], [{}]) },
  { weight: 1, arbitrary: fc.integer({ min: 5, max: 400 }).chain((d) => fc.constantFrom(nested(d, 'array'), nested(d, 'object'))) },
  { weight: 1, arbitrary: fc.fullUnicodeString({ maxLength: 30 }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.constant(Array.from({ length: 2_000 }, (_, i) => i)) },
  { weight: 1, arbitrary: fc.double() },
  { weight: 2, arbitrary: fc.constantFrom(...rawNumberTokens).map(raw) },
);

/** Property names a client must never be able to set, and names that trip naive object handling. */
const extraNames = ['role', 'organizationId', 'planId', 'userId', 'isAdmin', 'emailVerifiedAt', 'monthlyQuotaCalls', 'keyHash', '__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty', ''];

// ---------------------------------------------------------------- mutations of a valid value

type Path = Array<string | number>;

function pathsOf(value: unknown, prefix: Path = [], out: Path[] = [], limit = 200): Path[] {
  out.push(prefix);
  if (out.length >= limit) return out;
  if (Array.isArray(value)) value.slice(0, 20).forEach((v, i) => pathsOf(v, [...prefix, i], out, limit));
  else if (value && typeof value === 'object') for (const [k, v] of Object.entries(value)) pathsOf(v, [...prefix, k], out, limit);
  return out;
}

function clone<T>(v: T): T {
  return v === undefined ? v : (JSON.parse(JSON.stringify(v)) as T);
}

/** Sets an own property even for names like "__proto__" (so JSON.stringify sends it). */
function setOwn(target: Record<string, unknown>, key: string, value: unknown) {
  Object.defineProperty(target, key, { value, enumerable: true, writable: true, configurable: true });
}

function at(root: unknown, path: Path): unknown {
  return path.reduce<unknown>((v, k) => (v as Record<string | number, unknown>)?.[k], root);
}

function replaceAt(root: unknown, path: Path, next: (old: unknown) => unknown): unknown {
  if (path.length === 0) return next(root);
  const copy = clone(root);
  const parent = at(copy, path.slice(0, -1)) as Record<string | number, unknown>;
  const key = path[path.length - 1]!;
  if (Array.isArray(parent)) parent[key as number] = next(parent[key as number]);
  else setOwn(parent, String(key), next(parent[key]));
  return copy;
}

function removeAt(root: unknown, path: Path): unknown {
  if (path.length === 0) return undefined;
  const copy = clone(root);
  const parent = at(copy, path.slice(0, -1)) as Record<string | number, unknown>;
  const key = path[path.length - 1]!;
  if (Array.isArray(parent)) parent.splice(key as number, 1);
  else delete parent[key];
  return copy;
}

export type Mutation =
  | { kind: 'replace'; pick: number; with: unknown }
  | { kind: 'remove'; pick: number }
  | { kind: 'extra'; pick: number; name: string; with: unknown }
  | { kind: 'wrap'; pick: number }
  | { kind: 'stringify'; pick: number }
  | { kind: 'repeat'; pick: number }
  | { kind: 'none' };

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 4, arbitrary: fc.record({ kind: fc.constant('replace' as const), pick: fc.nat(), with: adversarialValue }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('remove' as const), pick: fc.nat() }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('extra' as const), pick: fc.nat(), name: fc.oneof(fc.constantFrom(...extraNames), fc.string({ maxLength: 12 })), with: adversarialValue }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('wrap' as const), pick: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('stringify' as const), pick: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('repeat' as const), pick: fc.nat() }) },
  { weight: 1, arbitrary: fc.constant({ kind: 'none' as const }) },
);

export function applyMutation(value: unknown, m: Mutation): unknown {
  if (m.kind === 'none') return value;
  const paths = pathsOf(value);
  const path = paths[m.pick % paths.length]!;
  switch (m.kind) {
    case 'replace':
      return replaceAt(value, path, () => m.with);
    case 'remove':
      return removeAt(value, path);
    case 'extra': {
      const objects = paths.filter((p) => {
        const v = at(value, p);
        return v !== null && typeof v === 'object' && !Array.isArray(v);
      });
      if (objects.length === 0) return value;
      return replaceAt(value, objects[m.pick % objects.length]!, (old) => {
        const copy = clone(old) as Record<string, unknown>;
        setOwn(copy, m.name, m.with);
        return copy;
      });
    }
    case 'wrap':
      return replaceAt(value, path, (old) => [old]);
    case 'stringify':
      return replaceAt(value, path, (old) => (typeof old === 'string' ? Number(old) : JSON.stringify(old) ?? 'undefined'));
    case 'repeat':
      return replaceAt(value, path, (old) => Array.from({ length: 500 }, () => old));
  }
}

// ---------------------------------------------------------------- bodies on the wire

export interface WireBody {
  /** undefined: no Content-Type header. */
  contentType?: string;
  /** undefined: no body at all. */
  text?: string;
  label: string;
}

const malformedJson = ['{', '{"a":', "{'a': 1}", '[1,]', '{"a":1,}', 'NaN', '{"a": NaN}', '{"a": Infinity}', '{"a":1}{"b":2}', '\u0000', '\ufeff{}', '{"a":"\\ud800"}', '{"a":1e99999}', '01', '"unterminated', 'null', 'true', '123', '"a string"'];
const wrongTypes = ['text/plain', 'application/x-www-form-urlencoded', 'multipart/form-data; boundary=x', 'application/xml', 'application/octet-stream', 'text/csv', 'application/json; charset=utf-16', 'application/json; charset=latin-9', 'application/jsonx', 'Application/JSON'];

/** The usual body (JSON of the value) most of the time; otherwise one of the ways a body goes wrong. */
export function wireBody(value: fc.Arbitrary<unknown>): fc.Arbitrary<WireBody> {
  const json = toJsonText;
  return fc.oneof(
    { weight: 12, arbitrary: value.map((v) => ({ contentType: 'application/json', text: json(v), label: 'json' })) },
    { weight: 2, arbitrary: fc.tuple(value, fc.constantFrom(...wrongTypes)).map(([v, contentType]) => ({ contentType, text: json(v), label: `json as ${contentType}` })) },
    { weight: 2, arbitrary: fc.constantFrom(...malformedJson).map((text) => ({ contentType: 'application/json', text, label: 'malformed json' })) },
    { weight: 1, arbitrary: fc.constantFrom<WireBody>({ contentType: 'application/json', text: '', label: 'empty json' }, { label: 'no body, no type' }, { text: '{}', label: '{} without a type' }) },
    { weight: 1, arbitrary: fc.integer({ min: 1_000, max: 20_000 }).map((n) => ({ contentType: 'application/json', text: '['.repeat(n) + ']'.repeat(n), label: `nesting ${n}` })) },
  );
}

/** Multipart uploads (a CSV file field), well-formed or not: the shapes a file-import route must survive. */
export function multipartBody(): fc.Arbitrary<WireBody> {
  const cell = fc.oneof(fc.constantFrom(...nastyStrings, '=cmd|/c calc!A1', '+1+1', '@SUM(A1)', '"quoted, cell"', '""'), fc.string({ maxLength: 12 }), fc.double().map(String));
  const csv = fc.oneof(
    fc.array(fc.array(cell, { minLength: 1, maxLength: 6 }), { minLength: 0, maxLength: 8 }).map((rows) => rows.map((r) => r.join(',')).join('\n')),
    fc.fullUnicodeString({ maxLength: 200 }),
    fc.constant('\ufeffsku,name\r\n'),
  );
  const boundary = 'fuzzboundary';
  return fc
    .record({
      field: fc.constantFrom('file', 'file', 'upload', ''),
      filename: fc.constantFrom('items.csv', '../../etc/passwd.csv', 'items.exe', 'ünïcødé.csv', ''),
      type: fc.constantFrom('text/csv', 'text/csv', 'application/octet-stream', 'image/png'),
      content: csv,
      broken: fc.boolean(),
    })
    .map(({ field, filename, type, content, broken }) => ({
      contentType: `multipart/form-data; boundary=${boundary}`,
      text: `--${boundary}\r\nContent-Disposition: form-data; name="${field}"; filename="${filename}"\r\nContent-Type: ${type}\r\n\r\n${content}\r\n${broken ? '' : `--${boundary}--\r\n`}`,
      label: `multipart ${type}${broken ? ' (unterminated)' : ''}`,
    }));
}

/** Bodies for an operation: mutations of its documented examples, schema-shaped values and their mutations, and plain adversarial values. */
export function bodyFor(doc: OpenApiDocument, op: Operation): fc.Arbitrary<unknown> {
  const shaped = op.bodySchema ? valueOf(doc, op.bodySchema) : fc.constant({});
  const bases = op.examples.length > 0 ? fc.oneof(fc.constantFrom(...op.examples), shaped) : shaped;
  return fc.oneof(
    { weight: 6, arbitrary: fc.tuple(bases, mutation).map(([b, m]) => applyMutation(b, m)) },
    { weight: 2, arbitrary: fc.tuple(bases, mutation, mutation).map(([b, m1, m2]) => applyMutation(applyMutation(b, m1), m2)) },
    { weight: 2, arbitrary: bases },
    { weight: 2, arbitrary: adversarialValue },
  );
}

// ---------------------------------------------------------------- query strings and path parameters

/** Percent-encoding; a lone surrogate (which encodeURIComponent refuses) goes as its invalid UTF-8 bytes. */
export function encodeLoosely(v: string): string {
  try {
    return encodeURIComponent(v);
  } catch {
    return '%ED%A0%80';
  }
}

const rarely = <T>(arb: fc.Arbitrary<T>) => fc.oneof({ weight: 4, arbitrary: fc.constant(undefined) }, { weight: 1, arbitrary: arb });

/** A query string for the operation's documented parameters (schema-shaped or adversarial), sometimes with a stray one. */
export function queryFor(doc: OpenApiDocument, op: Operation): fc.Arbitrary<string> {
  const params = op.queryParams.map((p) =>
    fc.option(fc.oneof(p.schema ? valueOf(doc, p.schema) : fc.string(), fc.constantFrom(...nastyStrings)).map((v) => [p.name, String(v)] as const), { nil: undefined }),
  );
  const extra = rarely(fc.tuple(fc.constantFrom('limit', 'month', '__proto__', 'a[b]', 'x'), fc.constantFrom(...nastyStrings)));
  return fc.tuple(fc.tuple(...params), extra).map(([pairs, more]) => {
    const entries = [...pairs, more].filter((e): e is readonly [string, string] => Boolean(e));
    return entries.length ? `?${entries.map(([k, v]) => `${encodeLoosely(k)}=${encodeLoosely(v)}`).join('&')}` : '';
  });
}

const nastyPathSegments = ['..', '%2e%2e', '%2F', 'null', 'undefined', '0', '-1', '00000000-0000-0000-0000-000000000000', 'a'.repeat(300), "'", '%00', '%ED%A0%80', encodeURIComponent('🔋'), '%25', 'me'];

/** A path with its {parameters} filled: the known object of that name (when given), another id, or junk. */
export function pathFor(op: Operation, known: Record<string, string>): fc.Arbitrary<string> {
  const values = op.pathParams.map((p) => {
    const others = [{ weight: 2, arbitrary: fc.uuid() }, { weight: 2, arbitrary: fc.constantFrom(...nastyPathSegments) }];
    const id = known[p.name];
    return id ? fc.oneof({ weight: 6, arbitrary: fc.constant(encodeURIComponent(id)) }, ...others) : fc.oneof(...others);
  });
  return fc.tuple(...values).map((filled) => op.pathParams.reduce((path, p, i) => path.replace(`{${p.name}}`, filled[i]!), op.path));
}
