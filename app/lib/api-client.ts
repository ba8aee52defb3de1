import type { z } from 'zod';

/** The one error the client sees from the API: the server's error body, typed. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: { path: string; message: string }[] = [],
    readonly details: unknown = null,
  ) {
    super(message);
  }
}

let csrfToken: string | null = null;

async function getCsrfToken(): Promise<string> {
  if (csrfToken) return csrfToken;
  const res = await fetch('/api/auth/csrf', { credentials: 'same-origin' });
  csrfToken = ((await res.json()) as { token: string }).token;
  return csrfToken;
}

/** Sign-in and sign-out hand out a new token with the new session. */
export function setCsrfToken(token: string | null) {
  csrfToken = token;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

export async function apiRequest<S extends z.ZodType | undefined = undefined>(
  method: Method,
  url: string,
  opts: { body?: unknown; schema?: S; form?: FormData; onUploadProgress?: (fraction: number) => void } = {},
): Promise<S extends z.ZodType ? z.output<S> : unknown> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers['X-CSRF-Token'] = await getCsrfToken();
  let body: BodyInit | undefined;
  if (opts.form) body = opts.form;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  const res = await fetch(url, { method, headers, body, credentials: 'same-origin' });
  const text = await res.text();
  const json = text ? safeJson(text) : null;
  if (!res.ok) {
    const err = (json as { error?: { code?: string; message?: string; details?: { issues?: { path: string; message: string }[] } } } | null)?.error;
    if (res.status === 403 && err?.code === 'csrf-invalid') csrfToken = null;
    throw new ApiError(res.status, err?.code ?? 'http-error', err?.message ?? `The server answered ${res.status}.`, err?.details?.issues ?? [], err?.details ?? null);
  }
  if (opts.schema) return opts.schema.parse(json) as never;
  return json as never;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return { error: { code: 'bad-response', message: 'The server sent an answer that is not JSON.' } };
  }
}

export const api = {
  get: <S extends z.ZodType>(url: string, schema: S) => apiRequest('GET', url, { schema }),
  post: <S extends z.ZodType>(url: string, body: unknown, schema: S) => apiRequest('POST', url, { body, schema }),
  put: <S extends z.ZodType>(url: string, body: unknown, schema: S) => apiRequest('PUT', url, { body, schema }),
  patch: <S extends z.ZodType>(url: string, body: unknown, schema: S) => apiRequest('PATCH', url, { body, schema }),
  delete: (url: string) => apiRequest('DELETE', url),
};
