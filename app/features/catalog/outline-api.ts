import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ComponentSchema } from '../../../shared/schemas/catalog';
import type { InspectedOutlineInput } from '../../../shared/schemas/dxf-inspection';
import { DxfInspectionSchema } from '../../../shared/schemas/dxf-inspection';
import { api, uploadWithProgress } from '../../lib/api-client';
import { catalogKeys } from './api';

const noProgress = () => {};

/**
 * Sends a DXF to be read: layers, circles, outline, what was not read, and its SHA-256. Nothing is
 * stored in the catalog; the server keeps the file an hour so the outline can be stored from it by name.
 */
export function inspectDxf(file: File, onProgress?: (fraction: number) => void) {
  const form = new FormData();
  form.append('file', file);
  return uploadWithProgress('/api/dxf/inspect', form, onProgress ?? noProgress, { schema: DxfInspectionSchema });
}

export const useInspectDxf = () =>
  useMutation({ mutationFn: ({ file, onProgress }: { file: File; onProgress?: (f: number) => void }) => inspectDxf(file, onProgress) });

/** Stores the outline of the file inspected a moment ago, named by its SHA-256 (the file is not sent again). */
export function useStoreInspectedOutline(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InspectedOutlineInput) => api.post(`/api/components/${id}/outline/from-inspection`, input, ComponentSchema),
    onSuccess: (component) => {
      qc.setQueryData(catalogKeys.component(id), component);
      return qc.invalidateQueries({ queryKey: catalogKeys.components() });
    },
  });
}
