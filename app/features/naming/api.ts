import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { NamingCheckResultSchema, NamingConventionSchema, type NamingCheckInput, type SaveConventionInput } from '../../../shared/schemas/naming';
import { api } from '../../lib/api-client';

export const namingKeys = { all: ['naming'] as const, current: () => [...namingKeys.all, 'current'] as const };

export const conventionQuery = () => queryOptions({ queryKey: namingKeys.current(), queryFn: () => api.get('/api/naming/convention', NamingConventionSchema) });
export const useConvention = () => useQuery(conventionQuery());

export const useCheckName = () => useMutation({ mutationFn: (input: NamingCheckInput) => api.post('/api/naming/check', input, NamingCheckResultSchema) });

export function useSaveConvention() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (c: SaveConventionInput) => api.put('/api/naming/convention', c, NamingConventionSchema),
    onSuccess: (c) => qc.setQueryData(namingKeys.current(), c),
  });
}
