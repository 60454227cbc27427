import type { ErrorCode, FieldError } from '../shared/schemas/error';

/** The one error type services throw; the error middleware turns it into a JSON response. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: ErrorCode,
    message: string,
    readonly fields?: FieldError[],
  ) {
    super(message);
    this.name = 'AppError';
  }

  static notFound(message = 'Not found.'): AppError {
    return new AppError(404, 'not_found', message);
  }
}
