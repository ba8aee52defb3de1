import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { z } from 'zod';
import { UnitSchema } from '../../../shared/schemas/common';
import { JobDetailSchema, JobListSchema, JobStockCheckInputSchema, RailCheckSchema, type JobInput } from '../../../shared/schemas/job';
import { StockCheckResponseSchema, type MeasuredBarInput } from '../../../shared/schemas/stock-check';
import { api, ApiError, uploadWithProgress } from '../../lib/api-client';
import { LoadListSchema, type LoadListInput, type LoadListTicksInput } from '../../../shared/schemas/load-list';
import type { InspectedPartOutlineInput } from '../../../shared/schemas/dxf-inspection';

export const jobKeys = {
  all: ['jobs'] as const,
  list: () => [...jobKeys.all, 'list'] as const,
  detail: (id: number) => [...jobKeys.all, id] as const,
  partProgram: (id: number) => [...jobKeys.all, id, 'part-program'] as const,
};

export const jobsQuery = () => queryOptions({ queryKey: jobKeys.list(), queryFn: () => api.get('/api/jobs', JobListSchema) });
export const jobQuery = (id: number) => queryOptions({ queryKey: jobKeys.detail(id), queryFn: () => api.get(`/api/jobs/${id}`, JobDetailSchema) });

export const useJobs = () => useQuery(jobsQuery());
export const useJob = (id: number) => useQuery(jobQuery(id));

export function useCreateJob() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobInput) => api.post('/api/jobs', input, JobDetailSchema),
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(job.id), job);
      void qc.invalidateQueries({ queryKey: jobKeys.list() });
    },
  });
}

export function useUpdateJob(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: JobInput) => api.put(`/api/jobs/${id}`, input, JobDetailSchema),
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(id), job);
      void qc.invalidateQueries({ queryKey: jobKeys.list() });
    },
  });
}

/** Stores the part outline of the drawing inspected a moment ago, named by its SHA-256: JSON only, the file is not sent again. */
export function useStoreInspectedPartOutline(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InspectedPartOutlineInput) => api.post(`/api/jobs/${id}/outline/from-inspection`, input, JobDetailSchema),
    retry: false,
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(id), job);
      void qc.invalidateQueries({ queryKey: jobKeys.list() });
    },
  });
}

/**
 * What the job's stock check answers: the contract's response for the first rail checked, plus
 * every rail checked (each against its own clamp) and the rails the job uses that were not.
 */
export const JobStockCheckAnswerSchema = StockCheckResponseSchema.extend({
  jawPlacement: z.string(),
  nominalOpening: z.number(),
  unit: UnitSchema,
  appliesTo: z.array(z.string()),
  rails: z.array(RailCheckSchema).default([]),
  railsNotChecked: z.array(z.string()).default([]),
});

/** Measured bars against the jaw rails of the job's pinned template (every rail the job uses when no rail is named); the server keeps the result with the job. */
export function useJobStockCheck(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { jawPlacement?: string; bars: MeasuredBarInput[] }) =>
      api.post(`/api/jobs/${id}/stock-check`, JobStockCheckInputSchema.parse(input), JobStockCheckAnswerSchema),
    retry: false,
    onSuccess: () => qc.invalidateQueries({ queryKey: jobKeys.detail(id) }),
  });
}

export const jobFileUrl = (id: number, file: 'package.zip' | 'setup-sheet.html' | 'drawing.svg' | 'part-file.dxf') => `/api/jobs/${id}/${file}`;

/** The load list of the job's next cycle; under the job's key, so a new stock check (which invalidates the job) refreshes it. */
export const loadListQuery = (id: number) => queryOptions({ queryKey: [...jobKeys.detail(id), 'load-list'] as const, queryFn: () => api.get(`/api/jobs/${id}/load-list`, LoadListSchema), retry: false });
export const useLoadList = (id: number, enabled: boolean) => useQuery({ ...loadListQuery(id), enabled });

export function useSaveLoadList(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: LoadListInput) => api.put(`/api/jobs/${id}/load-list`, input, LoadListSchema),
    onSuccess: (list) => qc.setQueryData(loadListQuery(id).queryKey, list),
  });
}

/** Stations ticked loaded and clamped at the machine; a 409 (the list or its ticks changed) reloads the list. */
export function useTickLoadList(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: LoadListTicksInput) => api.put(`/api/jobs/${id}/load-list/ticks`, input, LoadListSchema),
    retry: false,
    onSuccess: (list) => qc.setQueryData(loadListQuery(id).queryKey, list),
    onError: (err) => { if (err instanceof ApiError && err.status === 409) void qc.invalidateQueries({ queryKey: loadListQuery(id).queryKey }); },
  });
}

/** The single-part program (G-code text); the server checks it against the supported subset and answers the job. */
export function useUploadPartProgram(id: number) {
  const qc = useQueryClient();
  const [progress, setProgress] = useState<number | null>(null);
  const mutation = useMutation({
    mutationFn: (file: File) => {
      const form = new FormData();
      form.append('file', file, file.name);
      setProgress(0);
      return uploadWithProgress(`/api/jobs/${id}/part-program`, form, setProgress, { schema: JobDetailSchema });
    },
    retry: false,
    onSuccess: (job) => {
      qc.setQueryData(jobKeys.detail(id), job);
      void qc.invalidateQueries({ queryKey: jobKeys.partProgram(id) });
    },
    onSettled: () => setProgress(null),
  });
  return { ...mutation, progress };
}

/** The stored part program's text, for the preview (read in the browser with the same reader the server uses). */
export const partProgramTextQuery = (id: number, sha256: string | null) => queryOptions({
  queryKey: [...jobKeys.partProgram(id), sha256] as const,
  enabled: sha256 !== null,
  staleTime: Infinity,
  queryFn: async () => {
    const res = await fetch(`/api/jobs/${id}/part-program.nc`, { credentials: 'same-origin' });
    if (!res.ok) throw new Error(`The part program could not be loaded (${res.status}).`);
    return res.text();
  },
});

export interface TableProgramOptions { family: string; order: 'station' | 'tool'; skip: number[]; safeZ: string; base?: string }

export function tableProgramUrl(id: number, o: TableProgramOptions): string {
  const q = new URLSearchParams({ family: o.family, order: o.order });
  if (o.skip.length) q.set('skip', o.skip.join(','));
  if (o.safeZ.trim() !== '') q.set('safeZ', o.safeZ.trim());
  if (o.base && o.base.trim() !== '') q.set('base', o.base.replace(/\s+/g, ''));
  return `/api/jobs/${id}/program.nc?${q.toString()}`;
}
