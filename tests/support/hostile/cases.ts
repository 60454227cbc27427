import fc from 'fast-check';
import {
  allowedTypes,
  objectSchemaAt,
  REMOVE,
  slotsOf,
  type JsonPath,
  type JsonSchema,
  type OpenApiDocument,
  type Slot,
} from './schema-slots';
import { csvChanges } from './csv';
import {
  anyJson,
  badFormat,
  malformedJson,
  outOfRange,
  storableOddities,
  tooLong,
  tooShort,
  unknownKey,
  withUnstorable,
  wrongType,
} from './values';

// A hostile case is a valid request with at least one change that makes it invalid ("breaking"),
// plus changes that keep a field valid but odd ("noise"). Each breaking change says which
// statuses may answer it when it is the only one.

export type AuthVariant =
  'bearer' | 'none' | 'garbage' | 'basic' | 'forged' | 'cookie-without-csrf' | 'cookie-wrong-csrf';

export type FileVariant =
  | 'missing'
  | 'empty'
  | 'text'
  | 'random-bytes'
  | 'truncated-jpeg'
  | 'svg'
  | 'gif'
  | 'pixel-bomb'
  | 'wrong-field'
  | 'two-files'
  | 'too-big';

export type Edit =
  | { at: 'body'; path: JsonPath; value: unknown }
  | { at: 'body-root'; value: unknown }
  /** A body as sent; no Content-Type header when contentType is null. */
  | { at: 'raw-body'; contentType: string | null; text: string | Buffer; encoding?: string }
  | { at: 'param'; name: string; value: string; encoded?: boolean }
  | { at: 'auth'; variant: AuthVariant }
  | { at: 'file'; variant: FileVariant };

export type Change = { kind: string; label: string; edit: Edit; expect: readonly number[] };
export type HostileCase = { breaking: Change[]; noise: Change[] };

export type BodyKind = 'json' | 'multipart' | 'csv' | 'none';

export type RouteShape = {
  doc: OpenApiDocument;
  bodySchema?: JsonSchema;
  bodyKind: BodyKind;
  exampleBody?: unknown;
  params: Record<string, string>;
  /** Whether the route needs a signed-in caller. */
  authenticated: boolean;
  /** Body paths holding a client-made id: a fresh one is valid, so they are not references. */
  clientIdPaths: string[];
  /** Path parameters that are not record ids (e.g. an invitation token). */
  tokenParams: string[];
  otherLabIds: string[];
};

const BAD_REQUEST = [400] as const;
const NOT_FOUND_OR_REFUSED = [400, 404, 409] as const;
const pathKey = (path: JsonPath) => path.map((p) => (typeof p === 'number' ? '*' : p)).join('.');

function body(
  label: string,
  path: JsonPath,
  value: fc.Arbitrary<unknown>,
  expect: readonly number[] = BAD_REQUEST,
) {
  return value.map((v): Change => ({
    kind: label,
    label: `${label} at ${path.join('.') || 'body'}`,
    edit: { at: 'body', path, value: v },
    expect,
  }));
}

function slotChanges(shape: RouteShape, slot: Slot): fc.Arbitrary<Change>[] {
  const { doc } = shape;
  const out: fc.Arbitrary<Change>[] = [];
  const schema = slot.schema.$ref
    ? doc.components.schemas[slot.schema.$ref.split('/').pop()!]!
    : slot.schema;
  const types = allowedTypes(doc, schema);
  const huge = [400, 413] as const;
  if (slot.required) out.push(body('missing required field', slot.path, fc.constant(REMOVE)));
  const wrong = wrongType(types);
  if (wrong) out.push(body('wrong type', slot.path, wrong));
  if (typeof slot.value === 'string') {
    if (schema.maxLength !== undefined)
      out.push(body('too long', slot.path, tooLong(schema.maxLength), huge));
    if (schema.minLength) out.push(body('too short', slot.path, tooShort(schema.minLength)));
    const format = badFormat(schema);
    if (format) out.push(body('bad format', slot.path, format));
    out.push(body('unstorable text', slot.path, withUnstorable(slot.value)));
    const reference = schema.format === 'uuid' && !shape.clientIdPaths.includes(pathKey(slot.path));
    if (reference) {
      out.push(
        body(
          'id of another lab',
          slot.path,
          fc.constantFrom(...shape.otherLabIds),
          NOT_FOUND_OR_REFUSED,
        ),
      );
      out.push(body('unknown id', slot.path, fc.uuid(), NOT_FOUND_OR_REFUSED));
    }
  }
  if (typeof slot.value === 'number') {
    const range = outOfRange(schema, types);
    if (range) out.push(body('out of range', slot.path, range));
  }
  if (Array.isArray(slot.value)) {
    if (schema.minItems) out.push(body('too few items', slot.path, fc.constant([])));
    if (schema.maxItems !== undefined && slot.value.length > 0) {
      const many = Array.from({ length: schema.maxItems + 1 }, () => slot.value as unknown[])
        .flat()
        .slice(0, schema.maxItems + 1);
      out.push(body('too many items', slot.path, fc.constant(many)));
    }
  }
  return out;
}

