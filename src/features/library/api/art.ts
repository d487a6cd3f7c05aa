import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ArtListQuery, ArtPage, ArtUpdateInput, ArtView, BulkAction } from '@shared/schemas/library';
import { ApiError, api, apiUpload } from '@/lib/api-client';

export type ArtFilters = Partial<Omit<ArtListQuery, 'page' | 'pageSize'>> & { page?: number; pageSize?: number };

const toSearch = (filters: ArtFilters) => {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined && value !== '') params.set(key, String(value));
  return params.toString();
};

const artKeys = {
  all: (teamId: string) => ['teams', teamId, 'art'] as const,
  list: (teamId: string, filters: ArtFilters) => ['teams', teamId, 'art', 'list', filters] as const,
  detail: (teamId: string, artId: string) => ['teams', teamId, 'art', 'detail', artId] as const,
};

const artListQueryOptions = (teamId: string, filters: ArtFilters) =>
  queryOptions({
    queryKey: artKeys.list(teamId, filters),
    queryFn: () => api<ArtPage>('GET', `/teams/${teamId}/art?${toSearch(filters)}`),
    placeholderData: keepPreviousData,
  });

export const useArtList = (teamId: string, filters: ArtFilters) => useQuery(artListQueryOptions(teamId, filters));

const artQueryOptions = (teamId: string, artId: string) =>
  queryOptions({ queryKey: artKeys.detail(teamId, artId), queryFn: () => api<ArtView>('GET', `/teams/${teamId}/art/${artId}`) });

export const useArt = (teamId: string, artId: string) => useQuery(artQueryOptions(teamId, artId));

function useLibraryMutation<I, O>(teamId: string, fn: (input: I) => Promise<O>, { outlines = false } = {}) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => {
      void client.invalidateQueries({ queryKey: artKeys.all(teamId) });
      // The editor's outlines carry the art's saved background and neck setting: a change redraws them.
      if (outlines) void client.invalidateQueries({ queryKey: ['teams', teamId, 'outline'] });
      void client.invalidateQueries({ queryKey: ['teams', teamId, 'collections'] });
    },
  });
}

export const useUpdateArt = (teamId: string, artId: string) =>
  useLibraryMutation(teamId, (input: ArtUpdateInput) => api<ArtView>('PATCH', `/teams/${teamId}/art/${artId}`, input), { outlines: true });

export const useBulkArt = (teamId: string) =>
  useLibraryMutation(teamId, (action: BulkAction) => api<{ changed: number }>('POST', `/teams/${teamId}/art/bulk`, action));

export const useDeleteArt = (teamId: string) =>
  useLibraryMutation(teamId, ({ artId, confirm }: { artId: string; confirm?: boolean }) =>
    api<void>('DELETE', `/teams/${teamId}/art/${artId}${confirm ? '?confirm=1' : ''}`),
  );

/** Runs a delete; when the server says sheets use the art, asks the user and repeats with confirm. */
export async function deleteWithQuestion(run: (confirm: boolean) => Promise<unknown>): Promise<boolean> {
  try {
    await run(false);
    return true;
  } catch (error) {
    if (error instanceof ApiError && error.code === 'art_in_use') {
      if (!window.confirm(error.message)) return false;
      await run(true);
      return true;
    }
    throw error;
  }
}

export const useInvalidateLibrary = (teamId: string) => {
  const client = useQueryClient();
  return () => {
    void client.invalidateQueries({ queryKey: artKeys.all(teamId) });
    void client.invalidateQueries({ queryKey: ['teams', teamId, 'collections'] });
  };
};

/** Attaches a licence proof (receipt, licence text) to an art item or a collection. */
export const useAttachProof = (teamId: string, target: { artId: string } | { collectionId: string }) =>
  useLibraryMutation(teamId, (file: File) => {
    const form = new FormData();
    form.set('file', file, file.name);
    const path =
      'artId' in target
        ? `/teams/${teamId}/art/${target.artId}/licence-proof`
        : `/teams/${teamId}/collections/${target.collectionId}/licence-proof`;
    return apiUpload<unknown>(path, form);
  });
