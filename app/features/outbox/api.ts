import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { OutboxListSchema } from '../../../shared/schemas/outbox';
import { api } from '../../lib/api-client';

export const outboxKeys = {
  all: ['outbox'] as const,
  list: (q: string) => [...outboxKeys.all, 'list', q] as const,
};

export const outboxQuery = (q: string) =>
  queryOptions({
    queryKey: outboxKeys.list(q),
    queryFn: () => api.get(`/api/outbox${q ? `?q=${encodeURIComponent(q)}` : ''}`, OutboxListSchema),
    placeholderData: keepPreviousData,
  });
export const useOutbox = (q: string) => useQuery(outboxQuery(q));
