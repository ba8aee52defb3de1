import { z } from 'zod';
import { useMutation } from '@tanstack/react-query';
import { StockCheckRequestSchema, StockCheckResponseSchema, type StockCheckRequestInput } from '../../../shared/schemas/stock-check';
import { BarsDraftInputSchema, BarsDraftSchema, type BarsDraftInput } from '../../../shared/schemas/bars-draft';
import { api, apiRequest, uploadWithProgress } from '../../lib/api-client';

export const stockCheckKeys = {
  all: ['stock-check'] as const,
  run: () => [...stockCheckKeys.all, 'run'] as const,
};

/**
 * The request goes through the shared schema before it leaves (the same one the route uses), and
 * the answer is parsed on the way back. A stock check writes nothing and caches nothing, so it is a
 * mutation; it is never retried — a 4xx repeats itself, and the operator presses the button again.
 */
export function postStockCheck(input: StockCheckRequestInput) {
  return api.post('/api/stock-check', StockCheckRequestSchema.parse(input), StockCheckResponseSchema);
}

export function useStockCheck() {
  return useMutation({ mutationKey: stockCheckKeys.run(), mutationFn: postStockCheck, retry: false });
}

/** A CSV or XLSX file of measured bars, turned by the server into tab-separated text for the paste reader. */
export function readBarsFile(file: File) {
  const form = new FormData();
  form.append('file', file);
  return uploadWithProgress('/api/stock-check/bars-file', form, () => {}, { schema: z.object({ text: z.string(), sheet: z.string().nullable() }) });
}

/** Largest body sent with keepalive (the Fetch standard caps keepalive bodies at 64 KiB in flight). */
const KEEPALIVE_MAX_BYTES = 60_000;

/**
 * Keeps the bar table of a job on the server (PUT /api/jobs/:id/bars-draft) at the revision last
 * read; 409 when another screen saved since. `leaving`: sent as the page is hidden or reloaded.
 */
export function putBarsDraft(jobId: number, input: BarsDraftInput, leaving = false) {
  const body = BarsDraftInputSchema.parse(input);
  const keepalive = leaving && JSON.stringify(body).length < KEEPALIVE_MAX_BYTES;
  return apiRequest('PUT', `/api/jobs/${jobId}/bars-draft`, { body, schema: BarsDraftSchema, keepalive });
}
