import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A revision of each piece's page (`GET /api/pieces/:id`), so the server can keep pages it has built and
 * check one with a single indexed lookup instead of building it again (README, Performance).
 *
 * `piece_page.rev` counts the changes to what the page shows of one piece: the piece row, its readings,
 * their photos and its decisions. It has its own table, not a column of `piece`: an update of `piece`
 * refreshes the piece's review-list row, which a new reading must not cost. No row means revision 0.
 * `plant.page_gen` counts the rarer changes that reach many pages at once: an inspector's name, the
 * plant's time zone (the "likely distorted" hour), a job's number, a design's name or spec.
 *
 * Rows are written in piece order, so two imports touching the same pieces take their locks alike.
 */
const BUMP = (pieces: string): string => `
    INSERT INTO piece_page (piece_id, rev)
    SELECT x.piece_id, 1 FROM (${pieces}) x ORDER BY x.piece_id
    ON CONFLICT (piece_id) DO UPDATE SET rev = piece_page.rev + 1;
    RETURN NULL;`;

const FUNCTIONS: Array<[string, string]> = [
  ['piece_page_bump_by_piece_id', BUMP('SELECT DISTINCT piece_id FROM changed')],
  ['piece_page_bump_by_id', BUMP('SELECT DISTINCT id AS piece_id FROM changed')],
  ['piece_page_bump_by_photo', BUMP('SELECT DISTINCT r.piece_id FROM changed c JOIN reading r ON r.id = c.reading_id')],
];

/** [table, event, function]: statement triggers over the changed rows. */
const TRIGGERS: Array<[string, 'INSERT' | 'UPDATE' | 'DELETE', string]> = [
  ['piece', 'UPDATE', 'piece_page_bump_by_id'],
  ['reading', 'INSERT', 'piece_page_bump_by_piece_id'],
  ['reading', 'UPDATE', 'piece_page_bump_by_piece_id'],
  ['reading', 'DELETE', 'piece_page_bump_by_piece_id'],
  ['reading_photo', 'INSERT', 'piece_page_bump_by_photo'],
  ['reading_photo', 'DELETE', 'piece_page_bump_by_photo'],
  ['decision', 'INSERT', 'piece_page_bump_by_piece_id'],
  ['decision', 'UPDATE', 'piece_page_bump_by_piece_id'],
  ['decision', 'DELETE', 'piece_page_bump_by_piece_id'],
];

const triggerName = (table: string, event: string): string => `piece_page_${table}_${event.toLowerCase()}`;

export class PiecePageRevision1797465600000 implements MigrationInterface {
  name = 'PiecePageRevision1797465600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`CREATE TABLE piece_page (piece_id uuid PRIMARY KEY REFERENCES piece(id) ON DELETE CASCADE, rev bigint NOT NULL)`);
    await q.query(`ALTER TABLE plant ADD COLUMN page_gen bigint NOT NULL DEFAULT 0`);
    for (const [fn, body] of FUNCTIONS) await q.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN ${body} END $$`);
    for (const [table, event, fn] of TRIGGERS) {
      await q.query(
        `CREATE TRIGGER ${triggerName(table, event)} AFTER ${event} ON ${table}
           REFERENCING ${event === 'DELETE' ? 'OLD' : 'NEW'} TABLE AS changed FOR EACH STATEMENT EXECUTE FUNCTION ${fn}()`,
      );
    }
    // The plant-wide generation: row triggers on rare edits, and only when a shown value changes.
    await q.query(`CREATE FUNCTION piece_page_plant_gen() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN UPDATE plant SET page_gen = page_gen + 1 WHERE id = NEW.plant_id; RETURN NULL; END $$`);
    await q.query(`CREATE TRIGGER piece_page_user_name AFTER UPDATE OF name ON app_user FOR EACH ROW
      WHEN (OLD.name IS DISTINCT FROM NEW.name) EXECUTE FUNCTION piece_page_plant_gen()`);
    await q.query(`CREATE TRIGGER piece_page_job AFTER UPDATE ON job FOR EACH ROW
      WHEN (OLD.number IS DISTINCT FROM NEW.number) EXECUTE FUNCTION piece_page_plant_gen()`);
    await q.query(`CREATE TRIGGER piece_page_design AFTER UPDATE ON member_design FOR EACH ROW
      WHEN (OLD.* IS DISTINCT FROM NEW.*) EXECUTE FUNCTION piece_page_plant_gen()`);
    await q.query(`CREATE FUNCTION piece_page_plant_zone() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN NEW.page_gen := OLD.page_gen + 1; RETURN NEW; END $$`);
    await q.query(`CREATE TRIGGER piece_page_plant_zone BEFORE UPDATE OF time_zone ON plant FOR EACH ROW
      WHEN (OLD.time_zone IS DISTINCT FROM NEW.time_zone) EXECUTE FUNCTION piece_page_plant_zone()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER piece_page_plant_zone ON plant`);
    await q.query(`DROP TRIGGER piece_page_design ON member_design`);
    await q.query(`DROP TRIGGER piece_page_job ON job`);
    await q.query(`DROP TRIGGER piece_page_user_name ON app_user`);
    await q.query(`DROP FUNCTION piece_page_plant_zone()`);
    await q.query(`DROP FUNCTION piece_page_plant_gen()`);
    for (const [table, event] of TRIGGERS) await q.query(`DROP TRIGGER ${triggerName(table, event)} ON ${table}`);
    for (const [fn] of FUNCTIONS) await q.query(`DROP FUNCTION ${fn}()`);
    await q.query(`ALTER TABLE plant DROP COLUMN page_gen`);
    await q.query(`DROP TABLE piece_page`);
  }
}
