import { queryOptions } from '@tanstack/react-query';
import { bayDetailSchema, bayListSchema, shippingListSchema, type ArrangeInput, type ShipInput } from '#shared/api/bays';
import { api } from '../../lib/api';

export const baysQuery = queryOptions({ queryKey: ['pieces', 'bays'], queryFn: () => api('/bays', { schema: bayListSchema }) });
export const bayQuery = (jobId: string, bay: string) =>
  queryOptions({ queryKey: ['pieces', 'bay', jobId, bay], queryFn: () => api(`/bays/detail?jobId=${jobId}&bay=${encodeURIComponent(bay)}`, { schema: bayDetailSchema }) });
export const arrangeBay = (input: ArrangeInput) => api('/bays/arrange', { method: 'POST', body: input, schema: bayDetailSchema });
export const shippingQuery = (date: string) => queryOptions({ queryKey: ['pieces', 'shipping', date], queryFn: () => api(`/shipping?date=${date}`, { schema: shippingListSchema }) });
export const shipPieces = (input: ShipInput): Promise<{ shipped: string[] }> => api('/shipping/ship', { method: 'POST', body: input });
