import { MM_PER_IN } from './units';

/** What the yard typed, understood: the canonical value in millimetres and the unit it was read in. */
export interface TapeValue {
  mm: number;
  unit: 'in' | 'mm';
  /** The value as the person typed it, trimmed. */
  text: string;
}

export class TapeParseError extends Error {
  readonly code = 'tape_parse';
  constructor(message: string) {
    super(message);
    this.name = 'TapeParseError';
  }
}

// Tape measures in the US are graduated in halves to sixteenths (common practice); anything finer
// is not a tape reading and more likely a typing slip.
const ALLOWED_DENOMINATORS = new Set([2, 4, 8, 16]);

const VULGAR: Record<string, string> = {
  '½': '1/2', '¼': '1/4', '¾': '3/4', '⅛': '1/8', '⅜': '3/8', '⅝': '5/8', '⅞': '7/8',
};

function normalise(raw: string): string {
  // Vulgar fractions first: NFKC would turn "1⅜" into "13⁄8".
  let s = raw;
  for (const [glyph, frac] of Object.entries(VULGAR)) s = s.replaceAll(glyph, ` ${frac}`);
  s = s.normalize('NFKC').trim();
  s = s.replace(/\u2044/g, '/').replace(/[\u2212\u2013\u2012]/g, '-');
  s = s.replace(/[\u2032\u2019]/g, "'").replace(/[\u2033\u201d]|''/g, '"');
  return s.replace(/\s+/g, ' ').trim();
}

const NUM = String.raw`\d+(?:\.\d+)?|\.\d+`;
const INCH_UNIT = String.raw`(?:"|in\.?|inch(?:es)?)`;
// 1 3/8 · 1-3/8 · 3/8 · 1.375
const INCH_BODY = String.raw`(\d+)[ -](\d+)\/(\d+)|(\d+)\/(\d+)|(${NUM})`;
const FEET_INCH = new RegExp(String.raw`^(\d+) ?' ?-? ?(?:(?:${INCH_BODY}) ?${INCH_UNIT}?)?$`, 'i');
const INCHES = new RegExp(String.raw`^(?:${INCH_BODY}) ?(${INCH_UNIT})?$`, 'i');
const METRIC = new RegExp(String.raw`^(${NUM}) ?(mm|cm|m)$`, 'i');

function fraction(numText: string, denText: string, text: string): number {
  const num = Number(numText);
  const den = Number(denText);
  if (!ALLOWED_DENOMINATORS.has(den)) {
    throw new TapeParseError(`"${text}": a tape fraction is in halves, quarters, eighths or sixteenths, not /${den}`);
  }
  if (num >= den) throw new TapeParseError(`"${text}": the fraction ${num}/${den} is not less than one`);
  return num / den;
}

/** Inches from the capture groups of INCH_BODY starting at index `at`. */
function inchesFrom(m: RegExpMatchArray, at: number, text: string): number {
  if (m[at] !== undefined) return Number(m[at]) + fraction(m[at + 1]!, m[at + 2]!, text);
  if (m[at + 3] !== undefined) return fraction(m[at + 3]!, m[at + 4]!, text);
  if (m[at + 5] !== undefined) return Number(m[at + 5]);
  return 0;
}

/**
 * Parses a camber reading as typed in the yard: `1 3/8`, `1-3/8"`, `⅜`, `0' 1 3/8"`, `1.375 in`,
 * `35 mm`, `3.5 cm`. A bare number is read in `defaultUnit`. Throws TapeParseError, and nothing else.
 */
export function parseTape(raw: string, defaultUnit: 'in' | 'mm' = 'in'): TapeValue {
  if (typeof raw !== 'string') throw new TapeParseError('a reading must be text');
  const text = raw.trim();
  if (text === '') throw new TapeParseError('the reading is empty');
  if (text.length > 40) throw new TapeParseError('the reading is too long to be a tape value');
  let s = normalise(text);
  let sign = 1;
  if (s.startsWith('-') || s.startsWith('+')) {
    sign = s.startsWith('-') ? -1 : 1;
    s = s.slice(1).trim();
  }
  const metric = METRIC.exec(s);
  if (metric) {
    const factor = { mm: 1, cm: 10, m: 1000 }[metric[2]!.toLowerCase() as 'mm' | 'cm' | 'm'];
    return { mm: sign * Number(metric[1]) * factor, unit: 'mm', text };
  }
  const feet = FEET_INCH.exec(s);
  if (feet) {
    const inches = Number(feet[1]) * 12 + inchesFrom(feet, 2, text);
    return { mm: sign * inches * MM_PER_IN, unit: 'in', text };
  }
  const inch = INCHES.exec(s);
  if (inch) {
    const value = inchesFrom(inch, 1, text);
    const hasFraction = inch[1] !== undefined || inch[4] !== undefined;
    const unitGiven = inch[7] !== undefined;
    if (!unitGiven && !hasFraction && defaultUnit === 'mm') return { mm: sign * value, unit: 'mm', text };
    return { mm: sign * value * MM_PER_IN, unit: 'in', text };
  }
  throw new TapeParseError(
    `"${text}" is not a reading we understand; write it like 1 3/8, 1-3/8", 1.375 in or 35 mm`,
  );
}

function gcd(a: number, b: number): number {
  return b === 0 ? a : gcd(b, a % b);
}

/** Formats a length in whole sixteenths of an inch, e.g. `-1 3/8 in` (reduced fraction). */
export function formatSixteenths(sixteenths: number): string {
  const n = Math.round(sixteenths);
  const sign = n < 0 ? '-' : '';
  const abs = Math.abs(n);
  const whole = Math.floor(abs / 16);
  const rem = abs % 16;
  if (rem === 0) return `${sign}${whole} in`;
  const g = gcd(rem, 16);
  const frac = `${rem / g}/${16 / g}`;
  return whole === 0 ? `${sign}${frac} in` : `${sign}${whole} ${frac} in`;
}

/** Nearest 1/16 in of a value in millimetres. */
export const mmToSixteenths = (mm: number): number => Math.round((mm / MM_PER_IN) * 16);

/** Formats a length given in mm for display in the plant's unit: nearest 1/16 in or 1 mm. */
export function formatLength(mm: number, unit: 'in' | 'mm'): string {
  if (unit === 'mm') {
    const r = Math.round(mm);
    return `${r === 0 ? 0 : r} mm`;
  }
  return formatSixteenths(mmToSixteenths(mm));
}

/** The echo shown before saving: "1 3/8 in = 34.9 mm". */
export function echoTape(v: TapeValue): string {
  if (v.unit === 'mm') return `${round(v.mm, 1)} mm = ${formatSixteenths(mmToSixteenths(v.mm))}`;
  return `${formatSixteenths(mmToSixteenths(v.mm))} = ${round(v.mm, 1)} mm`;
}

const round = (v: number, digits: number): string => {
  const r = Number(v.toFixed(digits));
  return (Object.is(r, -0) ? 0 : r).toFixed(digits);
};
