// The plant's reading schedule: a reading at release, then at set ages after casting. Dates are plain
// calendar dates (YYYY-MM-DD) in the plant's time zone.
import { dateFormat } from '../time/formatters';

/** Ages (days after casting) at which a reading is due after the one at release; plants may change them. */
export const DEFAULT_READING_AGES = [7, 14, 28, 56, 90, 120, 180];
/** Days a due reading may wait before it counts as overdue. */
export const OVERDUE_AFTER_DAYS = 2;

const DAY = 86_400_000;
const toDay = (iso: string): number => Math.floor(Date.parse(`${iso.slice(0, 10)}T00:00:00Z`) / DAY);
const fromDay = (d: number): string => new Date(d * DAY).toISOString().slice(0, 10);

export interface DueState {
  /** The scheduled date the piece is now answering to, or null before release. */
  dueSince: string | null;
  /** No reading on or after dueSince. */
  due: boolean;
  /** Whole days the due reading has waited. */
  daysWaiting: number;
  overdue: boolean;
}

export function readingDue(p: { castDate: string; releaseDate: string; lastReadingDate: string | null; today: string; ages?: number[] }): DueState {
  const today = toDay(p.today);
  const cast = toDay(p.castDate);
  const dates = [toDay(p.releaseDate), ...(p.ages ?? DEFAULT_READING_AGES).map((a) => cast + a)].filter((d) => d <= today).sort((a, b) => a - b);
  const latest = dates.at(-1);
  if (latest === undefined) return { dueSince: null, due: false, daysWaiting: 0, overdue: false };
  const last = p.lastReadingDate ? toDay(p.lastReadingDate) : null;
  const due = last === null || last < latest;
  const daysWaiting = due ? today - latest : 0;
  return { dueSince: fromDay(latest), due, daysWaiting, overdue: due && daysWaiting > OVERDUE_AFTER_DAYS };
}

const ISO_DATE: Intl.DateTimeFormatOptions = { year: 'numeric', month: '2-digit', day: '2-digit' };

/** Today's date in a time zone, as YYYY-MM-DD. */
export const dateInZone = (d: Date, timeZone: string): string =>
  dateFormat('en-CA', ISO_DATE, timeZone).format(d);
