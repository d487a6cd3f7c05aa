import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { Me, SignInInput, SignUpInput, UpdateAccountInput, ChangePasswordInput } from '@shared/schemas/auth';
import { meSchema } from '@shared/schemas/auth';
import { ApiError, api, setCsrfToken } from '@/lib/api-client';

export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: async (): Promise<Me | null> => {
      try {
        return meSchema.parse(await api('GET', '/me'));
      } catch (error) {
        if (error instanceof ApiError && error.status === 401) return null;
        throw error;
      }
    },
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQueryOptions());

/** Sign-in, sign-up and invite acceptance all answer with the new session's Me. */
function useSessionMutation<I>(fn: (input: I) => Promise<unknown>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (input: I) => meSchema.parse(await fn(input)),
    onSuccess: (me) => {
      client.clear();
      client.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}

export const useSignIn = () => useSessionMutation((input: SignInInput) => api('POST', '/auth/sign-in', input));
export const useSignUp = () => useSessionMutation((input: SignUpInput) => api('POST', '/auth/sign-up', input));

/** Signs out here (`everywhere`: every device, ending every session of the account). */
export function useSignOut(everywhere = false) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: () => api<void>('POST', everywhere ? '/me/sign-out-everywhere' : '/auth/sign-out'),
    onSuccess: () => {
      setCsrfToken(null);
      client.clear();
      client.setQueryData(meQueryOptions().queryKey, null);
    },
  });
}

export function useUpdateAccount() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (input: UpdateAccountInput) => meSchema.parse(await api('PATCH', '/me', input)),
    onSuccess: (me) => client.setQueryData(meQueryOptions().queryKey, me),
  });
}

export const useChangePassword = () =>
  useMutation({ mutationFn: (input: ChangePasswordInput) => api<void>('POST', '/me/password', input) });

export function useSwitchTeam() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (teamId: string) => meSchema.parse(await api('PUT', '/me/active-team', { teamId })),
    onSuccess: (me) => client.setQueryData(meQueryOptions().queryKey, me),
  });
}

/** A new team for the signed-in maker; the answer is their refreshed account (with the new membership). */
export function useCreateTeam() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (name: string) => meSchema.parse(await api('POST', '/teams', { name })),
    onSuccess: (me) => client.setQueryData(meQueryOptions().queryKey, me),
  });
}
