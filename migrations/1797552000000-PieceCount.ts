import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * The piece list's totals without counting the plant's pieces on every request (50,000 index entries,
 * most of the list's time: README, Performance). `piece_count` holds how many pieces each (plant, job,
 * design, status) has, as rows of deltas appended by statement-level triggers on `piece`, the way
 * `review_count` does it: writers never wait on a shared counter row. A total is the sum of the rows
 * its filters select; `piece_count_compact()` folds them (after each projection batch). An update only
 * counts when it moves a piece to another job, design or status: other changes cancel out.
 */
const DELTA = (rows: string): string => `
    INSERT INTO piece_count (plant_id, job_id, design_id, status, n)
    SELECT plant_id, job_id, design_id, status, sum(n) FROM (${rows}) x
     GROUP BY plant_id, job_id, design_id, status
    HAVING sum(n) <> 0;
    RETURN NULL;`;

const FUNCTIONS: Array<[string, string]> = [
  ['piece_count_insert', DELTA('SELECT plant_id, job_id, design_id, status, 1 AS n FROM new_rows')],
  ['piece_count_delete', DELTA('SELECT plant_id, job_id, design_id, status, -1 AS n FROM old_rows')],
  ['piece_count_update', DELTA(`SELECT plant_id, job_id, design_id, status, 1 AS n FROM new_rows
                                 UNION ALL SELECT plant_id, job_id, design_id, status, -1 FROM old_rows`)],
];

export class PieceCount1797552000000 implements MigrationInterface {
  name = 'PieceCount1797552000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE piece_count (
        plant_id uuid NOT NULL REFERENCES plant(id) ON DELETE CASCADE,
        job_id uuid NOT NULL,
        design_id uuid NOT NULL,
        status text NOT NULL,
        n integer NOT NULL
      )`);
    await q.query(`CREATE INDEX piece_count_plant_idx ON piece_count (plant_id)`);
    for (const [fn, body] of FUNCTIONS) await q.query(`CREATE FUNCTION ${fn}() RETURNS trigger LANGUAGE plpgsql AS $$ BEGIN ${body} END $$`);
    await q.query(`CREATE TRIGGER piece_count_insert AFTER INSERT ON piece REFERENCING NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION piece_count_insert()`);
    await q.query(`CREATE TRIGGER piece_count_update AFTER UPDATE ON piece REFERENCING OLD TABLE AS old_rows NEW TABLE AS new_rows FOR EACH STATEMENT EXECUTE FUNCTION piece_count_update()`);
    await q.query(`CREATE TRIGGER piece_count_delete AFTER DELETE ON piece REFERENCING OLD TABLE AS old_rows FOR EACH STATEMENT EXECUTE FUNCTION piece_count_delete()`);
    await q.query(`
      CREATE FUNCTION piece_count_compact() RETURNS void LANGUAGE sql VOLATILE AS $$
        WITH gone AS (DELETE FROM piece_count RETURNING plant_id, job_id, design_id, status, n)
        INSERT INTO piece_count (plant_id, job_id, design_id, status, n)
        SELECT plant_id, job_id, design_id, status, sum(n) FROM gone GROUP BY plant_id, job_id, design_id, status HAVING sum(n) <> 0;
      $$`);
    await q.query(`
      INSERT INTO piece_count (plant_id, job_id, design_id, status, n)
      SELECT plant_id, job_id, design_id, status, count(*) FROM piece GROUP BY plant_id, job_id, design_id, status`);
  }

  async down(q: QueryRunner): Promise<void> {
    for (const t of ['insert', 'update', 'delete']) await q.query(`DROP TRIGGER piece_count_${t} ON piece`);
    for (const [fn] of FUNCTIONS) await q.query(`DROP FUNCTION ${fn}()`);
    await q.query(`DROP FUNCTION piece_count_compact()`);
    await q.query(`DROP TABLE piece_count`);
  }
}