function unknownFieldChanges(shape: RouteShape, slots: Slot[]): fc.Arbitrary<Change>[] {
  const objects: JsonPath[] = [
    [],
    ...slots.filter((s) => isPlainObject(s.value)).map((s) => s.path),
  ];
  return objects.map((path) => {
    const known = Object.keys(
      objectSchemaAt(shape.doc, shape.bodySchema!, shape.exampleBody, path).properties ?? {},
    );
    return fc
      .tuple(
        unknownKey.filter((k) => !known.includes(k)),
        anyJson,
      )
      .map(([key, value]): Change => ({
        kind: 'unknown field',
        label: `unknown field "${key}" at ${path.join('.') || 'body'}`,
        edit: { at: 'body', path: [...path, key], value },
        expect: BAD_REQUEST,
      }));
  });
}

const isPlainObject = (v: unknown) => typeof v === 'object' && v !== null && !Array.isArray(v);

function wholeBodyChanges(shape: RouteShape): fc.Arbitrary<Change>[] {
  const out: fc.Arbitrary<Change>[] = [
    fc
      .constantFrom(
        'text/plain',
        'application/x-www-form-urlencoded',
        'application/xml',
        'application/json-patch+json',
      )
      .map((type): Change => ({
        kind: 'wrong content type',
        label: `body sent as ${type}`,
        edit: {
          at: 'raw-body',
          contentType: type,
          text: JSON.stringify(shape.exampleBody ?? { a: 1 }),
        },
        expect: [415],
      })),
  ];
  if (shape.bodyKind === 'json') {
    out.push(
      // A type another route reads (an import's CSV) is still not this route's JSON.
      fc.constant<Change>({
        kind: 'wrong content type',
        label: 'body sent as text/csv',
        edit: { at: 'raw-body', contentType: 'text/csv', text: 'a,b\n1,2\n' },
        expect: [415],
      }),
      fc.constantFrom('utf-16', 'koi8-r', 'x-unknown').map((charset): Change => ({
        kind: 'unsupported charset',
        label: `JSON in ${charset}`,
        edit: {
          at: 'raw-body',
          contentType: `application/json; charset=${charset}`,
          text: JSON.stringify(shape.exampleBody),
        },
        // body-parser decodes any utf-* charset (the JSON then fails to parse) and refuses others.
        expect: [400, 415],
      })),
      fc.constantFrom('gzip', 'deflate', 'br', 'x-zip').map((encoding): Change => ({
        kind: 'bad content encoding',
        label: `JSON claimed as ${encoding}`,
        edit: {
          at: 'raw-body',
          contentType: 'application/json',
          text: JSON.stringify(shape.exampleBody),
          encoding,
        },
        expect: [400, 415],
      })),
      malformedJson.map((text): Change => ({
        kind: 'malformed JSON',
        label: 'malformed JSON',
        edit: { at: 'raw-body', contentType: 'application/json', text },
        expect: BAD_REQUEST,
      })),
      fc
        .oneof(
          fc.array(anyJson, { maxLength: 2 }),
          fc.string(),
          fc.double(),
          fc.constant(null),
          fc.boolean(),
        )
        .map((value): Change => ({
          kind: 'body not an object',
          label: 'body not an object',
          edit: { at: 'body-root', value },
          expect: BAD_REQUEST,
        })),
    );
  }
  return out;
}

