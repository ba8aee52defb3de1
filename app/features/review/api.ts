import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { VersionDiffAnswerSchema } from '../../../shared/schemas/diff';
import { homeKeys } from '../home/api';
import { TemplateVersionSchema } from '../../../shared/schemas/template-api';
import { AuditListSchema } from '../../../shared/schemas/audit';
import { api, apiRequest } from '../../lib/api-client';

export const reviewKeys = {
  all: ['review'] as const,
  diff: (id: number, from: number, to: number) => [...reviewKeys.all, 'diff', id, from, to] as const,
  trail: (id: number, n: number) => [...reviewKeys.all, 'trail', id, n] as const,
  audit: (query: string) => [...reviewKeys.all, 'audit', query] as const,
};

const TrailSchema = z.object({ items: z.array(z.object({ action: z.string(), comment: z.string(), at: z.string(), by: z.string().nullable(), byEmail: z.string().nullable() })), total: z.number() });

export const diffQuery = (id: number, from: number, to: number) =>
  queryOptions({ queryKey: reviewKeys.diff(id, from, to), queryFn: () => api.get(`/api/templates/${id}/diff?from=${from}&to=${to}`, VersionDiffAnswerSchema) });
export const useDiff = (id: number, from: number | null, to: number | null) =>
  useQuery({ ...diffQuery(id, from ?? 0, to ?? 0), enabled: from !== null && to !== null && from !== to });
export const useTrail = (id: number, n: number) => useQuery({ queryKey: reviewKeys.trail(id, n), queryFn: () => api.get(`/api/templates/${id}/versions/${n}/reviews`, TrailSchema) });
export const useAudit = (query: string) => useQuery({ queryKey: reviewKeys.audit(query), queryFn: () => api.get(`/api/audit?${query}`, AuditListSchema) });

export type ReviewStep = 'submit' | 'approve' | 'request-changes' | 'retire';

/** Each step answers the version; the caller refreshes the template (its version list shows the new state). */
export function useReviewStep(id: number, n: number, onDone: () => void) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ step, comment }: { step: ReviewStep; comment?: string }) =>
      apiRequest('POST', `/api/templates/${id}/versions/${n}/${step}`, { body: comment !== undefined ? { comment } : {}, schema: TemplateVersionSchema }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: reviewKeys.trail(id, n) });
      void qc.invalidateQueries({ queryKey: homeKeys.all });
      onDone();
    },
  });
}
