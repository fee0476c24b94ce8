import type { MigrationInterface, QueryRunner } from 'typeorm';

/** One optional photo per reading, kept in the database with the record it documents. */
export class ReadingPhoto1796256000000 implements MigrationInterface {
  name = 'ReadingPhoto1796256000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE TABLE reading_photo (
        reading_id uuid PRIMARY KEY REFERENCES reading(id),
        plant_id uuid NOT NULL REFERENCES plant(id),
        content_type text NOT NULL CHECK (content_type IN ('image/jpeg', 'image/png', 'image/webp')),
        size integer NOT NULL CHECK (size > 0 AND size <= 5242880),
        bytes bytea NOT NULL,
        uploaded_by uuid NOT NULL REFERENCES app_user(id),
        created_at timestamptz NOT NULL DEFAULT now()
      )`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TABLE reading_photo`);
  }
}
