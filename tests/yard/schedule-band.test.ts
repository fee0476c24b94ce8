import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { predict } from '#shared/camber/predict';
import { DEMO_DESIGNS } from '#seed/designs';
import { ageAt, checkReading } from '#shared/yard/band-check';
import { dateInZone, readingDue } from '#shared/yard/schedule';

describe('reading schedule: at release, then at set ages (plant setting; the ages are common practice)', () => {
  const base = { castDate: '2026-11-01', releaseDate: '2026-11-02', ages: [7, 14, 28] };
  it('when nothing is scheduled yet (before release), then nothing is due', () => {
    expect(readingDue({ ...base, lastReadingDate: null, today: '2026-11-01' })).toMatchObject({ due: false, dueSince: null });
  });
  it('when the release reading is missing, then it is due from the release date', () => {
    expect(readingDue({ ...base, lastReadingDate: null, today: '2026-11-02' })).toMatchObject({ due: true, dueSince: '2026-11-02', overdue: false });
  });
  it('when the 7-day reading was taken, then nothing is due until day 14', () => {
    expect(readingDue({ ...base, lastReadingDate: '2026-11-08', today: '2026-11-12' }).due).toBe(false);
    expect(readingDue({ ...base, lastReadingDate: '2026-11-08', today: '2026-11-15' })).toMatchObject({ due: true, dueSince: '2026-11-15' });
  });
  it('when a due reading waits more than two days, then it is overdue', () => {
    expect(readingDue({ ...base, lastReadingDate: '2026-11-08', today: '2026-11-18' })).toMatchObject({ due: true, overdue: true, daysWaiting: 3 });
  });
  it('dates are taken in the plant time zone', () => {
    expect(dateInZone(new Date('2026-12-02T03:00:00Z'), 'America/Chicago')).toBe('2026-12-01');
    expect(dateInZone(new Date('2026-12-02T03:00:00Z'), 'Europe/Berlin')).toBe('2026-12-02');
  });
});

describe('instant band check (the engine on the tablet)', () => {
  const spec = DEMO_DESIGNS.find((d) => d.code === 'DT28-60')!.spec;
  const takenAt = new Date('2026-11-29T13:00:00Z');
  const age = ageAt('2026-11-01', takenAt);
  const r = predict({ ...spec, agesDays: [age] }).points[0]!;
  const mm = (inches: number): number => inches * 25.4;
  it('a reading equal to the prediction is inside the band', () => {
    const c = checkReading({ spec, castDate: '2026-11-01', takenAt, valueMm: mm(r.camber), support: 'dunnage' });
    expect(c.verdict).toBe('in-band');
    expect(c.ageDays).toBeCloseTo(28 + 13 / 24, 9);
    expect(c.differenceMm).toBeCloseTo(0, 9);
  });
  it('a reading between the band and the tolerance limit is outside the band only', () => {
    const between = (r.high + r.toleranceHigh) / 2;
    expect(r.high).toBeLessThan(r.toleranceHigh);
    expect(checkReading({ spec, castDate: '2026-11-01', takenAt, valueMm: mm(between), support: 'dunnage' }).verdict).toBe('outside-band');
  });
  it('a reading past the tolerance limit is outside tolerance', () => {
    expect(checkReading({ spec, castDate: '2026-11-01', takenAt, valueMm: mm(r.toleranceLow - 0.1), support: 'dunnage' }).verdict).toBe('outside-tolerance');
  });
  it('a piece on the bed is compared with the end-support prediction (less camber than on dunnage, reference §6.3)', () => {
    const onBed = checkReading({ spec, castDate: '2026-11-01', takenAt, valueMm: 0, support: 'bed' });
    const onDunnage = checkReading({ spec, castDate: '2026-11-01', takenAt, valueMm: 0, support: 'dunnage' });
    expect(onBed.predictedMm).toBeLessThan(onDunnage.predictedMm);
  });
  it('works for an SI design', () => {
    const si = JSON.parse(readFileSync('shared/camber/examples/bridge-girder-si.json', 'utf8'));
    const c = checkReading({ spec: si, castDate: '2026-11-01', takenAt, valueMm: 100, support: 'dunnage', overhangMm: 900 });
    expect(c.predictedMm).toBeGreaterThan(50);
  });
});
