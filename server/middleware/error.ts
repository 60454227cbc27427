import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import type { ErrorBody } from '../../shared/schemas/error';
import { AppError } from '../errors';

type BodyParserError = Error & { type?: string; status?: number };

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
  return undefined;
}

export function errorHandler(log: (err: unknown) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    const known = toAppError(err);
    if (!known) log(err);
    const appError =
      known ?? new AppError(500, 'internal', 'Something went wrong on our side. Please try again.');
    const body: ErrorBody = {
      error: {
        code: appError.code,
        message: appError.message,
        ...(appError.fields ? { fields: appError.fields } : {}),
      },
    };
    res.status(appError.status).json(body);
  };
}

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(AppError.notFound(`No API route for ${req.method} ${req.baseUrl}${req.path}.`));
};
