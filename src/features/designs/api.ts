import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { designRowSchema, type BulkPiecesInput, type DesignInput, type DesignRow } from '#shared/api/designs';
import { api } from '../../lib/api';

export const designsQuery = queryOptions({ queryKey: ['designs'], queryFn: () => api('/designs', { schema: z.array(designRowSchema) }) });
export const designQuery = (id: string) => queryOptions({ queryKey: ['designs', id], queryFn: () => api(`/designs/${id}`, { schema: designRowSchema }) });
export const createDesign = (v: DesignInput): Promise<DesignRow> => api('/designs', { method: 'POST', body: v, schema: designRowSchema });
export const updateDesign = (id: string, v: { name: string; spec: DesignInput['spec'] }): Promise<DesignRow> => api(`/designs/${id}`, { method: 'PUT', body: v, schema: designRowSchema });
export const copyDesign = (id: string, code: string, name: string): Promise<DesignRow> => api(`/designs/${id}/copy`, { method: 'POST', body: { code, name }, schema: designRowSchema });
export const createJob = (number: string, name: string): Promise<{ id: string }> => api('/jobs', { method: 'POST', body: { number, name } });
export const addPieces = (v: BulkPiecesInput): Promise<{ created: string[] }> => api('/pieces/bulk', { method: 'POST', body: v });
