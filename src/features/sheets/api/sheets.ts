import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ProfileInput, ProfileView, SheetDetail, SheetSummary } from '@shared/schemas/sheets';
import { api } from '@/lib/api-client';

type SheetFilters = { q?: string; status?: string; ownerId?: string; templates?: 'only' | 'exclude' };

const sheetsQueryOptions = (teamId: string, filters: SheetFilters) =>
  queryOptions({
    queryKey: ['teams', teamId, 'sheets', 'list', filters],
    queryFn: async () => {
      const params = new URLSearchParams(Object.entries(filters).filter(([, v]) => v) as Array<[string, string]>);
      return (await api<{ sheets: SheetSummary[] }>('GET', `/teams/${teamId}/sheets?${params}`)).sheets;
    },
  });

/** Polls while an export is running so its progress shows in the list. */
export const useSheets = (teamId: string, filters: SheetFilters) =>
  useQuery({
    ...sheetsQueryOptions(teamId, filters),
    refetchInterval: (q) => (q.state.data?.some((s) => s.lastExport?.status === 'running') ? 1000 : false),
  });

const profilesQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'sheet-profiles'],
    queryFn: async () => (await api<{ profiles: ProfileView[] }>('GET', `/teams/${teamId}/sheet-profiles`)).profiles,
  });

export const useProfiles = (teamId: string) => useQuery(profilesQueryOptions(teamId));

function useSheetsMutation<I, O>(teamId: string, fn: (input: I) => Promise<O>) {
  const client = useQueryClient();
  return useMutation({ mutationFn: fn, onSettled: () => void client.invalidateQueries({ queryKey: ['teams', teamId, 'sheets'] }) });
}

export const useCreateSheet = (teamId: string) =>
  useSheetsMutation(teamId, (input: { name: string; profileId?: string; fromTemplateId?: string; unit?: 'in' | 'mm' }) =>
    api<SheetDetail>('POST', `/teams/${teamId}/sheets`, input),
  );
export const useDuplicateSheet = (teamId: string) =>
  useSheetsMutation(teamId, ({ id, ...body }: { id: string; name?: string; asTemplate?: boolean }) =>
    api<SheetDetail>('POST', `/teams/${teamId}/sheets/${id}/duplicate`, body),
  );
export const useDeleteSheet = (teamId: string) =>
  useSheetsMutation(teamId, (id: string) => api<void>('DELETE', `/teams/${teamId}/sheets/${id}`));

function useProfileMutation<I, O>(teamId: string, fn: (input: I) => Promise<O>) {
  const client = useQueryClient();
  return useMutation({ mutationFn: fn, onSettled: () => void client.invalidateQueries({ queryKey: ['teams', teamId, 'sheet-profiles'] }) });
}
export type ProfileForm = Omit<ProfileInput, 'paperWidthMm' | 'paperHeightMm' | 'areaXMm' | 'areaYMm'> & {
  paperWidthMm?: number;
  paperHeightMm?: number;
  areaXMm?: number;
  areaYMm?: number;
};
export const useCreateProfile = (teamId: string) =>
  useProfileMutation(teamId, (input: ProfileForm) => api<ProfileView>('POST', `/teams/${teamId}/sheet-profiles`, input));
export const useUpdateProfile = (teamId: string) =>
  useProfileMutation(teamId, ({ id, ...input }: ProfileForm & { id: string }) =>
    api<ProfileView>('PUT', `/teams/${teamId}/sheet-profiles/${id}`, input),
  );
export const useMakeDefaultProfile = (teamId: string) =>
  useProfileMutation(teamId, (id: string) => api<ProfileView>('POST', `/teams/${teamId}/sheet-profiles/${id}/default`));
