import { createHash } from 'node:crypto';
import type { EntityManager } from 'typeorm';
import type { SessionUser } from '#shared/api/auth';
import { IMPORT_FIELDS, type ImportKind, type ImportSummary, type Mapping, type PreviewResult, type RowError } from '#shared/api/imports';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { toCsv } from '../exports/csv';
import { AppError, notFound } from '../http/errors';
import { checkHeader, csvRecords, decodeCsv } from './csv-file';
import { markKey, proposeMapping, validateRow, type ImportContext, type PieceRow, type ReadingRow } from './rows';

const BATCH = 5000;

interface ImportRecord { id: string; plant_id: string; kind: ImportKind; filename: string; status: 'uploaded' | 'committed' | 'rejected'; content: string; delimiter: string; header: string[]; rows_total: number | null; rows_added: number | null; rows_duplicate: number | null; rows_rejected: number | null; rejected_csv: string | null }

async function savedMappings(d: Deps, user: SessionUser, kind: ImportKind): Promise<Array<{ name: string; mapping: Mapping }>> {
  return d.ds.query(`SELECT name, mapping FROM csv_mapping WHERE plant_id = $1 AND kind = $2 ORDER BY updated_at DESC`, [user.plantId, kind]);
}

async function summary(d: Deps, user: SessionUser, r: ImportRecord, repeated: boolean): Promise<ImportSummary> {
  const fields = IMPORT_FIELDS[r.kind];
  const proposed = proposeMapping(fields, r.header);
  const mapped = new Set(Object.values(proposed).filter(Boolean));
  return {
    id: r.id,
    kind: r.kind,
    filename: r.filename,
    status: r.status,
    header: r.header,
    proposedMapping: proposed,
    ignoredColumns: r.header.filter((h) => !mapped.has(h)),
    savedMappings: await savedMappings(d, user, r.kind),
    result: r.status === 'uploaded' ? null : { total: r.rows_total ?? 0, added: r.rows_added ?? 0, duplicates: r.rows_duplicate ?? 0, rejected: r.rows_rejected ?? 0 },
    repeated,
  };
}

/**
 * Takes an uploaded file: the same file again (same SHA-256, same kind) returns the first import and adds
 * nothing; a file that is not clean UTF-8 CSV with a sound header is refused before anything is stored.
 */
export async function uploadCsv(d: Deps, user: SessionUser, file: { buffer: Buffer; originalname: string } | undefined, kind: ImportKind, delimiter: string): Promise<{ summary: ImportSummary; created: boolean }> {
  if (!file) throw new AppError(400, 'validation_failed', 'attach the CSV file as the "file" field', { file: ['missing'] });
  const hash = createHash('sha256').update(file.buffer).digest('hex');
  const existing: ImportRecord[] = await d.ds.query(`SELECT * FROM csv_import WHERE plant_id = $1 AND kind = $2 AND file_hash = $3`, [user.plantId, kind, hash]);
  if (existing[0]) return { summary: await summary(d, user, existing[0], true), created: false };
  const text = decodeCsv(file.buffer);
  // The header alone first, so a file in the wrong delimiter is named as such, not as a broken row.
  const firstLine = text.split(/\r\n|\n|\r/, 1)[0] ?? '';
  for await (const rec of csvRecords(`${firstLine}\n`, delimiter)) checkHeader(rec.cells, delimiter);
  let header: string[] | null = null;
  let dataRows = 0;
  for await (const rec of csvRecords(text, delimiter)) {
    if (!header) header = checkHeader(rec.cells, delimiter);
    else if (++dataRows > 0) break; // one data row is enough here; the commit reads every row
  }
  if (!header || dataRows === 0) throw new AppError(422, 'csv_rejected', 'the file has no data rows');
  // The original name is kept as escaped metadata only; the content is stored under our own id.
  const name = file.originalname.replace(/[^\w.\- ]+/g, '_').slice(0, 120) || 'upload.csv';
  const rows = await d.ds.query(
    `INSERT INTO csv_import (plant_id, kind, file_hash, filename, size, content, delimiter, header, created_by) VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9)
     ON CONFLICT (plant_id, kind, file_hash) DO NOTHING RETURNING *`,
    [user.plantId, kind, hash, name, file.buffer.length, text, delimiter, JSON.stringify(header), user.id],
  );
  const record: ImportRecord = rows[0] ?? (await d.ds.query(`SELECT * FROM csv_import WHERE plant_id = $1 AND kind = $2 AND file_hash = $3`, [user.plantId, kind, hash]))[0];
  return { summary: await summary(d, user, record, !rows[0]), created: !!rows[0] };
}

