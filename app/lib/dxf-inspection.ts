import { useMutation } from '@tanstack/react-query';
import { DxfInspectionSchema } from '../../shared/schemas/dxf-inspection';
import { uploadWithProgress } from './api-client';

const noProgress = () => {};

/**
 * Sends a DXF to be read (POST /api/dxf/inspect): layers, circles, outline, what was not read, and its
 * SHA-256. Nothing is stored; the server keeps the file an hour so a component's or a job's outline can
 * then be stored from it by that hash, without sending the file again. One home for the catalog's and
 * the jobs' imports.
 */
export function inspectDxf(file: File, onProgress?: (fraction: number) => void) {
  const form = new FormData();
  form.append('file', file);
  return uploadWithProgress('/api/dxf/inspect', form, onProgress ?? noProgress, { schema: DxfInspectionSchema });
}

/** inspectDxf as a mutation: the file and, optionally, a callback for the fraction sent so far. */
export const useInspectDxf = () =>
  useMutation({ mutationFn: ({ file, onProgress }: { file: File; onProgress?: (f: number) => void }) => inspectDxf(file, onProgress), retry: false });
