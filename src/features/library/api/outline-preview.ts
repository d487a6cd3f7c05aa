import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { OutlineResponse } from '@shared/schemas/outline';
import { api } from '@/lib/api-client';

type OutlinePreview = OutlineResponse;

type PreviewParams = { background: string; backgroundTolerance: number; widenNecks: boolean };

/** A quick, low-DPI outline to show what background removal and the border will do. */
const outlinePreviewQueryOptions = (teamId: string, artId: string, p: PreviewParams) =>
  queryOptions({
    queryKey: ['teams', teamId, 'art', 'outline-preview', artId, p],
    queryFn: () => {
      const search = new URLSearchParams({
        width: '3in',
        border: '0.125in',
        dpi: '100',
        background: p.background,
        backgroundTolerance: String(p.backgroundTolerance),
        widenNecks: String(p.widenNecks),
      });
      return api<OutlinePreview>('GET', `/teams/${teamId}/art/${artId}/outline?${search}`);
    },
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export const useOutlinePreview = (teamId: string, artId: string, p: PreviewParams) =>
  useQuery(outlinePreviewQueryOptions(teamId, artId, p));

/** The address of the tinted picture of what removal takes (see the background-removal route). */
export const removalPreviewUrl = (teamId: string, artId: string, p: Pick<PreviewParams, 'background' | 'backgroundTolerance'>) =>
  `/api/teams/${teamId}/art/${artId}/background-removal.png?${new URLSearchParams({ background: p.background, backgroundTolerance: String(p.backgroundTolerance) })}`;
