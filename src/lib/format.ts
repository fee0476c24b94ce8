import { formatLength } from '#shared/camber/tape';
import { dateFormat } from '#shared/time/formatters';

export const camberText = (mm: number, unit: 'us' | 'si'): string => formatLength(mm, unit === 'us' ? 'in' : 'mm');

const DATE_TIME: Intl.DateTimeFormatOptions = { dateStyle: 'medium', timeStyle: 'short' };

export const dateTimeText = (iso: string, timeZone: string): string =>
  dateFormat('en-US', DATE_TIME, timeZone).format(new Date(iso));

export const ageDays = (fromIsoDate: string, at: Date = new Date()): number =>
  Math.floor((at.getTime() - new Date(`${fromIsoDate}T00:00:00Z`).getTime()) / 86_400_000);
