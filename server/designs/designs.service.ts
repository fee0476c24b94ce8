import type { z } from 'zod';
import type { SessionUser } from '#shared/api/auth';
import type { bulkPiecesSchema, designInputSchema, DesignRow, designUpdateSchema } from '#shared/api/designs';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { AppError, conflict, notFound } from '../http/errors';

type DesignInput = z.output<typeof designInputSchema>;
type DesignUpdate = z.output<typeof designUpdateSchema>;
type BulkPieces = z.output<typeof bulkPiecesSchema>;

const SELECT = `SELECT d.id, d.code, d.name, d.product_type, d.version, d.spec, d.created_at, (SELECT count(*)::int FROM piece p WHERE p.design_id = d.id) AS pieces FROM member_design d`;
const toRow = (r: Record<string, unknown>): DesignRow => ({
  id: String(r.id), code: String(r.code), name: String(r.name), productType: String(r.product_type), version: Number(r.version), pieces: Number(r.pieces), spec: r.spec, createdAt: new Date(r.created_at as string).toISOString(),
});

export async function listDesigns(d: Deps, user: SessionUser): Promise<DesignRow[]> {
  const rows: Array<Record<string, unknown>> = await d.ds.query(`${SELECT} WHERE d.plant_id = $1 ORDER BY d.code, d.version DESC`, [user.plantId]);
  return rows.map(toRow);
}

export async function getDesign(d: Deps, user: SessionUser, id: string): Promise<DesignRow> {
  const rows: Array<Record<string, unknown>> = await d.ds.query(`${SELECT} WHERE d.id = $1 AND d.plant_id = $2`, [id, user.plantId]);
  if (!rows[0]) throw notFound('the design');
  return toRow(rows[0]);
}

export async function createDesign(d: Deps, user: SessionUser, input: DesignInput): Promise<DesignRow> {
  const taken: unknown[] = await d.ds.query(`SELECT 1 FROM member_design WHERE plant_id = $1 AND lower(code) = lower($2)`, [user.plantId, input.code]);
  if (taken.length) throw conflict(`a design ${input.code} already exists; edit it or choose another code`);
  const [row] = await d.ds.query(
    `INSERT INTO member_design (plant_id, code, name, product_type, version, spec, created_by) VALUES ($1, $2, $3, $4, 1, $5, $6) RETURNING id`,
    [user.plantId, input.code, input.name, input.spec.productType ?? 'double-tee', JSON.stringify(input.spec), user.id],
  );
  await audit(d.ds, { plantId: user.plantId, userId: user.id, action: 'create', entity: 'design', entityId: row.id, after: { code: input.code } });
  return getDesign(d, user, row.id);
}

/**
 * Edits a design. A design no piece uses is changed in place; one that pieces use gets a new version,
 * and those pieces keep the version they were cast with until the engineer re-assigns them.
 */