function paramChanges(shape: RouteShape): fc.Arbitrary<Change>[] {
  return Object.keys(shape.params).flatMap((name) => {
    const garbage = fc.oneof(
      fc.string({ minLength: 1, maxLength: 40 }),
      fc.constantFrom(
        '..',
        '%2e%2e%2f',
        '%00',
        '%E0%A4%A',
        '%',
        'null',
        'undefined',
        '0',
        '-1',
        ' ',
      ),
      fc.constant('x'.repeat(5000)),
    );
    const changes = [
      garbage.map((value): Change => ({
        kind: 'garbage path parameter',
        label: `garbage ${name}`,
        edit: { at: 'param', name, value, encoded: value.includes('%') },
        expect: [400, 404],
      })),
      fc.uuid().map((value): Change => ({
        kind: 'unknown path id',
        label: `unknown ${name}`,
        edit: { at: 'param', name, value },
        expect: [400, 404],
      })),
    ];
    if (!shape.tokenParams.includes(name)) {
      changes.push(
        fc.constantFrom(...shape.otherLabIds).map((value): Change => ({
          kind: 'path id of another lab',
          label: `${name} of another lab`,
          edit: { at: 'param', name, value },
          expect: NOT_FOUND_OR_REFUSED,
        })),
      );
    }
    return changes;
  });
}

const authChanges = fc
  .constantFrom<AuthVariant>(
    'none',
    'garbage',
    'basic',
    'forged',
    'cookie-without-csrf',
    'cookie-wrong-csrf',
  )
  .map((variant): Change => ({
    kind: `auth: ${variant}`,
    label: `auth: ${variant}`,
    edit: { at: 'auth', variant },
    expect: variant.startsWith('cookie') ? [403] : [401],
  }));

const fileChanges = fc
  .constantFrom<FileVariant>(
    'missing',
    'empty',
    'text',
    'random-bytes',
    'truncated-jpeg',
    'svg',
    'gif',
    'pixel-bomb',
    'wrong-field',
    'two-files',
    'too-big',
  )
  .map((variant): Change => ({
    kind: `file: ${variant}`,
    label: `file: ${variant}`,
    edit: { at: 'file', variant },
    expect: variant === 'too-big' ? [413] : [400, 415],
  }));

function noiseChanges(slots: Slot[]): fc.Arbitrary<Change>[] {
  return slots
    .filter(
      (s) => typeof s.value === 'string' && !s.schema.format && !s.schema.enum && !s.schema.$ref,
    )
    .map((s) => body('odd but valid text', s.path, fc.constantFrom(...storableOddities), []));
}

/** Every hostile case the route's schema and example allow. */
export function hostileCases(shape: RouteShape): fc.Arbitrary<HostileCase> {
  const slots = shape.bodySchema ? slotsOf(shape.doc, shape.bodySchema, shape.exampleBody) : [];
  const breaking: fc.Arbitrary<Change>[] = [
    ...slots.flatMap((s) => slotChanges(shape, s)),
    ...(shape.bodySchema ? unknownFieldChanges(shape, slots) : []),
    ...wholeBodyChanges(shape),
    ...paramChanges(shape),
    ...(shape.authenticated ? [authChanges] : []),
  ];
  // The file is an upload's or an import's biggest attack surface: about a quarter of an
  // upload's cases break the file, and about half of an import's break its CSV body.
  const csv = shape.bodyKind === 'csv' ? csvChanges(String(shape.exampleBody)) : [];
  const weighted = [
    ...breaking.map((arbitrary) => ({ arbitrary, weight: 3 })),
    ...(shape.bodyKind === 'multipart'
      ? [{ arbitrary: fileChanges, weight: breaking.length }]
      : []),
    ...csv.map((arbitrary) => ({
      arbitrary,
      weight: Math.ceil((3 * breaking.length) / csv.length),
    })),
  ];
  const noise = noiseChanges(slots);
  return fc.record({
    breaking: fc.array(fc.oneof(...weighted), { minLength: 1, maxLength: 2 }),
    noise: noise.length ? fc.array(fc.oneof(...noise), { maxLength: 2 }) : fc.constant([]),
  });
}
