// Buyers' orders: the board, one order, and every change a member makes to one.
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import type { ArtPage } from '@shared/schemas/library';
import type { CustomerView, OrderBoard, OrderView } from '@shared/schemas/orders';
import { api } from '@/lib/api-client';

const base = (teamId: string) => `/teams/${teamId}`;
export const orderKeys = {
  all: (teamId: string) => ['teams', teamId, 'orders'] as const,
  board: (teamId: string, filters: Record<string, string>) => ['teams', teamId, 'orders', 'board', filters] as const,
  one: (teamId: string, orderId: string) => ['teams', teamId, 'orders', 'one', orderId] as const,
};

export const useOrderBoard = (teamId: string, filters: Record<string, string>) =>
  useQuery({
    queryKey: orderKeys.board(teamId, filters),
    queryFn: () => api<OrderBoard>('GET', `${base(teamId)}/orders?${new URLSearchParams(Object.entries(filters).filter(([, v]) => v))}`),
  });

const orderQueryOptions = (teamId: string, orderId: string) =>
  queryOptions({ queryKey: orderKeys.one(teamId, orderId), queryFn: () => api<OrderView>('GET', `${base(teamId)}/orders/${orderId}`) });
export const useOrder = (teamId: string, orderId: string) => useQuery(orderQueryOptions(teamId, orderId));

export const useCustomers = (teamId: string) =>
  useQuery({
    queryKey: [...orderKeys.all(teamId), 'customers'],
    queryFn: () => api<{ customers: CustomerView[] }>('GET', `${base(teamId)}/customers`).then((r) => r.customers),
  });

/** The team's art an order line may use, searched (sheets, stock and rates come from @/api/shop). */
export const useArtChoices = (teamId: string, q: string) =>
  useQuery({
    queryKey: ['teams', teamId, 'art', 'order-choices', q],
    queryFn: () => api<ArtPage>('GET', `${base(teamId)}/art?${new URLSearchParams({ q, pageSize: '24' })}`).then((r) => r.items),
  });
/** Every change to one order answers the order as it now is: the cache takes it as is. */
export function useOrderChange<I>(teamId: string, orderId: string, send: (input: I) => Promise<OrderView | { order: OrderView }>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: (answer) => {
      client.setQueryData(orderKeys.one(teamId, orderId), 'order' in answer ? answer.order : answer);
      void client.invalidateQueries({ queryKey: orderKeys.all(teamId), refetchType: 'none' });
    },
  });
}

export const ordersApi = {
  addCustomer: (teamId: string, body: unknown) => api<CustomerView>('POST', `${base(teamId)}/customers`, body),
  create: (teamId: string, body: unknown) => api<OrderView>('POST', `${base(teamId)}/orders`, body),
  addLine: (teamId: string, orderId: string, body: unknown) => api<OrderView>('POST', `${base(teamId)}/orders/${orderId}/lines`, body),
  setPrice: (teamId: string, orderId: string, lineId: string, unitPrice: string) =>
    api<OrderView>('PUT', `${base(teamId)}/orders/${orderId}/lines/${lineId}/price`, { unitPrice }),
  removeLine: (teamId: string, orderId: string, lineId: string) =>
    api<OrderView>('DELETE', `${base(teamId)}/orders/${orderId}/lines/${lineId}`),
  move: (teamId: string, orderId: string, to: string, note = '') =>
    api<OrderView>('POST', `${base(teamId)}/orders/${orderId}/moves`, { to, note }),
  sendProof: (teamId: string, orderId: string, message: string) =>
    api<{ link: string; order: OrderView }>('POST', `${base(teamId)}/orders/${orderId}/proofs`, { message }),
  makeSheets: (teamId: string, orderId: string) =>
    api<{ sheetIds: string[]; placed: number; order: OrderView }>('POST', `${base(teamId)}/orders/${orderId}/sheets`),
  paymentLink: (teamId: string, orderId: string) =>
    api<{ url: string; amountMinor: number }>('POST', `${base(teamId)}/orders/${orderId}/payment-link`),
  refund: (teamId: string, orderId: string, amount: string, reason: string) =>
    api<OrderView>('POST', `${base(teamId)}/orders/${orderId}/refunds`, { amount, reason }),
};
