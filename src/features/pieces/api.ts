import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { pieceDetailSchema } from '#shared/api/piece-detail';
import { jobSchema, piecePageSchema, type PieceListQuery } from '#shared/api/pieces';
import { api } from '../../lib/api';

const qs = (o: Record<string, unknown>): string => {
  const p = new URLSearchParams();
  for (const [k, v] of Object.entries(o)) if (v !== undefined && v !== '' && v !== null) p.set(k, String(v));
  const s = p.toString();
  return s ? `?${s}` : '';
};

export const pieceKeys = {
  all: ['pieces'] as const,
  list: (f: PieceListQuery) => ['pieces', 'list', f] as const,
  detail: (id: string) => ['pieces', 'detail', id] as const,
};

export const piecesQuery = (f: PieceListQuery) =>
  queryOptions({ queryKey: pieceKeys.list(f), queryFn: () => api(`/pieces${qs(f)}`, { schema: piecePageSchema }) });

export const pieceQuery = (id: string) =>
  queryOptions({ queryKey: pieceKeys.detail(id), queryFn: () => api(`/pieces/${id}`, { schema: pieceDetailSchema }) });

export const jobsQuery = queryOptions({ queryKey: ['jobs'], queryFn: () => api('/jobs', { schema: z.array(jobSchema) }), staleTime: 5 * 60_000 });
