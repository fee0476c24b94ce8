import { queryOptions } from '@tanstack/react-query';
import { z } from 'zod';
import { importSummarySchema, previewResultSchema, type ImportKind, type ImportSummary, type Mapping, type PreviewResult } from '#shared/api/imports';
import { api, ApiFailure } from '../../lib/api';

export const importsQuery = queryOptions({ queryKey: ['imports'], queryFn: () => api('/imports', { schema: z.array(importSummarySchema) }) });

const csrf = (): string => document.cookie.split('; ').find((c) => c.startsWith('cw_csrf='))?.slice(8) ?? '';

export async function uploadCsv(file: File, kind: ImportKind, delimiter: string): Promise<ImportSummary> {
  const form = new FormData();
  form.append('kind', kind);
  form.append('delimiter', delimiter);
  form.append('file', file, file.name);
  const res = await fetch('/api/imports', { method: 'POST', body: form, headers: { 'X-CSRF-Token': csrf() } });
  const body: unknown = await res.json().catch(() => null);
  if (!res.ok) throw new ApiFailure(res.status, (body ?? { code: 'http_error', message: `the server answered ${res.status}` }) as never);
  return importSummarySchema.parse(body);
}

export const previewImport = (id: string, mapping: Mapping, saveMappingAs?: string): Promise<PreviewResult> =>
  api(`/imports/${id}/preview`, { method: 'POST', body: { mapping, saveMappingAs }, schema: previewResultSchema });
export const commitImport = (id: string, mapping: Mapping, allOrNothing: boolean, saveMappingAs?: string): Promise<ImportSummary> =>
  api(`/imports/${id}/commit`, { method: 'POST', body: { mapping, allOrNothing, saveMappingAs }, schema: importSummarySchema });
