import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CollectionView } from '@shared/schemas/library';
import { api } from '../lib/api-client';

/** The team's collections (the library's sidebar and the editor's art panel). */
const collectionsQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'collections'],
    queryFn: async () => (await api<{ collections: CollectionView[] }>('GET', `/teams/${teamId}/collections`)).collections,
  });

export const useCollections = (teamId: string) => useQuery(collectionsQueryOptions(teamId));
