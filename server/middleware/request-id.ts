import { randomUUID } from 'node:crypto';
import type { RequestHandler, Response } from 'express';

export const REQUEST_ID_HEADER = 'X-Request-Id';

/**
 * Gives every request an id of our own, sent back in X-Request-Id and in error bodies, so a
 * person reporting a failure can quote it and we can find the logged details. A caller's id is
 * not taken over: it would let anyone write what they like into our logs.
 */
export const assignRequestId: RequestHandler = (_req, res, next) => {
  const id = randomUUID();
  res.locals.requestId = id;
  res.setHeader(REQUEST_ID_HEADER, id);
  next();
};

export function requestIdOf(res: Response): string | undefined {
  return res.locals.requestId as string | undefined;
}
