// Lengths as a printed report shows them: inches with vulgar fractions and the inch sign (1⅜″), true
// minus signs (−) and ± for tolerances; millimetres for SI plants.
import { MM_PER_IN } from './units';

const EIGHTHS = ['', '⅛', '¼', '⅜', '½', '⅝', '¾', '⅞'];

export function prettyLength(mm: number, unit: 'in' | 'mm'): string {
  if (unit === 'mm') {
    const r = Math.round(mm);
    return `${r < 0 ? '−' : ''}${Math.abs(r)} mm`;
  }
  const n = Math.round((mm / MM_PER_IN) * 16);
  const sign = n < 0 ? '−' : '';
  const abs = Math.abs(n);
  const whole = Math.floor(abs / 16);
  const rem = abs % 16;
  let frac = '';
  if (rem % 2 === 0) frac = EIGHTHS[rem / 2]!;
  else frac = `${rem}⁄16`;
  if (whole === 0 && !frac) return '0″';
  if (whole === 0) return `${sign}${frac}″`;
  return `${sign}${whole}${frac ? (rem % 2 === 0 ? frac : ` ${frac}`) : ''}″`;
}

export const prettySigned = (mm: number, unit: 'in' | 'mm'): string => (mm > 0 ? `+${prettyLength(mm, unit)}` : prettyLength(mm, unit));
export const prettyTolerance = (mm: number, unit: 'in' | 'mm'): string => `± ${prettyLength(Math.abs(mm), unit)}`;
