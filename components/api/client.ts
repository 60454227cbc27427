import type { z } from 'zod';
import { errorBodySchema, type FieldError } from '../../shared/schemas/error';
import { apiBaseUrl } from '../config';

/** Client-side codes added to the server's own (shared/schemas/error.ts). */
export type ClientErrorCode = 'network' | 'unexpected_response';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldError[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type RequestOptions = {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
  /** Non-2xx statuses whose body is still a valid answer (e.g. 503 from health). */
  acceptStatuses?: number[];
  baseUrl?: string;
};

async function readJson(res: Response): Promise<unknown> {
  const text = await res.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

/** The one way the client talks to the API: JSON in, schema-checked JSON out, ApiError on failure. */
export async function apiRequest<S extends z.ZodType>(
  path: string,
  schema: S,
  { method = 'GET', body, signal, acceptStatuses = [], baseUrl = apiBaseUrl }: RequestOptions = {},
): Promise<z.infer<S>> {
  let res: Response;
  try {
    res = await fetch(`${baseUrl}${path}`, {
      method,
      signal,
      credentials: 'include',
      headers:
        body === undefined
          ? { Accept: 'application/json' }
          : { Accept: 'application/json', 'Content-Type': 'application/json' },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw new ApiError(
      0,
      'network',
      'Cannot reach the Quenchbook server. Check the connection and try again.',
    );
  }
  const json = await readJson(res);
  if (res.ok || acceptStatuses.includes(res.status)) {
    const parsed = schema.safeParse(json);
    if (parsed.success) return parsed.data;
    throw new ApiError(
      res.status,
      'unexpected_response',
      'The server sent an answer this app does not understand.',
    );
  }
  const error = errorBodySchema.safeParse(json);
  if (error.success) {
    const { code, message, fields } = error.data.error;
    throw new ApiError(res.status, code, message, fields);
  }
  throw new ApiError(
    res.status,
    'unexpected_response',
    `The server answered with status ${res.status}.`,
  );
}
