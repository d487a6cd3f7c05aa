import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CollectionView, LicenceInput } from '@shared/schemas/library';
import { api } from '@/lib/api-client';

export { useCollections } from '@/api/collections';

function useCollectionMutation<I, O>(teamId: string, fn: (input: I) => Promise<O>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSettled: () => {
      void client.invalidateQueries({ queryKey: ['teams', teamId, 'collections'] });
      void client.invalidateQueries({ queryKey: ['teams', teamId, 'art'] });
    },
  });
}

type CollectionChanges = { name?: string; membersCanAdd?: boolean; archived?: boolean; licence?: LicenceInput | null };

export const useCreateCollection = (teamId: string) =>
  useCollectionMutation(teamId, (input: { name: string; membersCanAdd?: boolean }) =>
    api<CollectionView>('POST', `/teams/${teamId}/collections`, input),
  );

export const useUpdateCollection = (teamId: string) =>
  useCollectionMutation(teamId, ({ id, ...changes }: CollectionChanges & { id: string }) =>
    api<CollectionView>('PATCH', `/teams/${teamId}/collections/${id}`, changes),
  );

export const useReorderCollections = (teamId: string) =>
  useCollectionMutation(teamId, (ids: string[]) => api('PUT', `/teams/${teamId}/collections/order`, { ids }));
