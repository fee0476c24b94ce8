import type { Deps } from '../deps';
import { escapeHtml } from '../mail/mailer';
import { FLAG_LABELS, type FlagKind } from '#shared/projection/project';

/**
 * Sends the plant's QC managers one e-mail with every flag not yet announced, and marks them announced
 * in the same transaction: if the mail server refuses, nothing is marked and the queue tries again, so
 * no alert is lost; once sent and marked, a retry finds nothing and sends nothing.
 */
export async function sendDigest(d: Deps, plantId: string): Promise<number> {
  return d.ds.transaction(async (tx) => {
    const flags: Array<{ id: string; kind: FlagKind; reason: string; mark: string; piece_id: string; ship_date: string | null }> = await tx.query(
      `SELECT f.id, f.kind, f.reason, p.mark, p.id AS piece_id, p.ship_date::text AS ship_date
         FROM piece_flag f JOIN piece p ON p.id = f.piece_id
        WHERE f.plant_id = $1 AND f.notified_at IS NULL AND f.cleared_at IS NULL
        ORDER BY p.ship_date NULLS LAST, f.severity DESC, p.mark
        FOR UPDATE OF f SKIP LOCKED`,
      [plantId],
    );
    if (flags.length === 0) return 0;
    const to: Array<{ email: string }> = await tx.query(
      `SELECT email FROM app_user WHERE plant_id = $1 AND role = 'qc_manager' AND active AND password_hash IS NOT NULL ORDER BY email`,
      [plantId],
    );
    const [plant] = (await tx.query(`SELECT name FROM plant WHERE id = $1`, [plantId])) as Array<{ name: string }>;
    if (to.length === 0) {
      d.log.warn({ plantId }, 'flags raised but the plant has no active QC manager to tell');
      return 0;
    }
    const link = (pieceId: string): string => `${d.cfg.publicUrl}/pieces/${pieceId}`;
    const lines = flags.map((f) => `• ${f.mark}${f.ship_date ? ` (ships ${f.ship_date})` : ''} — ${FLAG_LABELS[f.kind]}: ${f.reason}\n  ${link(f.piece_id)}`);
    const items = flags
      .map((f) => `<li><a href="${escapeHtml(link(f.piece_id))}">${escapeHtml(f.mark)}</a>${f.ship_date ? ` (ships ${escapeHtml(f.ship_date)})` : ''} — <strong>${escapeHtml(FLAG_LABELS[f.kind])}</strong>: ${escapeHtml(f.reason)}</li>`)
      .join('');
    const pieces = new Set(flags.map((f) => f.piece_id)).size;
    await d.mailer.send({
      to: to.map((u) => u.email).join(', '),
      subject: `Crownwatch: ${flags.length} new flag${flags.length === 1 ? '' : 's'} on ${pieces} piece${pieces === 1 ? '' : 's'} at ${plant?.name ?? 'your plant'}`,
      text: `New flags since the last digest, by ship date:\n\n${lines.join('\n')}\n\nOpen the review list: ${d.cfg.publicUrl}/review\n\nCrownwatch supports, and does not replace, the engineer of record, the plant's quality manual and the governing codes.`,
      html: `<p>New flags since the last digest, by ship date:</p><ul>${items}</ul><p><a href="${escapeHtml(`${d.cfg.publicUrl}/review`)}">Open the review list</a></p><p><small>Crownwatch supports, and does not replace, the engineer of record, the plant's quality manual and the governing codes.</small></p>`,
    });
    await tx.query(`UPDATE piece_flag SET notified_at = now() WHERE id = ANY($1::uuid[])`, [flags.map((f) => f.id)]);
    return flags.length;
  });
}
