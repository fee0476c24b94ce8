import { stringify } from 'csv-stringify/sync';

// A text cell that starts with = + - @ Tab CR or LF is prefixed with ' so a spreadsheet shows it as text
// instead of running it (OWASP "CSV Injection"; ASVS 5.0 1.2.10). Numbers are passed as numbers and stay
// numbers: escaping them as strings would turn -0.125 into '-0.125 (the csv-stringify trap).
const TRIGGER = /^[=+\-@\t\r\n]/;
export const neutralise = (s: string): string => (TRIGGER.test(s) ? `'${s}` : s);

export type Cell = string | number | null | undefined;

export function toCsv(header: string[], rows: Cell[][]): string {
  return stringify([header, ...rows], {
    cast: { string: (v) => neutralise(v), number: (v) => String(v) },
    quoted_match: /[",\r\n]/,
    record_delimiter: 'unix',
  });
}
