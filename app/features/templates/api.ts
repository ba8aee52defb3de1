import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { TemplateListSchema, TemplateSummarySchema, TemplateVersionSchema, type CreateTemplateInput, type SaveVersionInput } from '../../../shared/schemas/template-api';
import { api, apiRequest } from '../../lib/api-client';

export const templateKeys = {
  all: ['templates'] as const,
  list: () => [...templateKeys.all, 'list'] as const,
  detail: (id: number) => [...templateKeys.all, id] as const,
  version: (id: number, n: number) => [...templateKeys.detail(id), 'versions', n] as const,
};

export const templatesQuery = () => queryOptions({ queryKey: templateKeys.list(), queryFn: () => api.get('/api/templates', TemplateListSchema) });
export const templateQuery = (id: number) => queryOptions({ queryKey: templateKeys.detail(id), queryFn: () => api.get(`/api/templates/${id}`, TemplateSummarySchema) });
export const versionQuery = (id: number, n: number) => queryOptions({ queryKey: templateKeys.version(id, n), queryFn: () => api.get(`/api/templates/${id}/versions/${n}`, TemplateVersionSchema) });

export const useTemplates = () => useQuery(templatesQuery());
export const useTemplate = (id: number) => useQuery(templateQuery(id));
export const useVersion = (id: number, n: number) => useQuery(versionQuery(id, n));

export function useCreateTemplate() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: CreateTemplateInput) => api.post('/api/templates', input, TemplateSummarySchema), onSuccess: () => qc.invalidateQueries({ queryKey: templateKeys.all }) });
}

export function useImportTemplate() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (file: unknown) => api.post('/api/templates/import', file, z.object({ id: z.number(), version: z.number() })),
    onSuccess: () => qc.invalidateQueries({ queryKey: templateKeys.all }),
  });
}

export function useSaveVersion(id: number, n: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: SaveVersionInput) => apiRequest('PUT', `/api/templates/${id}/versions/${n}`, { body, schema: TemplateVersionSchema }),
    onSuccess: (v) => {
      qc.setQueryData(templateKeys.version(id, n), v);
      void qc.invalidateQueries({ queryKey: templateKeys.list() });
      void qc.invalidateQueries({ queryKey: templateKeys.detail(id), exact: true });
    },
  });
}

export function useReleaseVersion(id: number, n: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (waiver?: string) => apiRequest('POST', `/api/templates/${id}/versions/${n}/release`, { body: waiver ? { waiver } : {}, schema: TemplateVersionSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: templateKeys.detail(id) }),
  });
}

export function useNewDraft(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (from: number) => apiRequest('POST', `/api/templates/${id}/versions`, { body: { from }, schema: TemplateVersionSchema }),
    onSuccess: () => qc.invalidateQueries({ queryKey: templateKeys.detail(id) }),
  });
}

export const versionFileUrl = (id: number, n: number, file: string) => `/api/templates/${id}/versions/${n}/${file}`;
