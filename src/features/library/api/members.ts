import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** The team's members, for the "uploaded by" filter. */
const membersQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'members'],
    queryFn: async () => (await api<{ members: Array<{ userId: string; name: string }> }>('GET', `/teams/${teamId}`)).members,
    staleTime: 60_000,
  });

export const useMembers = (teamId: string) => useQuery(membersQueryOptions(teamId));
