import { formatLength } from '#shared/camber/tape';
import { dateFormat } from '#shared/time/formatters';

export const camberText = (mm: number, unit: 'us' | 'si'): string => formatLength(mm, unit === 'us' ? 'in' : 'mm');

export const dateTimeText = (iso: string, timeZone: string): string =>
  dateFormat('en-US', { dateStyle: 'medium', timeStyle: 'short', timeZone }).format(new Date(iso));

export const ageDays = (fromIsoDate: string, at: Date = new Date()): number =>
  Math.floor((at.getTime() - new Date(`${fromIsoDate}T00:00:00Z`).getTime()) / 86_400_000);
