import type { MigrationInterface, QueryRunner } from 'typeorm';

/**
 * A notification on every change to users and plants, so each server process can keep who a signed-in
 * user is in memory and empty it at once when that may have changed (server/auth/session-users).
 */
export class SessionUserNotify1797120000000 implements MigrationInterface {
  name = 'SessionUserNotify1797120000000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(`
      CREATE FUNCTION session_users_changed() RETURNS trigger LANGUAGE plpgsql AS $$
      BEGIN
        PERFORM pg_notify('cw_session_users', '');
        RETURN NULL;
      END $$`);
    // A new user is in no cache; any other change may alter a cached one.
    await q.query(`CREATE TRIGGER session_users_changed AFTER UPDATE OR DELETE OR TRUNCATE ON app_user FOR EACH STATEMENT EXECUTE FUNCTION session_users_changed()`);
    await q.query(`CREATE TRIGGER session_users_changed AFTER UPDATE OR DELETE OR TRUNCATE ON plant FOR EACH STATEMENT EXECUTE FUNCTION session_users_changed()`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(`DROP TRIGGER session_users_changed ON plant`);
    await q.query(`DROP TRIGGER session_users_changed ON app_user`);
    await q.query(`DROP FUNCTION session_users_changed()`);
  }
}