async function loadImport(d: Deps, user: SessionUser, id: string, tx?: EntityManager): Promise<ImportRecord> {
  const rows: ImportRecord[] = await (tx ?? d.ds).query(`SELECT * FROM csv_import WHERE id = $1 AND plant_id = $2 ${tx ? 'FOR UPDATE' : ''}`, [id, user.plantId]);
  if (!rows[0]) throw notFound('the import');
  return rows[0];
}

async function context(d: Deps, user: SessionUser): Promise<ImportContext> {
  const pieces: Array<{ id: string; mark: string; number: string }> = await d.ds.query(`SELECT p.id, p.mark, j.number FROM piece p JOIN job j ON j.id = p.job_id WHERE p.plant_id = $1`, [user.plantId]);
  const jobs: Array<{ id: string; number: string }> = await d.ds.query(`SELECT id, number FROM job WHERE plant_id = $1`, [user.plantId]);
  const designs: Array<{ id: string; code: string }> = await d.ds.query(`SELECT DISTINCT ON (code) id, code FROM member_design WHERE plant_id = $1 ORDER BY code, version DESC`, [user.plantId]);
  const byMark = new Map<string, Array<{ id: string; jobNumber: string }>>();
  for (const p of pieces) byMark.set(markKey(p.mark), [...(byMark.get(markKey(p.mark)) ?? []), { id: p.id, jobNumber: p.number }]);
  return {
    timeZone: user.timeZone,
    unit: user.unitSystem === 'si' ? 'mm' : 'in',
    now: new Date(),
    pieces: byMark,
    jobs: new Map(jobs.map((j) => [j.number.toLowerCase(), j.id])),
    designs: new Map(designs.map((x) => [x.code.toLowerCase(), x.id])),
  };
}

interface Checked { total: number; valid: Array<{ line: number; cells: string[]; row: ReadingRow | PieceRow }>; rejected: Array<{ line: number; cells: string[]; errors: RowError[] }>; missing: string[] }

/** Every row checked against the mapping; duplicates within the file are refused with the first line. */
async function checkAll(d: Deps, user: SessionUser, imp: ImportRecord, mapping: Mapping): Promise<Checked> {
  const fields = IMPORT_FIELDS[imp.kind];
  const index = new Map(imp.header.map((h, i) => [h, i]));
  const unknown = Object.entries(mapping).filter(([, h]) => h && !index.has(h));
  if (unknown.length) throw new AppError(400, 'validation_failed', 'the mapping names columns the file does not have', Object.fromEntries(unknown.map(([f, h]) => [`mapping.${f}`, [`no column "${h}"`]])));
  const missing = fields.filter((f) => f.required && !mapping[f.key]).map((f) => f.label);
  const ctx = await context(d, user);
  const out: Checked = { total: 0, valid: [], rejected: [], missing };
  if (missing.length) return out;
  const firstSeen = new Map<string, number>();
  let header = true;
  for await (const rec of csvRecords(imp.content, imp.delimiter)) {
    if (header) {
      header = false;
      continue;
    }
    out.total++;
    const get = (field: string): string | undefined => {
      const h = mapping[field];
      return h ? rec.cells[index.get(h)!] : undefined;
    };
    const column = (field: string): string => mapping[field] ?? field;
    const { row, errors } = validateRow(imp.kind, get, ctx, rec.line, column);
    if (row) {
      const key = 'pieceId' in row ? `${row.pieceId}|${row.takenAt.toISOString()}` : `${row.jobId}|${markKey(row.mark)}`;
      const first = firstSeen.get(key);
      if (first !== undefined) {
        out.rejected.push({ line: rec.line, cells: rec.cells, errors: [{ line: rec.line, column: column('mark'), reason: `the same ${'pieceId' in row ? 'piece and time' : 'job and mark'} as line ${first}` }] });
        continue;
      }
      firstSeen.set(key, rec.line);
      out.valid.push({ line: rec.line, cells: rec.cells, row });
    } else out.rejected.push({ line: rec.line, cells: rec.cells, errors });
  }
  return out;
}

