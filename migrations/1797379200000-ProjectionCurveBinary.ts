import type { MigrationInterface, QueryRunner } from 'typeorm';

/** The fields of a stored curve point, in their stored order (server/projections/stored-result.ts). */
const FIELDS = ['ageDays', 'camberMm', 'lowMm', 'highMm', 'toleranceLowMm', 'toleranceHighMm', 'calibratedMm', 'calibratedLowMm', 'calibratedHighMm'];

/**
 * A stored curve becomes binary: point after point, its nine values (FIELDS) as 4-byte floats, big-endian
 * (float4send's order), each a value to 0.01 as before. Writing a curve as JSON (nine named numbers
 * per point, formatted in Node and parsed again by PostgreSQL) made a night on which every curve changes
 * (the first night, a changed setting, a new engine) cost twice a typical one, measured; as binary it
 * costs about as much as a typical night. Stored out of line and not compressed: floats barely
 * compress, and trying cost CPU on every write. The result hashes, taken over the stored form, all
 * change with it: the first night after this migration rewrites every curve once.
 */
export class ProjectionCurveBinary1797379200000 implements MigrationInterface {
  name = 'ProjectionCurveBinary1797379200000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`ALTER TABLE projection ADD COLUMN curve_f32 bytea`);
    const values = FIELDS.map((f, j) => `(${j}, e.p->>'${f}')`).join(', ');
    await q.query(`
      UPDATE projection SET curve_f32 = coalesce((
        SELECT string_agg(float4send(round(f.v::numeric, 2)::float4), ''::bytea ORDER BY e.i, f.j)
          FROM jsonb_array_elements(curve) WITH ORDINALITY AS e(p, i) CROSS JOIN LATERAL (VALUES ${values}) AS f(j, v)), ''::bytea)`);
    await q.query(`ALTER TABLE projection DROP COLUMN curve`);
    await q.query(`ALTER TABLE projection RENAME COLUMN curve_f32 TO curve`);
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET NOT NULL`);
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET STORAGE EXTERNAL`);
  }

  async down(q: QueryRunner): Promise<void> {
    // float4 from its four bytes: sign, exponent and fraction of IEEE 754 single precision (no SQL cast
    // reads a float from bytea). The stored values are normal numbers or zero.
    await q.query(`
      CREATE FUNCTION pg_temp.f32_at(b bytea, k int) RETURNS float8 LANGUAGE sql IMMUTABLE AS $$
        SELECT CASE WHEN bits & 2147483647 = 0 THEN 0::float8 ELSE
                 (CASE WHEN bits < 0 THEN -1 ELSE 1 END) * (1 + (bits & 8388607) / 8388608.0)::float8 * power(2::float8, ((bits >> 23) & 255) - 127) END
          FROM (SELECT (get_byte(b, k) << 24) | (get_byte(b, k + 1) << 16) | (get_byte(b, k + 2) << 8) | get_byte(b, k + 3) AS bits) x
      $$`);
    await q.query(`ALTER TABLE projection ADD COLUMN curve_json jsonb`);
    const fields = FIELDS.map((f, j) => `'${f}', round(pg_temp.f32_at(curve, n * ${FIELDS.length * 4} + ${j * 4})::numeric, 2)`).join(', ');
    await q.query(`
      UPDATE projection SET curve_json = coalesce((
        SELECT jsonb_agg(jsonb_build_object(${fields}) ORDER BY n)
          FROM generate_series(0, length(curve) / ${FIELDS.length * 4} - 1) AS n), '[]'::jsonb)`);
    await q.query(`ALTER TABLE projection DROP COLUMN curve`);
    await q.query(`ALTER TABLE projection RENAME COLUMN curve_json TO curve`);
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET NOT NULL`);
    await q.query(`ALTER TABLE projection ALTER COLUMN curve SET COMPRESSION lz4`);
  }
}
