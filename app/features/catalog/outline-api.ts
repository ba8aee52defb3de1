import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Point, Unit } from '../../../shared/schemas/common';
import { ComponentSchema } from '../../../shared/schemas/catalog';
import { uploadWithProgress } from '../../lib/api-client';
import { catalogKeys } from './api';
import { DxfInspectionSchema } from '../../../shared/schemas/dxf-inspection';

const noProgress = () => {};

/** Reads a DXF on the server without storing anything: layers, circles, outline, what was not read. */
export function inspectDxf(file: File, onProgress?: (fraction: number) => void) {
  const form = new FormData();
  form.append('file', file);
  return uploadWithProgress('/api/dxf/inspect', form, onProgress ?? noProgress, { schema: DxfInspectionSchema });
}

export interface OutlineUpload {
  file: File;
  /** Only when the file does not say its unit. */
  unit: Unit | null;
  /** The drawing point (file coordinates and unit) that becomes the local origin: the primary dowel. */
  datum: Point | null;
  /** File layer → conforming name, for the layers that change. */
  layerMap: Record<string, string>;
}

export function postComponentOutline(id: number, u: OutlineUpload, onProgress?: (fraction: number) => void) {
  const form = new FormData();
  form.append('file', u.file);
  if (u.unit) form.append('unit', u.unit);
  if (u.datum) {
    // String(number) is the shortest form that reads back to the same double, so the datum arrives exact.
    form.append('datumX', String(u.datum.x));
    form.append('datumY', String(u.datum.y));
  }
  if (Object.keys(u.layerMap).length) form.append('layerMap', JSON.stringify(u.layerMap));
  return uploadWithProgress(`/api/components/${id}/outline`, form, onProgress ?? noProgress, { schema: ComponentSchema });
}

export const useInspectDxf = () =>
  useMutation({ mutationFn: ({ file, onProgress }: { file: File; onProgress?: (f: number) => void }) => inspectDxf(file, onProgress) });

export function useSetComponentOutline(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ upload, onProgress }: { upload: OutlineUpload; onProgress?: (f: number) => void }) => postComponentOutline(id, upload, onProgress),
    onSuccess: (component) => {
      qc.setQueryData(catalogKeys.component(id), component);
      return qc.invalidateQueries({ queryKey: catalogKeys.components() });
    },
  });
}
