import { describe, expect, it } from 'vitest';
import { dateFormat } from '#shared/time/formatters';

const HOUR: Intl.DateTimeFormatOptions = { hour: 'numeric', hourCycle: 'h23' };

describe('kept date formatters', () => {
  it('when the same options are used for two time zones, then each zone gets its own formatter, made once', () => {
    const at = new Date('2026-12-02T03:00:00Z');
    // IANA zones (common practice): Chicago is UTC−6 in December, Berlin UTC+1.
    expect(dateFormat('en-GB', HOUR, 'America/Chicago').format(at)).toBe('21');
    expect(dateFormat('en-GB', HOUR, 'Europe/Berlin').format(at)).toBe('04');
    expect(dateFormat('en-GB', HOUR, 'America/Chicago')).toBe(dateFormat('en-GB', HOUR, 'America/Chicago'));
    expect(dateFormat('en-GB', HOUR, 'America/Chicago')).not.toBe(dateFormat('en-GB', HOUR, 'Europe/Berlin'));
  });
});
