import { useMutation } from '@tanstack/react-query';
import { ManifestAnswerSchema } from '../../../shared/schemas/manifest';
import { uploadWithProgress } from '../../lib/api-client';

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
