import express, { type RequestHandler } from 'express';
import { AppError } from '../errors';

const WRITES = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

function unsupported(): AppError {
  return new AppError(
    415,
    'unsupported_media_type',
    'Send the request body as JSON (Content-Type: application/json).',
  );
}

// A body without a Content-Type is read, only to tell an empty one (a POST with no data, which
// some clients send chunked) from one that carries something.
const readUntyped = express.raw({ type: (req) => !req.headers['content-type'], limit: '1mb' });

/** Body types some route reads: JSON, multipart for uploads, CSV for imports. */
const READ_TYPES = ['application/json', 'multipart/form-data', 'text/csv'];

/**
 * A write's body is one of the types a route reads. Any other body would not be read at all,
 * so a form post or a text body would arrive as "no fields": it is refused instead of ignored.
 * (A route that takes JSON refuses the other read types itself, in `validate`.)
 */
export function refuseOtherBodyTypes(): RequestHandler[] {
  return [
    (req, _res, next) => {
      if (WRITES.has(req.method) && req.is(READ_TYPES) === false) {
        if (req.headers['content-type']) return next(unsupported());
      }
      next();
    },
    readUntyped,
    (req, _res, next) => {
      if (Buffer.isBuffer(req.body)) {
        if (req.body.length > 0 && WRITES.has(req.method)) return next(unsupported());
        req.body = undefined;
      }
      next();
    },
  ];
}
