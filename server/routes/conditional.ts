import type { Response } from 'express';
import type { JsonBody } from '../json-body';

/**
 * Sends JSON that a browser may keep but must revalidate before each use ("private, no-cache",
 * RFC 9111, 5.2.2.4 and 5.2.2.7) with its strong ETag; Express's res.send answers 304 with no body
 * when the request's If-None-Match names that tag (RFC 9110, 13.1.2).
 */
export function sendRevalidated(res: Response, body: JsonBody): void {
  res.set('Cache-Control', 'private, no-cache').set('ETag', body.etag).type('application/json').send(body.bytes);
}
