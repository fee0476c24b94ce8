import { queryOptions } from '@tanstack/react-query';
import { boardSchema, jobsStatusSchema } from '#shared/api/board';
import { pieceProjectionSchema, reviewPageSchema, type DecisionInput, type ReviewQuery } from '#shared/api/review';
import { api } from '../../lib/api';

const qs = (o: Record<string, unknown>): string => {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(o)) if (v !== undefined && v !== '' && v !== null) p.set(k, String(v));
  return p.toString() ? `?${p}` : '';
};

export const reviewQuery = (f: ReviewQuery) => queryOptions({ queryKey: ['pieces', 'review', f], queryFn: () => api(`/review${qs(f)}`, { schema: reviewPageSchema }) });
export const projectionQuery = (pieceId: string) =>
  queryOptions({ queryKey: ['pieces', 'projection', pieceId], queryFn: () => api(`/pieces/${pieceId}/projection`, { schema: pieceProjectionSchema }) });
export const postDecision = (pieceId: string, input: DecisionInput): Promise<{ id: string; status: string; version: number }> =>
  api(`/pieces/${pieceId}/decisions`, { method: 'POST', body: input });
export const boardQuery = queryOptions({ queryKey: ['pieces', 'board'], queryFn: () => api('/board', { schema: boardSchema }) });
export const jobsStatusQuery = queryOptions({ queryKey: ['jobs-status'], queryFn: () => api('/jobs/status', { schema: jobsStatusSchema }), refetchInterval: 10_000 });
