import { once } from 'node:events';
import type { Response } from 'express';

/**
 * Writes a long answer piece by piece, yielding to the event loop between pieces (and waiting
 * for the socket to drain when it is full), so one large file does not hold up other requests.
 * Stops quietly when the client goes away.
 */
export async function sendChunks(res: Response, chunks: Iterable<string>): Promise<void> {
  for (const chunk of chunks) {
    if (res.destroyed) return;
    if (!res.write(chunk)) await Promise.race([once(res, 'drain'), once(res, 'close')]);
    else await new Promise<void>((resolve) => setImmediate(resolve));
  }
  res.end();
}
