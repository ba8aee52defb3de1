import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { UserSchema, type ForgotPasswordInput, type LoginInput, type SetPasswordInput, type User } from '../../../shared/schemas/auth';
import type { Unit } from '../../../shared/schemas/common';
import { ApiError, apiRequest, setCsrfToken } from '../../lib/api-client';

export const authKeys = { me: () => ['auth', 'me'] as const };

const MeSchema = z.object({ user: UserSchema });
const LoginAnswerSchema = z.object({ user: UserSchema, csrfToken: z.string() });
const SetPasswordAnswerSchema = z.object({ ok: z.literal(true), email: z.string() });
const ForgotPasswordAnswerSchema = z.object({ ok: z.literal(true), message: z.string() });

/** The signed-in user, or null when there is no session (a 401 is an answer here, not an error). */
export const meQuery = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: async (): Promise<User | null> => {
      try {
        return (await apiRequest('GET', '/api/auth/me', { schema: MeSchema })).user;
      } catch (e) {
        if (e instanceof ApiError && e.status === 401) return null;
        throw e;
      }
    },
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQuery());

export function useSignIn() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: LoginInput) => apiRequest('POST', '/api/auth/login', { body: input, schema: LoginAnswerSchema }),
    onSuccess: (answer) => {
      setCsrfToken(answer.csrfToken);
      qc.clear();
      qc.setQueryData(authKeys.me(), answer.user);
    },
  });
}

export function useSignOut() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => apiRequest('POST', '/api/auth/logout', { schema: z.object({ ok: z.boolean(), csrfToken: z.string() }) }),
    onSuccess: (answer) => {
      setCsrfToken(answer.csrfToken);
      qc.clear();
      qc.setQueryData(authKeys.me(), null);
    },
  });
}

export function useSetDisplayUnit() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (displayUnit: Unit | null) => apiRequest('PATCH', '/api/auth/me', { body: { displayUnit }, schema: MeSchema }),
    onSuccess: (answer) => qc.setQueryData(authKeys.me(), answer.user),
  });
}

/** From the mailed link: sets the password (and activates an invited account); the user then signs in. */
export const useSetPassword = () =>
  useMutation({ mutationFn: (input: SetPasswordInput) => apiRequest('POST', '/api/auth/set-password', { body: input, schema: SetPasswordAnswerSchema }) });

/** The answer is the same whether or not the address has an account. */
export const useForgotPassword = () =>
  useMutation({ mutationFn: (input: ForgotPasswordInput) => apiRequest('POST', '/api/auth/forgot-password', { body: input, schema: ForgotPasswordAnswerSchema }) });
