import fc from 'fast-check';
import type { JsonSchema, JsonType } from './schema-slots';

// Values that break one rule of a JSON Schema, and text that is hostile but valid.

/** A JSON token written as is: numbers JSON.stringify cannot make (1e999 parses to Infinity). */
export class RawJson {
  constructor(readonly text: string) {}
}

const LOOSE_UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** Text a person might paste: every one of these is valid Unicode and must be stored as sent. */
export const storableOddities = [
  'Ω≈ç√∫˜µ≤≥÷',
  '👩‍🔬🔥🧯',
  '\u202Eevil\u202C',
  'e\u0301\u0302\u0303',
  'zero\u200Bwidth\u200D',
  'line\u2028sep\u2029',
  '<script>alert(1)</script>',
  "'; DROP TABLE labs; --",
  '%s%n%x ${7*7} {{7*7}}',
  '\t tab and spaces \t',
  '𝕿𝖍𝖊 𝖇𝖔𝖑𝖉',
  'ﷺ مختبر 実験室',
];

/** Text PostgreSQL cannot store as sent: a NUL, or half of a surrogate pair. */
export const unstorableChars = ['\u0000', '\uD800', '\uDFFF', '\uDC00\uD800'];

export const anyJson = fc.jsonValue({ maxDepth: 2 });

function valueOfType(type: JsonType): fc.Arbitrary<unknown> {
  switch (type) {
    case 'string':
      return fc.oneof(fc.string({ maxLength: 12 }), fc.constantFrom('12', 'true', 'null', ''));
    case 'number':
      return fc
        .double({ noNaN: true, noDefaultInfinity: true })
        .filter((n) => !Number.isInteger(n));
    case 'integer':
      return fc.integer({ min: -1e9, max: 1e9 });
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array':
      return fc.array(anyJson, { maxLength: 3 });
    case 'object':
      return fc.dictionary(fc.string({ maxLength: 6 }), anyJson, { maxKeys: 3 });
  }
}

const ALL_TYPES: JsonType[] = ['string', 'number', 'integer', 'boolean', 'null', 'array', 'object'];

/** A value of a JSON type the slot does not take; undefined when it takes anything. */
export function wrongType(allowed: Set<JsonType>): fc.Arbitrary<unknown> | undefined {
  if (allowed.size === 0) return undefined;
  const wrong = ALL_TYPES.filter((t) => !allowed.has(t));
  return wrong.length ? fc.oneof(...wrong.map(valueOfType)) : undefined;
}

// Non-blank characters, so trimming cannot bring a long string back under its limit.
const longChar = fc.constantFrom('x', 'é', '漢', '😀', '0', '\u0301');

/** Longer than the slot allows; now and then more than the 1 MB body limit. */
export function tooLong(maxLength: number): fc.Arbitrary<string> {
  return fc
    .tuple(
      longChar,
      fc.oneof(
        { weight: 20, arbitrary: fc.integer({ min: maxLength + 1, max: maxLength + 64 }) },
        { weight: 1, arbitrary: fc.constant(1_100_000) },
      ),
    )
    .map(([c, n]) => `a${c.repeat(n)}`);
}

export function tooShort(minLength: number): fc.Arbitrary<string> {
  return fc.string({ maxLength: minLength - 1, unit: fc.constantFrom(' ', 'x', '\t') });
}

export function withUnstorable(base: string): fc.Arbitrary<string> {
  return fc
    .tuple(fc.constantFrom(...unstorableChars), fc.nat({ max: base.length }))
    .map(([bad, at]) => `${base.slice(0, at)}${bad}${base.slice(at)}`);
}

/** A string that the slot's enum or format refuses. */
export function badFormat(schema: JsonSchema): fc.Arbitrary<string> | undefined {
  if (schema.enum) {
    const allowed = schema.enum;
    const near = allowed
      .filter((v): v is string => typeof v === 'string')
      .flatMap((v) => [v.toUpperCase(), ` ${v}`, `${v}\u0000`, `${v}s`]);
    return fc
      .oneof(fc.constantFrom(...near, 'other'), fc.string())
      .filter((s) => !allowed.includes(s));
  }
  if (schema.format === 'uuid') {
    return fc
      .oneof(
        fc.string(),
        fc.uuid().map((u) => u.replace(/-/g, '')),
        fc.uuid().map((u) => `{${u}}`),
        fc.uuid().map((u) => `${u}0`),
        fc.uuid().map((u) => `../${u}`),
        fc.constantFrom('00000000-0000-0000-0000-00000000000g', '1 OR 1=1', "' OR ''='"),
      )
      .filter((s) => !LOOSE_UUID.test(s));
  }
  if (schema.format === 'date-time') {
    return fc
      .oneof(fc.string(), fc.constantFrom('yesterday', '13/13/2024', '2024-02-30', 'now()'))
      .filter((s) => !/^\d{4}-\d{2}-\d{2}T/.test(s));
  }
  return undefined;
}

/** Numbers on the wrong side of a bound, whole numbers where they must be whole, and infinity. */
export function outOfRange(
  schema: JsonSchema,
  type: Set<JsonType>,
): fc.Arbitrary<unknown> | undefined {
  const options: fc.Arbitrary<unknown>[] = [];
  const step = (n: number) =>
    fc.double({ min: Math.max(1e-3, Math.abs(n) * 1e-6), max: 1e12, noNaN: true });
  if (schema.minimum !== undefined)
    options.push(step(schema.minimum).map((d) => schema.minimum! - d));
  if (schema.exclusiveMinimum !== undefined) {
    const e = schema.exclusiveMinimum;
    options.push(
      fc.oneof(
        fc.constant(e),
        step(e).map((d) => e - d),
      ),
    );
  }
  if (schema.maximum !== undefined)
    options.push(step(schema.maximum).map((d) => schema.maximum! + d));
  if (schema.exclusiveMaximum !== undefined) {
    const e = schema.exclusiveMaximum;
    options.push(
      fc.oneof(
        fc.constant(e),
        step(e).map((d) => e + d),
      ),
    );
  }
  if (type.has('integer') && !type.has('number')) options.push(fc.integer().map((n) => n + 0.5));
  if (type.has('number') || type.has('integer')) {
    options.push(fc.constantFrom(new RawJson('1e999'), new RawJson('-1e999')));
  }
  return options.length ? fc.oneof(...options) : undefined;
}

/** Names a field could be given to smuggle something in. */
export const unknownKey = fc.oneof(
  fc.constantFrom(
    '__proto__',
    'constructor',
    'prototype',
    'labId',
    'id',
    'role',
    'isAdmin',
    'createdAt',
    '$where',
    '',
  ),
  fc.string({ minLength: 1, maxLength: 20 }),
);

/** JSON text that does not parse. */
export const malformedJson = fc.oneof(
  fc.constantFrom(
    '{',
    '{"a":',
    '{"a": NaN}',
    '{"a": Infinity}',
    "{'a': 1}",
    '{"a":1,}',
    '[1,2',
    'nul',
    '{"a":"\\x41"}',
  ),
  fc.string({ maxLength: 20 }).map((s) => `{"${s}`),
);
