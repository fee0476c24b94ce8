// Exact unit factors. 1 in = 25.4 mm and 1 lbf = 4.4482216152605 N are definitions
// (NIST SP 811, Appendix B), so every factor below is exact or derived from those two.
export const MM_PER_IN = 25.4;
export const IN_PER_FT = 12;
export const MM_PER_M = 1000;
export const N_PER_LBF = 4.4482216152605;
export const KN_PER_KIP = N_PER_LBF; // 1 kip = 1000 lbf = 4.4482216152605 kN
export const MPA_PER_PSI = N_PER_LBF / (MM_PER_IN * MM_PER_IN); // 0.006894757293168...
export const MPA_PER_KSI = MPA_PER_PSI * 1000;
export const KG_M3_PER_PCF = (0.45359237 * 1e9) / Math.pow(MM_PER_IN * IN_PER_FT, 3); // lb/ft³ → kg/m³
export const GRAVITY = 9.80665; // m/s², standard gravity (CGPM 1901)

export type UnitSystem = 'us' | 'si';

export const inToMm = (v: number): number => v * MM_PER_IN;
export const mmToIn = (v: number): number => v / MM_PER_IN;
export const ftToIn = (v: number): number => v * IN_PER_FT;
export const mToIn = (v: number): number => (v * MM_PER_M) / MM_PER_IN;
export const inToM = (v: number): number => (v * MM_PER_IN) / MM_PER_M;
export const mpaToKsi = (v: number): number => v / MPA_PER_KSI;
export const ksiToMpa = (v: number): number => v * MPA_PER_KSI;
export const knToKip = (v: number): number => v / KN_PER_KIP;
export const kipToKn = (v: number): number => v * KN_PER_KIP;
export const kgm3ToPcf = (v: number): number => v / KG_M3_PER_PCF;
export const pcfToKgm3 = (v: number): number => v * KG_M3_PER_PCF;
export const mm2ToIn2 = (v: number): number => v / (MM_PER_IN * MM_PER_IN);
export const mm4ToIn4 = (v: number): number => v / Math.pow(MM_PER_IN, 4);
export const in4ToMm4 = (v: number): number => v * Math.pow(MM_PER_IN, 4);
export const in2ToMm2 = (v: number): number => v * MM_PER_IN * MM_PER_IN;
/** kN/m → kip/in */
export const knPerMToKipPerIn = (v: number): number => knToKip(v) * (MM_PER_IN / MM_PER_M);
/** kip/ft → kip/in */
export const kipPerFtToKipPerIn = (v: number): number => v / IN_PER_FT;

/** Length of a camber value in the user's display unit (in or mm) from inches. */
export const camberOut = (inches: number, units: UnitSystem): number =>
  units === 'si' ? inToMm(inches) : inches;
