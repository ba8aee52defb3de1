import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import {
  ComponentListSchema, ComponentSchema, PlateListSchema, PlateSchema,
  type ComponentInput, type PlateInput,
} from '../../../shared/schemas/catalog';
import { api } from '../../lib/api-client';

export const catalogKeys = {
  all: ['catalog'] as const,
  plates: () => [...catalogKeys.all, 'plates'] as const,
  plate: (id: number) => [...catalogKeys.plates(), id] as const,
  components: () => [...catalogKeys.all, 'components'] as const,
  component: (id: number) => [...catalogKeys.components(), id] as const,
};

export const platesQuery = () => queryOptions({ queryKey: catalogKeys.plates(), queryFn: () => api.get('/api/plates', PlateListSchema) });
export const plateQuery = (id: number) => queryOptions({ queryKey: catalogKeys.plate(id), queryFn: () => api.get(`/api/plates/${id}`, PlateSchema) });
export const componentsQuery = () => queryOptions({ queryKey: catalogKeys.components(), queryFn: () => api.get('/api/components', ComponentListSchema) });
/** The DXF file a component's outline was read from, as it was uploaded (a download). */
export const componentOutlineFileUrl = (id: number) => `/api/components/${id}/outline-file.dxf`;
export const componentQuery = (id: number) => queryOptions({ queryKey: catalogKeys.component(id), queryFn: () => api.get(`/api/components/${id}`, ComponentSchema) });

export const usePlates = () => useQuery(platesQuery());
export const usePlate = (id: number | null) => useQuery({ ...plateQuery(id ?? 0), enabled: id !== null });
export const useComponents = () => useQuery(componentsQuery());
export const useComponent = (id: number | null) => useQuery({ ...componentQuery(id ?? 0), enabled: id !== null });

export function useSavePlate(id: number | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: PlateInput) => (id === null ? api.post('/api/plates', input, PlateSchema) : api.put(`/api/plates/${id}`, input, PlateSchema)),
    onSuccess: () => qc.invalidateQueries({ queryKey: catalogKeys.plates() }),
  });
}
export function useDeletePlate() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: number) => api.delete(`/api/plates/${id}`), onSuccess: () => qc.invalidateQueries({ queryKey: catalogKeys.plates() }) });
}
export function useSaveComponent(id: number | null) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: ComponentInput) => (id === null ? api.post('/api/components', input, ComponentSchema) : api.put(`/api/components/${id}`, input, ComponentSchema)),
    onSuccess: () => qc.invalidateQueries({ queryKey: catalogKeys.components() }),
  });
}
export function useDeleteComponent() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (id: number) => api.delete(`/api/components/${id}`), onSuccess: () => qc.invalidateQueries({ queryKey: catalogKeys.components() }) });
}
