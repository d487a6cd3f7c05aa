import { queryOptions, useQuery } from '@tanstack/react-query';
import type { SheetDetail, SheetSaveInput } from '@shared/schemas/sheets';
import type { SheetDocument } from '@shared/sheet/document';
import { api } from '@/lib/api-client';

export const sheetQueryOptions = (teamId: string, sheetId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'sheets', 'detail', sheetId],
    queryFn: () => api<SheetDetail>('GET', `/teams/${teamId}/sheets/${sheetId}`),
    staleTime: Infinity,
    refetchOnWindowFocus: false,
  });

export const useSheet = (teamId: string, sheetId: string) => useQuery(sheetQueryOptions(teamId, sheetId));

export const saveSheet = (teamId: string, sheetId: string, input: SheetSaveInput) =>
  api<SheetDetail>('PUT', `/teams/${teamId}/sheets/${sheetId}`, input);

/** "Keep mine as a copy": a new sheet holding this editor's document. */
export async function saveAsCopy(teamId: string, name: string, unit: 'in' | 'mm', document: SheetDocument): Promise<string> {
  const created = await api<SheetDetail>('POST', `/teams/${teamId}/sheets`, { name, unit });
  await api<SheetDetail>('PUT', `/teams/${teamId}/sheets/${created.id}`, { version: created.version, document });
  return created.id;
}