export async function updateDesign(d: Deps, user: SessionUser, id: string, input: DesignUpdate): Promise<DesignRow> {
  const current = await getDesign(d, user, id);
  const latest: Array<{ id: string }> = await d.ds.query(`SELECT id FROM member_design WHERE plant_id = $1 AND code = $2 ORDER BY version DESC LIMIT 1`, [user.plantId, current.code]);
  if (latest[0]?.id !== id) throw conflict('only the latest version of a design can be edited');
  if (current.pieces === 0) {
    await d.ds.query(`UPDATE member_design SET name = $2, spec = $3, product_type = $4 WHERE id = $1`, [id, input.name, JSON.stringify(input.spec), input.spec.productType ?? current.productType]);
    await audit(d.ds, { plantId: user.plantId, userId: user.id, action: 'update', entity: 'design', entityId: id, before: current.spec, after: input.spec });
    return getDesign(d, user, id);
  }
  const [row] = await d.ds.query(
    `INSERT INTO member_design (plant_id, code, name, product_type, version, spec, created_by) VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
    [user.plantId, current.code, input.name, input.spec.productType ?? current.productType, current.version + 1, JSON.stringify(input.spec), user.id],
  );
  await audit(d.ds, { plantId: user.plantId, userId: user.id, action: 'new-version', entity: 'design', entityId: row.id, before: { id, version: current.version }, after: { version: current.version + 1 } });
  return getDesign(d, user, row.id);
}

export async function copyDesign(d: Deps, user: SessionUser, id: string, code: string, name: string): Promise<DesignRow> {
  const src = await getDesign(d, user, id);
  return createDesign(d, user, { code, name, spec: src.spec as DesignInput['spec'] });
}

/** Moves pieces to another design version (audited); their projections are recomputed. */
export async function reassignPieces(d: Deps, user: SessionUser, pieceIds: string[], designId: string): Promise<{ moved: number }> {
  await getDesign(d, user, designId);
  const moved = await d.ds.transaction(async (tx) => {
    const rows: Array<{ id: string; design_id: string }> = await tx.query(`SELECT id, design_id FROM piece WHERE plant_id = $1 AND id = ANY($2::uuid[]) FOR UPDATE`, [user.plantId, pieceIds]);
    if (rows.length !== pieceIds.length) throw notFound('some of the pieces');
    await tx.query(`UPDATE piece SET design_id = $2, version = version + 1, updated_at = now() WHERE id = ANY($1::uuid[])`, [pieceIds, designId]);
    for (const r of rows) await audit(tx, { plantId: user.plantId, userId: user.id, action: 'reassign-design', entity: 'piece', entityId: r.id, before: { designId: r.design_id }, after: { designId } });
    return rows.length;
  });
  for (const id of pieceIds) await d.jobs?.projectPiece(id, 0);
  return { moved };
}

export async function createJob(d: Deps, user: SessionUser, number: string, name: string): Promise<{ id: string; number: string; name: string }> {
  const [row] = await d.ds.query(`INSERT INTO job (plant_id, number, name) VALUES ($1, $2, $3) ON CONFLICT (plant_id, number) DO NOTHING RETURNING id, number, name`, [user.plantId, number, name]);
  if (!row) throw conflict(`job ${number} already exists`);
  await audit(d.ds, { plantId: user.plantId, userId: user.id, action: 'create', entity: 'job', entityId: row.id, after: { number, name } });
  return row;
}

/** Adds pieces by a mark pattern (DT-{n}) and a count; a mark that exists in the job is refused, naming it. */
export async function addPieces(d: Deps, user: SessionUser, b: BulkPieces): Promise<{ created: string[] }> {
  const jobs: unknown[] = await d.ds.query(`SELECT 1 FROM job WHERE id = $1 AND plant_id = $2`, [b.jobId, user.plantId]);
  if (!jobs.length) throw new AppError(400, 'validation_failed', 'that job is not one of this plant', { jobId: ['unknown job'] });
  await getDesign(d, user, b.designId);
  const marks = Array.from({ length: b.count }, (_, i) => b.markPattern.replace('{n}', String(b.start + i)));
  const release = b.releaseDate ?? new Date(Date.parse(`${b.castDate}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
  return d.ds.transaction(async (tx) => {
    const taken: Array<{ mark: string }> = await tx.query(`SELECT mark FROM piece WHERE plant_id = $1 AND job_id = $2 AND mark = ANY($3::text[])`, [user.plantId, b.jobId, marks]);
    if (taken.length) throw conflict(`these marks already exist in the job: ${taken.map((t) => t.mark).join(', ')}`);
    const ids: string[] = [];
    for (const [i, mark] of marks.entries()) {
      const [row] = await tx.query(
        `INSERT INTO piece (plant_id, job_id, design_id, mark, bed, cast_date, release_date, ship_date, erection_date, bay, bay_position, status)
         VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, 'in_storage') RETURNING id`,
        [user.plantId, b.jobId, b.designId, mark, b.bed ?? null, b.castDate, release, b.shipDate ?? null, b.erectionDate ?? null, b.bay ?? null, b.bay ? i + 1 : null],
      );
      ids.push(row.id);
    }
    await audit(tx, { plantId: user.plantId, userId: user.id, action: 'add-pieces', entity: 'job', entityId: b.jobId, after: { marks } });
    return { created: ids };
  });
}