export async function previewImport(d: Deps, user: SessionUser, id: string, mapping: Mapping, saveAs?: string): Promise<PreviewResult> {
  const imp = await loadImport(d, user, id);
  const c = await checkAll(d, user, imp, mapping);
  if (saveAs) await saveMapping(d, user, imp.kind, saveAs, mapping);
  // Times as the plant reads them: in its own time zone, with the zone named.
  const local = new Intl.DateTimeFormat('en-CA', { timeZone: user.timeZone, dateStyle: 'short', timeStyle: 'short', hourCycle: 'h23' });
  const show = (row: ReadingRow | PieceRow): Record<string, string> =>
    Object.fromEntries(Object.entries(row).map(([k, v]) => [k, v instanceof Date ? `${local.format(v)} (${user.timeZone})` : v === null ? '' : String(v)]));
  return {
    total: c.total,
    valid: c.valid.length,
    invalid: c.rejected.length,
    rows: c.valid.slice(0, 20).map((v) => ({ line: v.line, values: show(v.row) })),
    errors: c.rejected.flatMap((r) => r.errors).slice(0, 200),
    missing: c.missing,
  };
}

async function saveMapping(d: Deps, user: SessionUser, kind: ImportKind, name: string, mapping: Mapping): Promise<void> {
  await d.ds.query(
    `INSERT INTO csv_mapping (plant_id, kind, name, mapping, created_by) VALUES ($1, $2, $3, $4, $5)
     ON CONFLICT (plant_id, kind, name) DO UPDATE SET mapping = EXCLUDED.mapping, updated_at = now()`,
    [user.plantId, kind, name, JSON.stringify(mapping), user.id],
  );
}

/**
 * Commits the import in one transaction: the valid rows land (or none, with "all or nothing" and any
 * error); rows already in the database are counted as duplicates and skipped; refused rows are kept
 * with the import as a CSV with an error column. A repeat returns the first result.
 */
export async function commitImport(d: Deps, user: SessionUser, id: string, mapping: Mapping, allOrNothing: boolean, saveAs?: string): Promise<ImportSummary> {
  const first = await loadImport(d, user, id);
  if (first.status !== 'uploaded') return summary(d, user, first, true);
  const c = await checkAll(d, user, first, mapping);
  if (c.missing.length) throw new AppError(400, 'validation_failed', `map the required columns first: ${c.missing.join(', ')}`, { mapping: c.missing.map((m) => `${m} is not mapped`) });
  if (saveAs) await saveMapping(d, user, first.kind, saveAs, mapping);
  const rejectedCsv = c.rejected.length ? toCsv([...first.header, 'error'], c.rejected.map((r) => [...r.cells, r.errors.map((e) => `line ${e.line}, ${e.column}: ${e.reason}`).join('; ')])) : null;
  const result = await d.ds.transaction(async (tx) => {
    const imp = await loadImport(d, user, id, tx);
    if (imp.status !== 'uploaded') return imp;
    const refuse = allOrNothing && c.rejected.length > 0;
    let added = 0;
    if (!refuse) added = imp.kind === 'readings' ? await insertReadings(tx, user, imp.id, c.valid as Array<{ line: number; row: ReadingRow }>) : await insertPieces(tx, user, c.valid as Array<{ line: number; row: PieceRow }>);
    const duplicates = refuse ? 0 : c.valid.length - added;
    const rows: ImportRecord[] = await tx.query(
      `UPDATE csv_import SET status = $2, mapping = $3, all_or_nothing = $4, rows_total = $5, rows_added = $6, rows_duplicate = $7, rows_rejected = $8, rejected_csv = $9, committed_at = now()
        WHERE id = $1 RETURNING *`,
      [imp.id, refuse ? 'rejected' : 'committed', JSON.stringify(mapping), allOrNothing, c.total, added, duplicates, c.rejected.length, rejectedCsv],
    ).then((r) => (Array.isArray(r[0]) ? r[0] : r));
    await audit(tx, { plantId: user.plantId, userId: user.id, action: refuse ? 'import-refused' : 'import', entity: 'csv_import', entityId: imp.id, after: { kind: imp.kind, file: imp.filename, total: c.total, added, duplicates, rejected: c.rejected.length } });
    return rows[0]!;
  });
  if (result.status === 'committed' && (result.rows_added ?? 0) > 0) await d.jobs?.projectAll(user.plantId);
  return summary(d, user, result, false);
}

