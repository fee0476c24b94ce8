// The predicted curve of one member as a function of age, for the projection job and the charts: each
// age gives the elastic and time-dependent parts, the expected band and the tolerance limits (inches).
import { camberAt, timelineOf } from './growth';
import { bandOf, toleranceOf } from './predict';
import { prepareMember } from './prepare';
import type { PredictParsed } from './schema';
import { bandHalfWidth } from './tolerance';

export interface CurveState {
  camber: number;
  elastic: number;
  growth: number;
  low: number;
  high: number;
  toleranceLow: number;
  toleranceHigh: number;
}

export interface MemberCurve {
  releaseAge: number;
  lengthFt: number;
  band: { release: number; growth: number; measurement: number; z: number };
  tolerance: number;
  at(ageDays: number, supportsOverride?: 'bed'): CurveState;
}

export function memberCurve(input: PredictParsed): MemberCurve {
  const m = prepareMember(input);
  const tl = timelineOf(m);
  const onBed = { supports: [], loads: tl.loads };
  const band = bandOf(input);
  const tol = toleranceOf(input, m.lengthFt).plusMinus;
  return {
    releaseAge: m.releaseAge,
    lengthFt: m.lengthFt,
    band,
    tolerance: tol,
    at(age, supportsOverride) {
      const s = camberAt(m, supportsOverride === 'bed' ? onBed : tl, age);
      const half = bandHalfWidth(s.elastic, s.growth, band);
      return { camber: s.camber, elastic: s.elastic, growth: s.growth, low: s.camber - half, high: s.camber + half, toleranceLow: s.camber - tol, toleranceHigh: s.camber + tol };
    },
  };
}
