import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody } from '../../shared/schemas/error';
import { isDatabaseUnavailable } from '../db';
import { AppError } from '../errors';
import { requestIdOf } from './request-id';

/** What the log gets beside an unexpected error: enough to find the request, nothing more. */
export type ErrorContext = { requestId: string | undefined; method: string; path: string };
type HttpError = Error & { type?: string; status?: number; expose?: boolean };

/** Errors of reading the request itself (body-parser, the router): the client's fault. */
function requestError(err: HttpError): AppError | undefined {
  const status = err.status ?? 0;
  if (status < 400 || status > 499) return undefined;
  if (err.type === 'entity.parse.failed') {
    return new AppError(400, 'malformed_json', 'The request body is not valid JSON.', [
      { path: '', message: 'Not valid JSON' },
    ]);
  }
  if (err.type === 'entity.too.large') {
    return new AppError(413, 'payload_too_large', 'The request body is too large.');
  }
  if (status === 415) {
    // An unsupported charset or content encoding.
    return new AppError(415, 'unsupported_media_type', 'Send the request body as UTF-8 JSON.');
  }
  if (err instanceof URIError) {
    // The router could not percent-decode a path segment.
    return new AppError(400, 'invalid_request', 'The address is not valid.', [
      { path: 'path', message: 'Contains a broken %-escape' },
    ]);
  }
  if (status === 404) return AppError.notFound();
  if (err.type || err.expose) {
    // e.g. a body that claims gzip but is not, or a request cut short.
    return new AppError(400, 'invalid_request', 'The request body could not be read.', [
      { path: '', message: 'Could not be read' },
    ]);
  }
  return undefined;
}

function toAppError(err: unknown): AppError | undefined {
  if (err instanceof AppError) return err;
  if (err instanceof ZodError) {
    const fields = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    return new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
  }
  if (err instanceof Error) return requestError(err as HttpError);
  return undefined;
}

/** Seconds a client should wait before retrying while the database is unreachable. */
export const UNAVAILABLE_RETRY_AFTER_S = 2;

function unavailable(): AppError {
  return new AppError(
    503,
    'unavailable',
    'The database is not answering right now. Please try again in a moment.',
  );
}

/**
 * The one error handler. The body carries our stable code, our own message and the request id,
 * never the error's message, stack, SQL or file paths: those go to the log only.
 */
export function errorHandler(
  log: (err: unknown, context: ErrorContext) => void,
): ErrorRequestHandler {
  return (err, req, res, _next) => {
    const requestId = requestIdOf(res);
    const context = { requestId, method: req.method, path: req.path };
    const down = isDatabaseUnavailable(err);
    const known = down ? unavailable() : toAppError(err);
    if (!known) log(err, context);
    // A retryable outage, not a bug: a short line instead of a stack for each request.
    if (down) log(`database unavailable: ${(err as Error).message}`, context);
    if (res.headersSent) {
      // Part of the answer is already out (a stream failed midway): all we can do is cut it.
      res.destroy();
      return;
    }
    if (down) res.setHeader('Retry-After', String(UNAVAILABLE_RETRY_AFTER_S));
    const appError =
      known ?? new AppError(500, 'internal', 'Something went wrong on our side. Please try again.');
    const body: ErrorBody = {
      error: {
        code: appError.code,
        message: appError.message,
        ...(appError.fields ? { fields: appError.fields } : {}),
        ...(requestId ? { requestId } : {}),
      },
    };
    res.status(appError.status).json(body);
  };
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(AppError.notFound(`No API route for ${req.method} ${req.baseUrl}${req.path}.`));
};
