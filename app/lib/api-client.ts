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
  /** keepalive: the request outlives the page (a save sent as the page is hidden or reloaded; bodies under 64 KiB, Fetch standard). */
  opts: { body?: unknown; schema?: S; form?: FormData; onUploadProgress?: (fraction: number) => void; keepalive?: boolean } = {},
): Promise<S extends z.ZodType ? z.output<S> : unknown> {
  const headers: Record<string, string> = { Accept: 'application/json' };
  if (method !== 'GET') headers['X-CSRF-Token'] = await getCsrfToken();
  let body: BodyInit | undefined;
  if (opts.form) body = opts.form;
  else if (opts.body !== undefined) {
    headers['Content-Type'] = 'application/json';
    body = JSON.stringify(opts.body);
  }
  const res = await fetch(url, { method, headers, body, credentials: 'same-origin', ...(opts.keepalive ? { keepalive: true } : {}) });
  return readAnswer(res.status, await res.text(), opts.schema);
}

/**
 * Downloads a file the server writes, showing its refusal instead of saving it: a plain link would
 * save the JSON error body as the file. The name comes from the answer's Content-Disposition.
 */
export async function downloadFile(url: string, fallbackName: string): Promise<void> {
  const res = await fetch(url, { credentials: 'same-origin' });
  if (!res.ok) readAnswer(res.status, await res.text(), undefined);
  const blob = await res.blob();
  const name = /filename="?([^";]+)"?/.exec(res.headers.get('Content-Disposition') ?? '')?.[1] ?? fallbackName;
  const href = URL.createObjectURL(blob);
  const a = document.createElement('a');
  a.href = href;
  a.download = name;
  document.body.append(a);
  a.click();
  a.remove();
  setTimeout(() => URL.revokeObjectURL(href), 10_000);
}

/** The answer's body as JSON parsed by the schema, or the error body as an ApiError. */
function readAnswer<S extends z.ZodType | undefined>(status: number, text: string, schema: S | undefined): S extends z.ZodType ? z.output<S> : unknown {
  const json = text ? safeJson(text) : null;
  if (status < 200 || status >= 300) {
    const err = (json as { error?: { code?: string; message?: string; details?: { issues?: { path: string; message: string }[] } } } | null)?.error;
    if (status === 403 && err?.code === 'csrf-invalid') csrfToken = null;
    throw new ApiError(status, err?.code ?? 'http-error', err?.message ?? `The server answered ${status}.`, err?.details?.issues ?? [], err?.details ?? null);
  }
  if (schema) return schema.parse(json) as never;
  return json as never;
}

/**
 * The one way to upload a file with a progress bar: fetch reports no upload progress, so this
 * POSTs the form with XMLHttpRequest, with the same CSRF token and the same error handling as
 * apiRequest. `onProgress` gets the fraction sent, 0 to 1 (not called when the size is unknown).
 */
export async function uploadWithProgress<S extends z.ZodType | undefined = undefined>(
  url: string,
  form: FormData,
  onProgress: (fraction: number) => void,
  opts: { schema?: S; signal?: AbortSignal } = {},
): Promise<S extends z.ZodType ? z.output<S> : unknown> {
  const token = await getCsrfToken();
  const { status, text } = await new Promise<{ status: number; text: string }>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => resolve({ status: xhr.status, text: xhr.responseText });
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The upload did not reach the server: check the connection and send the file again.'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped before it finished.'));
    opts.signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    xhr.send(form);
  });
  return readAnswer(status, text, opts.schema);
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
