import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { UserListSchema, UserSchema, type CreateUserInput, type InviteUserInput, type UpdateUserInput } from '../../../shared/schemas/auth';
import { api } from '../../lib/api-client';

export const userKeys = { all: ['users'] as const, list: () => [...userKeys.all, 'list'] as const };

export const usersQuery = () => queryOptions({ queryKey: userKeys.list(), queryFn: () => api.get('/api/users', UserListSchema) });
export const useUsers = () => useQuery(usersQuery());

export function useCreateUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: CreateUserInput) => api.post('/api/users', input, UserSchema), onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}
export function useUpdateUser() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ id, patch }: { id: number; patch: UpdateUserInput }) => api.patch(`/api/users/${id}`, patch, UserSchema),
    onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }),
  });
}
/** Invites (201), or sends a pending invitation again with a new link (200); either way the user comes back. */
export function useInviteUser() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: (input: InviteUserInput) => api.post('/api/users/invite', input, UserSchema), onSuccess: () => qc.invalidateQueries({ queryKey: userKeys.all }) });
}
