import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { z } from 'zod';
import type { ResetPasswordInput, ResetRequestInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';

const resetCheckSchema = z.object({ email: z.string(), expiresAt: z.string() });

const resetCheckQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['password-reset', token],
    queryFn: async () => resetCheckSchema.parse(await api('GET', `/auth/password-reset/${encodeURIComponent(token)}`)),
    retry: false,
  });

export const useResetCheck = (token: string) => useQuery(resetCheckQueryOptions(token));

export const useRequestReset = () =>
  useMutation({ mutationFn: (input: ResetRequestInput) => api<{ message: string }>('POST', '/auth/password-reset', input) });

export const useResetPassword = (token: string) =>
  useMutation({
    mutationFn: (input: ResetPasswordInput) => api<{ email: string }>('POST', `/auth/password-reset/${encodeURIComponent(token)}`, input),
  });
