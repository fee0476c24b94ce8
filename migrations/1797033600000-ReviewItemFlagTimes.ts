import type { MigrationInterface, QueryRunner } from 'typeorm';
import { REFRESH } from './1796515200000-ReviewItem';
import { refreshFunction } from './1796860800000-ReviewItemRefresh';

const RAISED_AT = `'raisedAt', f.raised_at)`;
/** A flag's time as the API writes times (UTC, milliseconds, `Z`), fixed when the row is written. */
const RAISED_AT_ISO = `'raisedAt', to_char(f.raised_at AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"'))`;

/** The refresh with ISO flag times (also restored by ReviewItemDoc's down). */
export function refreshWithIsoTimes(): string {
  if (!REFRESH.includes(RAISED_AT)) throw new Error('the review summary refresh no longer has the flag time to replace');
  return refreshFunction(REFRESH.replace(RAISED_AT, RAISED_AT_ISO));
}

/**
 * The flags of `review_item` keep their times as the API's ISO text, so the review list sends them as
 * stored; it used to take every flag apart and format its time on each request (half of the list's
 * database time, measured).
 */
export class ReviewItemFlagTimes1797033600000 implements MigrationInterface {
  name = 'ReviewItemFlagTimes1797033600000';

  async up(q: QueryRunner): Promise<void> {
    await q.query(refreshWithIsoTimes());
    await q.query(`SELECT review_item_refresh(ARRAY(SELECT piece_id FROM review_item))`);
  }

  async down(q: QueryRunner): Promise<void> {
    await q.query(refreshFunction(REFRESH));
    await q.query(`SELECT review_item_refresh(ARRAY(SELECT piece_id FROM review_item))`);
  }
}
