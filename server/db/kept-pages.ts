import { LRUCache } from 'lru-cache';
import type { DataSource } from 'typeorm';

/** A page as built, with the revision of what it shows that it was built at. */
export interface BuiltPage { stamp: string; body: string }

/**
 * Pages the server has built, per database and kind, the most recently used kept up to a number of
 * characters: piece pages 16 million (some 1,400 pages of twenty readings, 16 MB; revision: migration
 * PiecePageRevision), review-list pages 4 million (some 170 pages of 50 rows; revision: migration
 * ReviewPageRevision). A kept page is only sent after a lookup of the current revision in the database
 * agrees with it, so every server process answers the same as the database, whatever another wrote.
 */
const SIZES = { piece: 16_000_000, review: 4_000_000 } as const;
export type PageKind = keyof typeof SIZES;

const caches = new WeakMap<DataSource, Map<PageKind, LRUCache<string, BuiltPage>>>();

export function keptPages(ds: DataSource, kind: PageKind): LRUCache<string, BuiltPage> {
  let kinds = caches.get(ds);
  if (!kinds) caches.set(ds, (kinds = new Map()));
  let c = kinds.get(kind);
  if (!c) kinds.set(kind, (c = new LRUCache<string, BuiltPage>({ maxSize: SIZES[kind], sizeCalculation: (p) => p.body.length + p.stamp.length })));
  return c;
}

/** Characters kept in all kinds of pages (the soak benchmark reports them beside the heap). */
export const keptSize = (ds: DataSource): number => (['piece', 'review'] as const).reduce((n, k) => n + keptPages(ds, k).calculatedSize, 0);
