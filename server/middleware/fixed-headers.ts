import type { RequestHandler } from 'express';

/**
 * A header middleware whose headers are the same on every response (helmet with fixed options: no
 * nonce, no function-valued directive) turned into one that sets them all in one call: it is run
 * once here against a recording response, and what it set is replayed with `setHeader` per header
 * thereafter, skipping its chain of small middlewares on every request. Throws if the middleware
 * does anything but set or remove headers and call next, so a middleware that is not fixed is never
 * replayed.
 */
export function fixedHeaders(middleware: RequestHandler): RequestHandler {
  const headers = new Map<string, string | number | readonly string[]>();
  let nextCalled = false;
  const recorder = {
    setHeader: (name: string, value: string | number | readonly string[]) => { headers.set(name, value); return recorder; },
    removeHeader: (name: string) => { headers.delete(name); },
  };
  const req = new Proxy({}, { get: (_t, key) => { throw new Error(`fixedHeaders: the middleware read req.${String(key)}, so its headers may depend on the request`); } });
  middleware(req as never, recorder as never, (err?: unknown) => {
    if (err) throw err;
    nextCalled = true;
  });
  if (!nextCalled) throw new Error('fixedHeaders: the middleware did not finish at once');
  const entries = [...headers];
  return (_req, res, next) => {
    for (const [name, value] of entries) res.setHeader(name, value);
    next();
  };
}
