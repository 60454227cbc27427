import type { z } from 'zod';
import type { FieldError } from '../../shared/schemas/error';
import { apiBaseUrl } from '../config';
import { loadSchemaKit, type SchemaKit, type SchemaPick } from '../schemas';

/** Client-side codes added to the server's own (shared/schemas/error.ts). */
export type ClientErrorCode = 'network' | 'unexpected_response';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields: FieldError[] = [],
    /** The server's id for the request, for someone reporting a failure to quote. */
    readonly requestId?: string,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

/** A body sent as it is rather than as JSON, e.g. a CSV file. */
export type RawBody = { contentType: string; text: string };

type RequestOptions = {
  method?: Method;
  body?: unknown;
  rawBody?: RawBody;
  signal?: AbortSignal;
  /** Non-2xx statuses whose body is still a valid answer (e.g. 503 from health). */
  acceptStatuses?: number[];
  /**
   * An exact check for a common, trivial answer (a signed-out session's `{"me":null}`) that the
   * schema would accept unchanged: such an answer is returned without loading the schema kit.
   */
  plainAnswer?: (json: unknown) => boolean;
  baseUrl?: string;
};

// The session's CSRF token, from /api/me or a sign-in answer; sent with every write.
let csrfToken: string | undefined;
export function setCsrfToken(token: string | undefined): void {
  csrfToken = token;
}

async function readJson(res: Response): Promise<unknown> {
  const text = await res.text();
  if (!text) return undefined;
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return undefined;
  }
}

async function send(
  path: string,
  method: Method,
  body: unknown,
  signal: AbortSignal | undefined,
  baseUrl: string,
  rawBody?: RawBody,
) {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (rawBody) headers['Content-Type'] = rawBody.contentType;
  else if (body !== undefined) headers['Content-Type'] = 'application/json';
  if (method !== 'GET' && csrfToken) headers['X-CSRF-Token'] = csrfToken;
  try {
    return await fetch(`${baseUrl}${path}`, {
      method,
      signal,
      credentials: 'include',
      headers,
      body: rawBody ? rawBody.text : body === undefined ? undefined : JSON.stringify(body),
    });
  } catch (err) {
    if ((err as Error).name === 'AbortError') throw err;
    throw networkError();
  }
}

function networkError(): ApiError {
  return new ApiError(
    0,
    'network',
    'Cannot reach the Quenchbook server. Check the connection and try again.',
  );
}

/** The schemas that check answers; failing to fetch them is a connection failure like any other. */
export async function schemaKit(): Promise<SchemaKit> {
  try {
    return await loadSchemaKit();
  } catch {
    throw networkError();
  }
}

// One refresh at a time, shared by every request that found its sign-in expired.
let refreshing: Promise<boolean> | undefined;
function refreshSession(baseUrl: string): Promise<boolean> {
  refreshing ??= send('/api/auth/refresh', 'POST', {}, undefined, baseUrl)
    .then((res) => res.ok)
    .catch(() => false)
    .finally(() => {
      refreshing = undefined;
    });
  return refreshing;
}

/**
 * The one way the client talks to the API: JSON in, schema-checked JSON out, ApiError on failure.
 * `pick` names the answer's schema in the lazily loaded kit, e.g. `(k) => k.labSchema`.
 */
export async function apiRequest<S extends z.ZodType>(
  path: string,
  pick: SchemaPick<S>,
  {
    method = 'GET',
    body,
    rawBody,
    signal,
    acceptStatuses = [],
    plainAnswer,
    baseUrl = apiBaseUrl,
  }: RequestOptions = {},
): Promise<z.infer<S>> {
  let res = await send(path, method, body, signal, baseUrl, rawBody);
  // The short-lived access cookie may have lapsed: renew it from the refresh cookie once.
  if (res.status === 401 && !path.startsWith('/api/auth/') && (await refreshSession(baseUrl))) {
    res = await send(path, method, body, signal, baseUrl, rawBody);
  }
  const json = await readJson(res);
  const answered = res.ok || acceptStatuses.includes(res.status);
  if (answered && plainAnswer?.(json)) return json as z.infer<S>;
  const kit = await schemaKit();
  if (answered) {
    const parsed = pick(kit).safeParse(json);
    if (parsed.success) return parsed.data;
    throw new ApiError(
      res.status,
      'unexpected_response',
      'The server sent an answer this app does not understand.',
    );
  }
  const error = kit.errorBodySchema.safeParse(json);
  if (error.success) {
    const { code, message, fields, requestId } = error.data.error;
    throw new ApiError(res.status, code, message, fields, requestId);
  }
  throw new ApiError(
    res.status,
    'unexpected_response',
    `The server answered with status ${res.status}.`,
  );
}
