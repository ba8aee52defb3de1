import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ComponentSchema } from '../../../shared/schemas/catalog';
import type { InspectedOutlineInput } from '../../../shared/schemas/dxf-inspection';
import { api } from '../../lib/api-client';
import { catalogKeys } from './api';

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
