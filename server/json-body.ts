import { createHash } from 'node:crypto';

/** JSON text ready to send: its UTF-8 bytes and a strong entity tag (RFC 9110, 8.8.3), made once and sent many times. */
export interface JsonBody { bytes: Buffer; etag: string }

/** A strong entity tag for bytes: their SHA-1 in base64url, quoted. Equal tags mean equal bytes (RFC 9110, 8.8.1). */
export const strongEtag = (bytes: Buffer): string => `"${createHash('sha1').update(bytes).digest('base64url')}"`;

export function jsonBody(text: string): JsonBody {
  const bytes = Buffer.from(text, 'utf8');
  return { bytes, etag: strongEtag(bytes) };
}
