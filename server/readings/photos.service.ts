import type { SessionUser } from '#shared/api/auth';
import { audit } from '../audit/audit.service';
import type { Deps } from '../deps';
import { AppError, notFound } from '../http/errors';

export const PHOTO_MAX_BYTES = 5 * 1024 * 1024;

/** The file's first bytes decide its type (ASVS 12.2.1); the name and the declared type do not. */
export function sniffImage(b: Buffer): 'image/jpeg' | 'image/png' | 'image/webp' | null {
  if (b.length > 3 && b[0] === 0xff && b[1] === 0xd8 && b[2] === 0xff) return 'image/jpeg';
  if (b.length > 8 && b.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]))) return 'image/png';
  if (b.length > 12 && b.toString('ascii', 0, 4) === 'RIFF' && b.toString('ascii', 8, 12) === 'WEBP') return 'image/webp';
  return null;
}

async function readingOfPlant(d: Deps, user: SessionUser, readingId: string): Promise<void> {
  const args: unknown[] = [readingId, user.plantId];
  const viewerJob = user.role === 'viewer' ? ' AND p.job_id = $3' : '';
  if (viewerJob) args.push(user.jobId);
  const rows: unknown[] = await d.ds.query(`SELECT 1 FROM reading r JOIN piece p ON p.id = r.piece_id WHERE r.id = $1 AND r.plant_id = $2${viewerJob}`, args);
  if (rows.length === 0) throw notFound('the reading');
}

/** Stores the photo of a reading once; sending it again (a retried upload) changes nothing. */
export async function attachPhoto(d: Deps, user: SessionUser, readingId: string, file: Buffer | undefined): Promise<{ created: boolean }> {
  await readingOfPlant(d, user, readingId);
  if (!file || file.length === 0) throw new AppError(400, 'validation_failed', 'attach the photo as the "photo" field of a multipart form', { photo: ['missing'] });
  const type = sniffImage(file);
  if (!type) throw new AppError(400, 'validation_failed', 'the photo must be a JPEG, PNG or WebP image', { photo: ['not a JPEG, PNG or WebP image'] });
  return d.ds.transaction(async (tx) => {
    const rows: unknown[] = await tx.query(
      `INSERT INTO reading_photo (reading_id, plant_id, content_type, size, bytes, uploaded_by) VALUES ($1, $2, $3, $4, $5, $6)
       ON CONFLICT (reading_id) DO NOTHING RETURNING reading_id`,
      [readingId, user.plantId, type, file.length, file, user.id],
    );
    if (rows.length) await audit(tx, { plantId: user.plantId, userId: user.id, action: 'attach-photo', entity: 'reading', entityId: readingId, after: { type, size: file.length } });
    return { created: rows.length > 0 };
  });
}

export async function readPhoto(d: Deps, user: SessionUser, readingId: string): Promise<{ type: string; bytes: Buffer }> {
  await readingOfPlant(d, user, readingId);
  const rows: Array<{ content_type: string; bytes: Buffer }> = await d.ds.query(`SELECT content_type, bytes FROM reading_photo WHERE reading_id = $1`, [readingId]);
  if (!rows[0]) throw notFound('a photo of this reading');
  return { type: rows[0].content_type, bytes: rows[0].bytes };
}
