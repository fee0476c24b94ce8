/**
 * TypeORM's postgres driver returns `[rows, affectedCount]` for UPDATE and DELETE, and plain rows for
 * SELECT and INSERT; this gives the rows either way.
 */
export function rowsOf<T>(result: unknown): T[] {
  if (Array.isArray(result) && result.length === 2 && Array.isArray(result[0]) && typeof result[1] === 'number') return result[0] as T[];
  return result as T[];
}
