import type { SessionUser } from '#shared/api/auth';
import type { PieceDetail } from '#shared/api/piece-detail';
import type { PieceProjection } from '#shared/api/review';
import { predict } from '#shared/camber/predict';
import type { Deps } from '../deps';
import { pieceDetail } from '../pieces/pieces.service';
import { pieceProjection } from '../projections/projection.query';

export interface PieceReportData {
  plantName: string;
  unit: 'in' | 'mm';
  timeZone: string;
  detail: PieceDetail;
  projection: PieceProjection;
  sources: string[];
}

/** What the camber report of one piece prints, read with the same plant and job checks as the screens. */
export async function pieceReportData(d: Deps, user: SessionUser, pieceId: string): Promise<PieceReportData> {
  const detail = (await pieceDetail(d, user, pieceId)).value();
  const projection = await pieceProjection(d, user, pieceId);
  let sources: string[] = [];
  try {
    sources = predict({ ...(detail.design.spec as object), agesDays: [1] }).sources;
  } catch {
    sources = ['the design could not be read by the engine'];
  }
  return { plantName: user.plantName, unit: user.unitSystem === 'si' ? 'mm' : 'in', timeZone: user.timeZone, detail, projection, sources };
}
