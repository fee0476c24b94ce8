// Wall-clock times in the plant's time zone, converted to instants without guessing: a time that does
// not exist (the hour skipped when clocks go forward) is refused instead of silently moved, and a time
// that exists twice (the hour repeated when clocks go back) takes the first.

const formatters = new Map<string, Intl.DateTimeFormat>();
const formatter = (timeZone: string): Intl.DateTimeFormat => {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f;
};

const parts = (utcMs: number, timeZone: string): number[] => {
  const f = formatter(timeZone);
  const p = Object.fromEntries(f.formatToParts(new Date(utcMs)).map((x) => [x.type, x.value]));
  return [Number(p.year), Number(p.month), Number(p.day), Number(p.hour), Number(p.minute), Number(p.second)];
};

// Offsets change on whole hours (the clock changes of the zones a plant uses), so the offset of a local
// hour is worked out once and reused for every minute in it: an import of 100,000 rows asks Intl a few
// thousand times instead of a few hundred thousand.
const hourOffsets = new Map<string, number | null>();

/** The instant of a wall-clock time in `timeZone`, or null when that time does not exist there. */
export function zonedToUtc(y: number, mo: number, d: number, h: number, mi: number, s: number, timeZone: string): Date | null {
  const key = `${timeZone}|${y}-${mo}-${d} ${h}`;
  let offset = hourOffsets.get(key);
  if (offset === undefined) {
    const atHour = exactZonedToUtc(y, mo, d, h, 0, 0, timeZone);
    offset = atHour === null ? null : Date.UTC(y, mo - 1, d, h, 0, 0) - atHour.getTime();
    if (hourOffsets.size > 100_000) hourOffsets.clear();
    hourOffsets.set(key, offset);
  }
  return offset === null ? null : new Date(Date.UTC(y, mo - 1, d, h, mi, s) - offset);
}

function exactZonedToUtc(y: number, mo: number, d: number, h: number, mi: number, s: number, timeZone: string): Date | null {
  const wall = Date.UTC(y, mo - 1, d, h, mi, s);
  const offsetAt = (utc: number): number => {
    const [py, pmo, pd, ph, pmi, ps] = parts(utc, timeZone) as [number, number, number, number, number, number];
    return Date.UTC(py, pmo - 1, pd, ph, pmi, ps) - utc;
  };
  const candidates = [wall - offsetAt(wall - 12 * 3600_000), wall - offsetAt(wall + 12 * 3600_000)].sort((a, b) => a - b);
  for (const utc of candidates) {
    const [py, pmo, pd, ph, pmi, ps] = parts(utc, timeZone);
    if (py === y && pmo === mo && pd === d && ph === h && pmi === mi && ps === s) return new Date(utc);
  }
  return null;
}

const LOCAL = /^(\d{4})-(\d{2})-(\d{2})(?:[ T](\d{2}):(\d{2})(?::(\d{2}))?)?$/;
const WITH_OFFSET = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(?::\d{2}(?:\.\d+)?)?(?:Z|[+-]\d{2}:\d{2})$/;

/**
 * Reads a date and time from a CSV cell: `YYYY-MM-DD HH:mm[:ss]` in the plant's time zone (or a date
 * alone, taken as 07:00), or ISO 8601 with an offset. Anything else (03/04/2026 could be March or April)
 * is refused with the reason.
 */
export function parseLocalDateTime(text: string, timeZone: string, defaultHour = 7): { at: Date } | { error: string } {
  const t = text.trim();
  if (WITH_OFFSET.test(t)) {
    const at = new Date(t);
    return Number.isNaN(at.getTime()) ? { error: `"${t}" is not a real date and time` } : { at };
  }
  const m = LOCAL.exec(t);
  if (!m) return { error: `"${t}" is not a date we read without guessing; write it as YYYY-MM-DD HH:mm` };
  const [y, mo, d, h, mi, s] = [m[1], m[2], m[3], m[4] ?? String(defaultHour), m[5] ?? '0', m[6] ?? '0'].map(Number) as [number, number, number, number, number, number];
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || s > 59) return { error: `"${t}" is not a real date and time` };
  const probe = new Date(Date.UTC(y, mo - 1, d));
  if (probe.getUTCMonth() !== mo - 1) return { error: `"${t}" is not a real date` };
  const at = zonedToUtc(y, mo, d, h, mi, s, timeZone);
  if (!at) return { error: `${t} does not exist in ${timeZone} (the clocks skip that hour); check the time` };
  return { at };
}

/** A calendar date cell: YYYY-MM-DD only. */
export function parseDateCell(text: string): { date: string } | { error: string } {
  const t = text.trim();
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(t);
  if (!m) return { error: `"${t}" is not a date in the form YYYY-MM-DD` };
  const d = new Date(`${t}T00:00:00Z`);
  if (Number.isNaN(d.getTime()) || d.toISOString().slice(0, 10) !== t) return { error: `"${t}" is not a real date` };
  return { date: t };
}
