import type { ExportJobView, ExportRequest } from '@shared/schemas/exports';
import { api } from '@/lib/api-client';

export const startExport = (teamId: string, sheetId: string, request: Partial<ExportRequest>) =>
  api<ExportJobView>('POST', `/teams/${teamId}/sheets/${sheetId}/exports`, request);
export const getExport = (teamId: string, sheetId: string, id: string) =>
  api<ExportJobView>('GET', `/teams/${teamId}/sheets/${sheetId}/exports/${id}`);
export const latestExport = (teamId: string, sheetId: string) =>
  api<{ export: ExportJobView | null }>('GET', `/teams/${teamId}/sheets/${sheetId}/exports/latest`);
export const cancelExport = (teamId: string, sheetId: string, id: string) =>
  api<ExportJobView>('POST', `/teams/${teamId}/sheets/${sheetId}/exports/${id}/cancel`);
