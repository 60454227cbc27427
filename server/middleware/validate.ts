import type { Request, RequestHandler } from 'express';
import type { z } from 'zod';
import type { FieldError } from '../../shared/schemas/error';
import { AppError } from '../errors';

type Schemas = {
  /** A JSON body. */
  body?: z.ZodType;
  /** The text fields of a multipart body; use after the upload middleware has read them. */
  form?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
};

const isObject = (v: unknown): v is Record<string, unknown> =>
  typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * Fields of the input that the parsed output dropped: zod strips keys a schema does not name,
 * which would let a misspelt or smuggled field pass unnoticed.
 */
function unknownFields(
  input: unknown,
  output: unknown,
  path: (string | number)[] = [],
): FieldError[] {
  if (Array.isArray(input) && Array.isArray(output)) {
    return input.flatMap((item, i) => unknownFields(item, output[i], [...path, i]));
  }
  if (!isObject(input) || !isObject(output)) return [];
  return Object.keys(input).flatMap((key) =>
    Object.hasOwn(output, key)
      ? unknownFields(input[key], output[key], [...path, key])
      : [{ path: [...path, key].join('.'), message: 'Unknown field' }],
  );
}

// A NUL, or half of a surrogate pair: PostgreSQL text cannot hold the first (it would be stored
// as the two characters "\0"), and UTF-8 cannot encode the second (stored as U+FFFD): neither
// would be saved as sent.
// eslint-disable-next-line no-control-regex -- finding the NUL is the point
const UNSTORABLE = /\u0000|[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

function unstorableText(value: unknown, path: (string | number)[] = []): FieldError[] {
  const here = path.join('.');
  if (typeof value === 'string') {
    return UNSTORABLE.test(value)
      ? [
          {
            path: here,
            message: 'Contains a character that cannot be saved (a NUL or a broken symbol)',
          },
        ]
      : [];
  }
  if (Array.isArray(value)) return value.flatMap((item, i) => unstorableText(item, [...path, i]));
  if (!isObject(value)) return [];
  return Object.entries(value).flatMap(([key, item]) => [
    ...(UNSTORABLE.test(key) ? [{ path: [...path, key].join('.'), message: 'Unknown field' }] : []),
    ...unstorableText(item, [...path, key]),
  ]);
}

function invalid(fields: FieldError[]): AppError {
  return new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
}

/**
 * Parses input with a shared schema, and also refuses what the schema would let through
 * unnoticed: unknown fields (when `strict`) and text the database cannot store as sent.
 */
export function parseInput<S extends z.ZodType>(
  schema: S,
  input: unknown,
  { strict }: { strict: boolean },
): z.output<S> {
  const unstorable = unstorableText(input);
  const result = schema.safeParse(input);
  if (!result.success) {
    const fields = result.error.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    throw invalid([...fields, ...unstorable]);
  }
  const extra = strict ? unknownFields(input, result.data) : [];
  if (extra.length || unstorable.length) throw invalid([...extra, ...unstorable]);
  return result.data;
}

/** A typed body that is not JSON (e.g. multipart) would otherwise read as `{}`: an empty update. */
function assertJsonBody(req: Request): void {
  if (req.headers['content-type'] && req.is('application/json') === false) {
    throw new AppError(
      415,
      'unsupported_media_type',
      'Send the request body as JSON (Content-Type: application/json).',
    );
  }
}

/**
 * Parses the request with the shared schemas; a failure becomes a 400 with field details.
 * Express 5's req.query is read-only, so parsed parts go to res.locals.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, res, next) => {
    if (schemas.body) {
      assertJsonBody(req);
      res.locals.body = parseInput(schemas.body, req.body ?? {}, { strict: true });
    }
    if (schemas.form) res.locals.body = parseInput(schemas.form, req.body ?? {}, { strict: true });
    // Unknown query parameters are harmless (a cache-buster, a tracking tag) and stay allowed.
    if (schemas.query) res.locals.query = parseInput(schemas.query, req.query, { strict: false });
    if (schemas.params)
      res.locals.params = parseInput(schemas.params, req.params, { strict: false });
    next();
  };
}
