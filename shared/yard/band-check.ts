// The instant answer after a yard reading: where it falls against the piece's expected band and
// tolerance limits at its age. Pure, so the tablet can answer offline with the server's engine.
import type { DesignSpec } from '../api/designs';
import { predict } from '../camber/predict';
import { MM_PER_IN } from '../camber/units';

export type Verdict = 'in-band' | 'outside-band' | 'outside-tolerance';

export interface BandCheck {
  verdict: Verdict;
  ageDays: number;
  predictedMm: number;
  lowMm: number;
  highMm: number;
  toleranceLowMm: number;
  toleranceHighMm: number;
  /** Positive when the reading is above the prediction. */
  differenceMm: number;
}

const DAY = 86_400_000;

/** Age in days from the casting date (midnight UTC of that date) to an instant. */
export const ageAt = (castDate: string, at: Date): number => (at.getTime() - Date.parse(`${castDate}T00:00:00Z`)) / DAY;

export function checkReading(p: {
  spec: DesignSpec;
  castDate: string;
  takenAt: Date;
  valueMm: number;
  support: 'bed' | 'dunnage' | 'truck';
  overhangMm?: number;
}): BandCheck {
  const releaseAge = Number(p.spec.concrete.releaseAgeDays ?? 1);
  const age = Math.max(releaseAge, ageAt(p.castDate, p.takenAt));
  const si = p.spec.units === 'si';
  const overhang = p.overhangMm === undefined ? undefined : si ? p.overhangMm / 1000 : p.overhangMm / MM_PER_IN / 12;
  const storage =
    p.support === 'bed' ? [] : overhang !== undefined ? [{ fromAgeDays: releaseAge, overhang }] : (p.spec.supports?.storage ?? []);
  const r = predict({ ...p.spec, supports: { storage }, agesDays: [age] });
  const point = r.points[0]!;
  const toMm = (v: number): number => (r.unitOfCamber === 'mm' ? v : v * MM_PER_IN);
  const c = { predictedMm: toMm(point.camber), lowMm: toMm(point.low), highMm: toMm(point.high), toleranceLowMm: toMm(point.toleranceLow), toleranceHighMm: toMm(point.toleranceHigh) };
  const verdict: Verdict =
    p.valueMm < c.toleranceLowMm || p.valueMm > c.toleranceHighMm ? 'outside-tolerance' : p.valueMm < c.lowMm || p.valueMm > c.highMm ? 'outside-band' : 'in-band';
  return { verdict, ageDays: age, ...c, differenceMm: p.valueMm - c.predictedMm };
}
