import type { z } from 'zod';
import { errorBodySchema } from '../shared/schemas/error';
import type { ApiDocs } from './openapi';

type PathDoc = {
  method: 'get' | 'post' | 'put' | 'patch' | 'delete';
  path: string;
  summary: string;
  /** Who may call it, in words: shown in the description. */
  access: string;
  body?: z.ZodType;
  /** A multipart/form-data body instead of JSON (uploads). */
  multipart?: z.ZodObject;
  /** A text/csv body (imports): the file itself. */
  csv?: z.ZodType;
  params?: z.ZodObject;
  query?: z.ZodObject;
  ok: { status: number; schema?: z.ZodType; description: string };
  errors?: number[];
};

const errorDescriptions: Record<number, string> = {
  400: 'Invalid input (field details in `error.fields`) or an unusable link',
  401: 'Not signed in, or the sign-in expired (`token_expired`)',
  403: 'Signed in, but the role does not allow it, or the CSRF token is missing',
  404: 'No such record in a lab you belong to',
  409: 'Conflicts with the current state (e.g. the last manager)',
  413: 'The request body is too large',
  415: 'The body is not of a type this route reads',
  429: 'Too many tries; see Retry-After',
};

/** Registers one route with its shared schemas and the common error body. */
export function documentPath(docs: ApiDocs, d: PathDoc): void {
  const errors = Object.fromEntries(
    (d.errors ?? []).map((status) => [
      status,
      {
        description: errorDescriptions[status] ?? 'Error',
        content: { 'application/json': { schema: errorBodySchema } },
      },
    ]),
  );
  docs.registerPath({
    method: d.method,
    path: d.path,
    summary: d.summary,
    description: `Access: ${d.access}.`,
    request: {
      ...(d.params ? { params: d.params } : {}),
      ...(d.query ? { query: d.query } : {}),
      ...(d.body ? { body: { content: { 'application/json': { schema: d.body } } } } : {}),
      ...(d.multipart
        ? { body: { content: { 'multipart/form-data': { schema: d.multipart } } } }
        : {}),
      ...(d.csv ? { body: { content: { 'text/csv': { schema: d.csv } } } } : {}),
    },
    responses: {
      [d.ok.status]: {
        description: d.ok.description,
        ...(d.ok.schema ? { content: { 'application/json': { schema: d.ok.schema } } } : {}),
      },
      ...errors,
    },
  });
}
