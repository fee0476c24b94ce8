import { LRUCache } from 'lru-cache';
import type { DataSource } from 'typeorm';

/** A piece page as built, with the revision it was built at (`piece_page.rev` and `plant.page_gen`). */
export interface BuiltPage { stamp: string; body: string }

/**
 * Piece pages the server has built, per database, the most recently used kept up to 16 million characters
 * (some 1,400 pages of twenty readings, 16 MB). An entry is only used after a lookup of the piece's
 * current revision agrees with it (migration PiecePageRevision), so every server process answers the
 * same as the database, whatever another process wrote.
 */
const caches = new WeakMap<DataSource, LRUCache<string, BuiltPage>>();

export function piecePages(ds: DataSource): LRUCache<string, BuiltPage> {
  let c = caches.get(ds);
  if (!c) caches.set(ds, (c = new LRUCache<string, BuiltPage>({ maxSize: 16_000_000, sizeCalculation: (p) => p.body.length + p.stamp.length })));
  return c;
}
