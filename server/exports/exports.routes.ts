import type { Response } from 'express';
import { z } from 'zod';
import { reviewQuerySchema } from '#shared/api/review';
import { FLAG_LABELS } from '#shared/projection/project';
import type { Deps } from '../deps';
import { defineRoute, type RouteDef } from '../http/route';
import { reviewList } from '../review/review.repository';
import { toCsv, type Cell } from './csv';

const OFFICE = ['qc_manager', 'engineer', 'admin'] as const;
const exportQuery = z.object({ jobId: z.string().uuid().optional() });

function send(res: Response, name: string, header: string[], rows: Cell[][]): void {
  res.set('Content-Type', 'text/csv; charset=utf-8').set('Content-Disposition', `attachment; filename="${name}"`).set('Cache-Control', 'no-store').send(toCsv(header, rows));
}

const num = (v: unknown): number | null => (v === null || v === undefined ? null : Number(v));

export function exportRoutes(d: Deps): RouteDef[] {
  return [
    defineRoute({
      method: 'get', path: '/exports/readings.csv', summary: 'Readings as CSV (numbers stay numbers; text cells are safe to open)', roles: OFFICE, query: exportQuery, raw: true,
      handler: async ({ res, user, query }) => {
        const rows: Array<Record<string, unknown>> = await d.ds.query(
          `SELECT p.mark, j.number, r.taken_at, r.value_mm, r.entered_text, r.entered_unit, r.method, r.support, r.sky, r.air_temp_c, r.note, u.name, r.superseded_by IS NOT NULL AS superseded
             FROM reading r JOIN piece p ON p.id = r.piece_id JOIN job j ON j.id = p.job_id JOIN app_user u ON u.id = r.taken_by
            WHERE r.plant_id = $1 ${query.jobId ? 'AND p.job_id = $2' : ''} ORDER BY p.mark, r.taken_at`,
          query.jobId ? [user.plantId, query.jobId] : [user.plantId],
        );
        send(res, 'readings.csv', ['mark', 'job', 'taken_at_utc', 'camber_mm', 'as_entered', 'unit', 'method', 'support', 'sky', 'air_temp_c', 'note', 'taken_by', 'superseded'],
          rows.map((r) => [String(r.mark), String(r.number), new Date(r.taken_at as string).toISOString(), num(r.value_mm), String(r.entered_text), String(r.entered_unit), String(r.method), String(r.support), (r.sky as string | null) ?? '', num(r.air_temp_c), (r.note as string | null) ?? '', String(r.name), r.superseded ? 'yes' : 'no']));
      },
    }),
    defineRoute({
      method: 'get', path: '/exports/pieces.csv', summary: 'Pieces with their projections as CSV', roles: OFFICE, query: exportQuery, raw: true,
      handler: async ({ res, user, query }) => {
        const rows: Array<Record<string, unknown>> = await d.ds.query(
          `SELECT p.mark, j.number, md.code, md.version, p.bed, p.cast_date::text AS cast_date, p.release_date::text AS release_date, p.ship_date::text AS ship_date,
                  p.erection_date::text AS erection_date, p.bay, p.bay_position, p.status, pr.latest_mm, pr.ship_mm, pr.erection_mm, pr.growth_factor
             FROM piece p JOIN job j ON j.id = p.job_id JOIN member_design md ON md.id = p.design_id LEFT JOIN projection pr ON pr.piece_id = p.id
            WHERE p.plant_id = $1 ${query.jobId ? 'AND p.job_id = $2' : ''} ORDER BY j.number, p.mark`,
          query.jobId ? [user.plantId, query.jobId] : [user.plantId],
        );
        send(res, 'pieces.csv', ['mark', 'job', 'design', 'design_version', 'bed', 'cast_date', 'release_date', 'ship_date', 'erection_date', 'bay', 'position', 'status', 'latest_mm', 'projected_ship_mm', 'projected_erection_mm', 'growth_factor'],
          rows.map((r) => [String(r.mark), String(r.number), String(r.code), num(r.version), (r.bed as string | null) ?? '', String(r.cast_date), String(r.release_date), (r.ship_date as string | null) ?? '', (r.erection_date as string | null) ?? '', (r.bay as string | null) ?? '', num(r.bay_position), String(r.status), num(r.latest_mm), num(r.ship_mm), num(r.erection_mm), num(r.growth_factor)]));
      },
    }),
    defineRoute({
      method: 'get', path: '/exports/review.csv', summary: 'The review list as CSV', roles: OFFICE, query: reviewQuerySchema, raw: true,
      handler: async ({ res, user, query }) => {
        const list = (await reviewList(d.ds, user, { ...query, page: 1, pageSize: 10_000 })).value();
        send(res, 'review-list.csv', ['mark', 'job', 'bay', 'status', 'ship_date', 'days_to_ship', 'flags', 'reasons', 'latest_mm', 'expected_mm', 'projected_ship_mm'],
          list.items.map((r) => [r.mark, r.jobNumber, r.bay ?? '', r.status, r.shipDate ?? '', r.daysToShip, r.flags.map((f) => FLAG_LABELS[f.kind]).join('; '), r.flags.map((f) => f.reason).join(' | '), r.latest?.mm ?? null, r.latest?.expectedMm ?? null, r.atShip?.mm ?? null]));
      },
    }),
  ];
}