async function insertReadings(tx: EntityManager, user: SessionUser, importId: string, rows: Array<{ line: number; row: ReadingRow }>): Promise<number> {
  // A reading of the same piece at the same time already in the database is the same reading: skipped.
  const pieceIds = [...new Set(rows.map((r) => r.row.pieceId))];
  let from = Infinity;
  let to = -Infinity;
  for (const r of rows) {
    const t = r.row.takenAt.getTime();
    if (t < from) from = t;
    if (t > to) to = t;
  }
  const have: Array<{ piece_id: string; taken_at: Date }> = pieceIds.length
    ? await tx.query(`SELECT piece_id, taken_at FROM reading WHERE piece_id = ANY($1::uuid[]) AND taken_at BETWEEN $2 AND $3`, [pieceIds, new Date(from), new Date(to)])
    : [];
  const known = new Set(have.map((h) => `${h.piece_id}|${new Date(h.taken_at).toISOString()}`));
  const fresh = rows.filter((r) => !known.has(`${r.row.pieceId}|${r.row.takenAt.toISOString()}`));
  let added = 0;
  for (let i = 0; i < fresh.length; i += BATCH) {
    const b = fresh.slice(i, i + BATCH);
    const col = <T>(f: (r: { line: number; row: ReadingRow }) => T): T[] => b.map(f);
    const res = await tx.query(
      `INSERT INTO reading (plant_id, piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, sky, air_temp_c, note, taken_by, idempotency_key, request_hash)
       SELECT $1, u.piece_id, u.taken_at, u.value_mm, u.entered_text, u.entered_unit, u.method, u.support, u.sky, u.air_temp_c, u.note, $2, u.key, 'import'
         FROM unnest($3::uuid[], $4::timestamptz[], $5::numeric[], $6::text[], $7::text[], $8::text[], $9::text[], $10::text[], $11::numeric[], $12::text[], $13::text[])
              AS u(piece_id, taken_at, value_mm, entered_text, entered_unit, method, support, sky, air_temp_c, note, key)
       ON CONFLICT (plant_id, idempotency_key) DO NOTHING RETURNING 1`,
      [
        user.plantId, user.id,
        col((r) => r.row.pieceId), col((r) => r.row.takenAt.toISOString()), col((r) => r.row.valueMm.toFixed(6)), col((r) => r.row.enteredText), col((r) => r.row.enteredUnit),
        col((r) => r.row.method), col((r) => r.row.support), col((r) => r.row.sky), col((r) => (r.row.airTempC === null ? null : r.row.airTempC.toFixed(1))), col((r) => r.row.note),
        col((r) => `import:${importId}:${r.line}`),
      ],
    );
    added += res.length;
  }
  return added;
}

async function insertPieces(tx: EntityManager, user: SessionUser, rows: Array<{ line: number; row: PieceRow }>): Promise<number> {
  let added = 0;
  for (let i = 0; i < rows.length; i += BATCH) {
    const b = rows.slice(i, i + BATCH).map((r) => r.row);
    const res = await tx.query(
      `INSERT INTO piece (plant_id, job_id, design_id, mark, bed, cast_date, release_date, ship_date, erection_date, bay, bay_position, status)
       SELECT $1, u.job_id, u.design_id, u.mark, u.bed, u.cast_date, u.release_date, u.ship_date, u.erection_date, u.bay, u.position, 'in_storage'
         FROM unnest($2::uuid[], $3::uuid[], $4::text[], $5::text[], $6::date[], $7::date[], $8::date[], $9::date[], $10::text[], $11::int[])
              AS u(job_id, design_id, mark, bed, cast_date, release_date, ship_date, erection_date, bay, position)
       ON CONFLICT (plant_id, job_id, mark) DO NOTHING RETURNING 1`,
      [user.plantId, b.map((r) => r.jobId), b.map((r) => r.designId), b.map((r) => r.mark), b.map((r) => r.bed), b.map((r) => r.castDate), b.map((r) => r.releaseDate), b.map((r) => r.shipDate), b.map((r) => r.erectionDate), b.map((r) => r.bay), b.map((r) => r.position)],
    );
    added += res.length;
  }
  return added;
}

export async function rejectedCsv(d: Deps, user: SessionUser, id: string): Promise<{ name: string; csv: string }> {
  const imp = await loadImport(d, user, id);
  if (!imp.rejected_csv) throw notFound('refused rows for this import');
  return { name: `refused-rows-${imp.id.slice(0, 8)}.csv`, csv: imp.rejected_csv };
}

export async function listImports(d: Deps, user: SessionUser): Promise<ImportSummary[]> {
  const rows: ImportRecord[] = await d.ds.query(`SELECT * FROM csv_import WHERE plant_id = $1 ORDER BY created_at DESC LIMIT 50`, [user.plantId]);
  return Promise.all(rows.map((r) => summary(d, user, r, false)));
}
