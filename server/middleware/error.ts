import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody } from '../../shared/schemas/error';
import { AppError } from '../errors';
import { requestIdOf } from './request-id';

/** What the log gets beside an unexpected error: enough to find the request, nothing more. */
export type ErrorContext = { requestId: string | undefined; method: string; path: string };

type BodyParserError = Error & { type?: string; status?: number; expose?: boolean };

function toAppError(err: unknown): AppError | undefined {
  if (err instanceof AppError) return err;
  if (err instanceof ZodError) {
    const fields = err.issues.map((i) => ({ path: i.path.join('.'), message: i.message }));
    return new AppError(400, 'invalid_request', 'Some fields are not valid.', fields);
  }
  const type = (err as BodyParserError | undefined)?.type;
  if (type === 'entity.parse.failed') {
    return new AppError(400, 'malformed_json', 'The request body is not valid JSON.');
  }
  if (type === 'entity.too.large') {
    return new AppError(413, 'payload_too_large', 'The request body is too large.');
  }
  // Other client errors raised by Express itself (a malformed %-escape in a path, a bad range
  // for a static file): the status holds, the wording is ours.
  const { status, expose } = (err ?? {}) as BodyParserError;
  const fromExpress = expose === true || err instanceof URIError;
  if (fromExpress && typeof status === 'number' && status >= 400 && status < 500) {
    return status === 404
      ? AppError.notFound()
      : new AppError(status, 'invalid_request', 'The request is not valid.');
  }
  return undefined;
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
    const known = toAppError(err);
    if (!known) log(err, { requestId, method: req.method, path: req.path });
    if (res.headersSent) {
      // Part of the answer is already out (a stream failed midway): all we can do is cut it.
      res.destroy();
      return;
    }
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
