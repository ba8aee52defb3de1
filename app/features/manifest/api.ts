import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { uploadWithProgress } from '../../lib/api-client';

export const ManifestAnswerSchema = z.object({
  changes: z.array(z.object({ sheet: z.string(), row: z.number(), action: z.enum(['add', 'change', 'same']), code: z.string(), fields: z.array(z.string()) })),
  errors: z.array(z.object({ sheet: z.string().nullable(), row: z.number().nullable(), column: z.string().nullable(), message: z.string() })),
  counts: z.record(z.string(), z.number()).optional(),
});
export type ManifestAnswer = z.infer<typeof ManifestAnswerSchema>;

const send = (url: string, file: File, onProgress: (f: number) => void) => {
  const form = new FormData();
  form.append('file', file);
  return uploadWithProgress(url, form, onProgress, { schema: ManifestAnswerSchema });
};

export const usePreviewManifest = (onProgress: (f: number) => void) => useMutation({ mutationFn: (file: File) => send('/api/manifest/preview', file, onProgress) });

/** Commit changes the catalog: everything under the catalog key is stale afterwards. */
export function useCommitManifest(onProgress: (f: number) => void, invalidate: () => Promise<unknown>) {
  return useMutation({ mutationFn: (file: File) => send('/api/manifest/commit', file, onProgress), onSuccess: () => invalidate() });
}
