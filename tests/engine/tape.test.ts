import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { echoTape, formatLength, formatSixteenths, mmToSixteenths, parseTape, TapeParseError } from '#shared/camber/tape';

const inches = (s: string, unit: 'in' | 'mm' = 'in'): number => parseTape(s, unit).mm / 25.4;

describe('tape readings as typed in the yard (1 in = 25.4 mm exactly, NIST SP 811)', () => {
  it.each([
    ['1 3/8', 1.375], ['1-3/8', 1.375], ['1 3/8"', 1.375], ['1-3/8"', 1.375], ['1-3/8 in', 1.375], ['1 3/8 inches', 1.375],
    ["0' 1 3/8\"", 1.375], ["0'-1 3/8\"", 1.375], ['1.375', 1.375], ['1.375 in', 1.375], ['3/8', 0.375], ['⅜', 0.375],
    ['1⅜', 1.375], ['1 ⅜″', 1.375], ['2', 2], ['-1/4', -0.25], ['−1/4', -0.25], ["1' 2\"", 14], ['1 1/16', 1.0625],
  ])('"%s" → %s in', (text, expected) => {
    expect(inches(text)).toBeCloseTo(expected, 12);
  });
  it.each([
    ['35 mm', 35], ['35mm', 35], ['3.5 cm', 35], ['0.035 m', 35], ['-4 mm', -4],
  ])('"%s" → %s mm', (text, mm) => {
    expect(parseTape(text).mm).toBeCloseTo(mm, 12);
    expect(parseTape(text).unit).toBe('mm');
  });
  it('a bare number follows the plant unit; a fraction is always inches', () => {
    expect(parseTape('35', 'mm').mm).toBe(35);
    expect(parseTape('1 3/8', 'mm').unit).toBe('in');
  });
  it.each(['', 'abc', '1 3/7', '1/3', '5/4', '1 1/32', '1..3', '1 3/8 mm', '3/0', '1 3/', "'", '12 ft'])('"%s" is refused with a message', (text) => {
    expect(() => parseTape(text)).toThrow(TapeParseError);
  });
  it('the refusal says what is wrong', () => {
    expect(() => parseTape('1 3/7')).toThrow(/sixteenths, not \/7/);
  });
  it('echoes what it understood: 1 3/8 in = 34.9 mm', () => {
    expect(echoTape(parseTape('1-3/8"'))).toBe('1 3/8 in = 34.9 mm');
    expect(echoTape(parseTape('35 mm'))).toBe('35.0 mm = 1 3/8 in');
  });
  it('formats to the nearest 1/16 in or 1 mm', () => {
    expect(formatLength(34.925, 'in')).toBe('1 3/8 in');
    expect(formatLength(34.6, 'mm')).toBe('35 mm');
    expect(formatSixteenths(-4)).toBe('-1/4 in');
    expect(formatSixteenths(0)).toBe('0 in');
  });
});

describe('tape parser properties (fast-check, engineering reference C.11 style)', () => {
  it('parse(format(n)) = n for every whole number of sixteenths in ±10⁶', () => {
    fc.assert(fc.property(fc.integer({ min: -1_000_000, max: 1_000_000 }), (n) => mmToSixteenths(parseTape(formatSixteenths(n)).mm) === n), { numRuns: 2000 });
  });
  it('parse is odd: parse("-" + s) = −parse(s)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 100_000 }), (n) => {
      const s = formatSixteenths(n);
      return parseTape(`-${s}`).mm === -parseTape(s).mm;
    }), { numRuns: 1000 });
  });
  it('parse is monotonic in the value', () => {
    fc.assert(fc.property(fc.integer({ min: -50_000, max: 50_000 }), fc.integer({ min: -50_000, max: 50_000 }), (a, b) => {
      fc.pre(a !== b);
      const [x, y] = a < b ? [a, b] : [b, a];
      return parseTape(formatSixteenths(x)).mm < parseTape(formatSixteenths(y)).mm;
    }), { numRuns: 1000 });
  });
  it('arbitrary text either parses to a finite number or throws TapeParseError, never anything else', () => {
    fc.assert(fc.property(fc.oneof(fc.string(), fc.string({ unit: 'binary' }), fc.stringMatching(/^[-0-9 ./"'a-z⅜½]{0,12}$/)), (s) => {
      try {
        return Number.isFinite(parseTape(s).mm);
      } catch (e) {
        return e instanceof TapeParseError;
      }
    }), { numRuns: 3000 });
  });
});
