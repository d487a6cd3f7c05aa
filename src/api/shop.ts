// The print shop's API, shared by the print-room screens, the editor's cost panel and the sheets list.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MachineView, PrintRunView, SheetCostView, ShopSettings, StockView } from '@shared/schemas/shop';
import { api } from '../lib/api-client';
import type { OrderBoard } from '@shared/schemas/orders';

const base = (teamId: string) => `/teams/${teamId}`;
export const shopKeys = { all: (teamId: string) => ['teams', teamId, 'shop'] as const };

export const stockQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: [...shopKeys.all(teamId), 'stock'],
    queryFn: () => api<{ stock: StockView[] }>('GET', `${base(teamId)}/stock`).then((r) => r.stock),
  });
export const machinesQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: [...shopKeys.all(teamId), 'machines'],
    queryFn: () => api<{ machines: MachineView[] }>('GET', `${base(teamId)}/machines`).then((r) => r.machines),
  });
export const settingsQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: [...shopKeys.all(teamId), 'settings'],
    queryFn: () => api<ShopSettings>('GET', `${base(teamId)}/shop-settings`),
  });
export const runsQueryOptions = (teamId: string, filters: Record<string, string>) =>
  queryOptions({
    queryKey: [...shopKeys.all(teamId), 'runs', filters],
    queryFn: () =>
      api<{ runs: PrintRunView[] }>(
        'GET',
        `${base(teamId)}/print-runs?${new URLSearchParams(Object.entries(filters).filter(([, v]) => v))}`,
      ).then((r) => r.runs),
  });
export const costQueryOptions = (teamId: string, sheetId: string, version: number) =>
  queryOptions({
    queryKey: [...shopKeys.all(teamId), 'cost', sheetId, version],
    queryFn: () => api<SheetCostView>('GET', `${base(teamId)}/sheets/${sheetId}/cost`),
  });

/** Orders a run may be logged against: those not yet handed over or cancelled, for the run form's choice. */
export const openOrdersQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'orders', 'open-choices'],
    queryFn: async () =>
      (await api<OrderBoard>('GET', `${base(teamId)}/orders`)).orders
        .filter((o) => o.state !== 'handed-over' && o.state !== 'cancelled')
        .map((o) => ({ id: o.id, name: `#${o.number} · ${o.customer.name}` })),
  });

export const useStock = (teamId: string) => useQuery(stockQueryOptions(teamId));
export const useMachines = (teamId: string) => useQuery(machinesQueryOptions(teamId));

export const shopApi = {
  createStock: (teamId: string, body: unknown) => api<StockView>('POST', `${base(teamId)}/stock`, body),
  updateStock: (teamId: string, id: string, body: unknown) => api<StockView>('PUT', `${base(teamId)}/stock/${id}`, body),
  archiveStock: (teamId: string, id: string) => api<void>('DELETE', `${base(teamId)}/stock/${id}`),
  adjustStock: (teamId: string, id: string, change: number, confirmNegative = false) =>
    api<StockView>('POST', `${base(teamId)}/stock/${id}/adjust`, { change, confirmNegative }),
  createMachine: (teamId: string, body: unknown) => api<MachineView>('POST', `${base(teamId)}/machines`, body),
  updateMachine: (teamId: string, id: string, body: unknown) => api<MachineView>('PUT', `${base(teamId)}/machines/${id}`, body),
  archiveMachine: (teamId: string, id: string) => api<void>('DELETE', `${base(teamId)}/machines/${id}`),
  fitBlade: (teamId: string, cutterId: string, body: unknown) =>
    api<MachineView>('POST', `${base(teamId)}/machines/${cutterId}/blades`, body),
  recordRun: (teamId: string, body: unknown) => api<PrintRunView>('POST', `${base(teamId)}/print-runs`, body),
  /** The rates as typed: the server reads the numbers and names any that are not. */
  saveSettings: (teamId: string, body: Partial<Record<keyof ShopSettings, string | boolean>>) =>
    api<ShopSettings>('PUT', `${base(teamId)}/shop-settings`, body),
  setCosting: (teamId: string, sheetId: string, body: unknown) =>
    api<SheetCostView>('PUT', `${base(teamId)}/sheets/${sheetId}/costing`, body),
};

/** Sheet names and ids for the run form (the sheets list itself belongs to the sheets feature). */
export const sheetChoicesQueryOptions = (teamId: string) =>
  queryOptions({
    queryKey: ['teams', teamId, 'sheets', 'choices'],
    queryFn: () =>
      api<{ sheets: Array<{ id: string; name: string; pieceCount: number }> }>('GET', `/teams/${teamId}/sheets`).then((r) => r.sheets),
  });
