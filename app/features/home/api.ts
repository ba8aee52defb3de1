import { queryOptions, useQuery } from '@tanstack/react-query';
import { HomeSchema } from '../../../shared/schemas/home';
import { api } from '../../lib/api-client';

export const homeKeys = {
  all: ['home'] as const,
  forUser: (userId: number) => [...homeKeys.all, userId] as const,
};

// What waits for someone changes whenever anyone acts: read afresh each time the home is opened.
export const homeQuery = (userId: number) => queryOptions({ queryKey: homeKeys.forUser(userId), queryFn: () => api.get('/api/home', HomeSchema), staleTime: 0 });
export const useHome = (userId: number | undefined) => useQuery({ ...homeQuery(userId ?? 0), enabled: userId !== undefined });
