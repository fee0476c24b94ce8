// The hot reads (piece page, piece list, review list) have PostgreSQL build their JSON: Node then sends
// one text column instead of parsing rows, dates and nested JSON only to serialise them again, which
// measured as most of those requests' CPU (README, Performance). The shapes are the zod contracts in
// shared/api; the API tests parse every such response with them.

/** A response body already serialised as JSON, whose shape is `T`: the route sends it as is. */
export class JsonText<T = unknown> {
  declare readonly shape?: T;
  constructor(readonly text: string) {}
  /** The value, for the few callers that use it in Node (reports). */
  value(): T {
    return JSON.parse(this.text) as T;
  }
}

/** A timestamptz as JavaScript's `toISOString()` writes it (UTC, milliseconds, `Z`), whatever the session's time zone. */
export const isoSql = (col: string): string => `to_char(${col} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.MS"Z"')`;

/** A numeric column as a JSON number without trailing zeros (numeric(12,6) prints 33.337500). */
export const numSql = (col: string): string => `${col}::float8`;
