import 'reflect-metadata';
import { DataSource } from 'typeorm';
import { Initial1796169600000 } from '../../migrations/1796169600000-Initial';
import { ReadingPhoto1796256000000 } from '../../migrations/1796256000000-ReadingPhoto';
import { Projections1796342400000 } from '../../migrations/1796342400000-Projections';
import { EngineeringDesk1796428800000 } from '../../migrations/1796428800000-EngineeringDesk';
import { ReviewItem1796515200000 } from '../../migrations/1796515200000-ReviewItem';
import { ProjectionBatch1796601600000 } from '../../migrations/1796601600000-ProjectionBatch';
import { PieceListIndexes1796688000000 } from '../../migrations/1796688000000-PieceListIndexes';
import { ProjectionResultHash1796774400000 } from '../../migrations/1796774400000-ProjectionResultHash';
import { ReviewItemRefresh1796860800000 } from '../../migrations/1796860800000-ReviewItemRefresh';
import { ReviewCount1796947200000 } from '../../migrations/1796947200000-ReviewCount';
import { ReviewItemFlagTimes1797033600000 } from '../../migrations/1797033600000-ReviewItemFlagTimes';
import { SessionUserNotify1797120000000 } from '../../migrations/1797120000000-SessionUserNotify';
import { ReviewItemDoc1797206400000 } from '../../migrations/1797206400000-ReviewItemDoc';
import { ReadingLiveIndex1797292800000 } from '../../migrations/1797292800000-ReadingLiveIndex';
import { ProjectionCurveBinary1797379200000 } from '../../migrations/1797379200000-ProjectionCurveBinary';
import { PiecePageRevision1797465600000 } from '../../migrations/1797465600000-PiecePageRevision';
import { PieceCount1797552000000 } from '../../migrations/1797552000000-PieceCount';
import { ReviewItemShown1797638400000 } from '../../migrations/1797638400000-ReviewItemShown';
import { ReviewPageRevision1797724800000 } from '../../migrations/1797724800000-ReviewPageRevision';
import { AuditEvent } from '../audit/audit-event.entity';
import { AuthToken } from '../auth/auth-token.entity';
import { Decision } from '../decisions/decision.entity';
import { MemberDesign } from '../designs/design.entity';
import { Job } from '../pieces/job.entity';
import { Piece } from '../pieces/piece.entity';
import { Plant } from '../plants/plant.entity';
import { Reading } from '../readings/reading.entity';
import { ReadingPhoto } from '../readings/reading-photo.entity';
import { User } from '../users/user.entity';

// Entities and migrations are listed, not globbed, so the bundle and the reader both see them.
export const ENTITIES = [Plant, Job, User, AuthToken, MemberDesign, Piece, Reading, ReadingPhoto, Decision, AuditEvent];
export const MIGRATIONS = [Initial1796169600000, ReadingPhoto1796256000000, Projections1796342400000, EngineeringDesk1796428800000, ReviewItem1796515200000, ProjectionBatch1796601600000, PieceListIndexes1796688000000, ProjectionResultHash1796774400000, ReviewItemRefresh1796860800000, ReviewCount1796947200000, ReviewItemFlagTimes1797033600000, SessionUserNotify1797120000000, ReviewItemDoc1797206400000, ReadingLiveIndex1797292800000, ProjectionCurveBinary1797379200000, PiecePageRevision1797465600000, PieceCount1797552000000, ReviewItemShown1797638400000, ReviewPageRevision1797724800000];

export function createDataSource(url: string, poolSize = 10): DataSource {
  return new DataSource({
    type: 'postgres',
    url,
    entities: ENTITIES,
    migrations: MIGRATIONS,
    synchronize: false,
    migrationsRun: false,
    logging: false,
    // A database that does not answer fails a request within 2 s (a 503), instead of hanging it.
    extra: { max: poolSize, connectionTimeoutMillis: 2000 },
  });
}
