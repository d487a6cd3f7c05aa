import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { CreateInviteInput, UpdateMemberInput } from '@shared/schemas/team';
import { invitePreviewSchema, teamDetailSchema } from '@shared/schemas/team';
import { meSchema } from '@shared/schemas/auth';
import type { AcceptInviteInput } from '@shared/schemas/auth';
import { api } from '@/lib/api-client';
import { meQueryOptions } from '@/features/auth/api/me';

const teamQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId],
    queryFn: async () => teamDetailSchema.parse(await api('GET', `/teams/${teamId}`)),
  });

export const useTeam = (teamId: string) => useQuery(teamQueryOptions(teamId));

function useTeamMutation<I>(teamId: string, fn: (input: I) => Promise<unknown>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => {
      void client.invalidateQueries({ queryKey: ['teams', teamId] });
      void client.invalidateQueries({ queryKey: meQueryOptions().queryKey });
    },
  });
}

export const useRenameTeam = (teamId: string) => useTeamMutation(teamId, (name: string) => api('PATCH', `/teams/${teamId}`, { name }));
export const useInvite = (teamId: string) =>
  useTeamMutation(teamId, (input: CreateInviteInput) => api('POST', `/teams/${teamId}/invites`, input));
export const useRevokeInvite = (teamId: string) =>
  useTeamMutation(teamId, (inviteId: string) => api('DELETE', `/teams/${teamId}/invites/${inviteId}`));
export const useChangeRole = (teamId: string) =>
  useTeamMutation(teamId, ({ userId, role }: UpdateMemberInput & { userId: string }) =>
    api('PATCH', `/teams/${teamId}/members/${userId}`, { role }),
  );
export const useRemoveMember = (teamId: string) =>
  useTeamMutation(teamId, (userId: string) => api('DELETE', `/teams/${teamId}/members/${userId}`));

export const invitePreviewQueryOptions = (token: string) =>
  queryOptions({
    queryKey: ['invites', token],
    queryFn: async () => invitePreviewSchema.parse(await api('GET', `/invites/${encodeURIComponent(token)}`)),
    retry: false,
  });

export function useAcceptInvite(token: string) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: async (input: AcceptInviteInput) =>
      meSchema.parse(await api('POST', `/invites/${encodeURIComponent(token)}/accept`, input)),
    onSuccess: (me) => {
      client.clear();
      client.setQueryData(meQueryOptions().queryKey, me);
    },
  });
}
