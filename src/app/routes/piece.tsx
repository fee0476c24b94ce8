import { useQuery } from '@tanstack/react-query';
import { Link, useParams } from 'react-router';
import { CAN } from '#shared/api/roles';
import { Caution } from '../../components/ui/caution';
import { StatusBadge } from '../../components/ui/status-badge';
import { meQuery } from '../../features/auth/api';
import { pieceQuery } from '../../features/pieces/api';
import { ReadingsTable } from '../../features/pieces/components/readings-table';
import { ReadingEntry } from '../../features/readings/components/reading-entry';
import { QueuePanel } from '../../features/readings/components/queue-panel';
import type { DesignSpec } from '#shared/api/designs';
import { ageDays } from '../../lib/format';

export function PiecePage() {
  const { id } = useParams();
  const { data: me } = useQuery(meQuery);
  const { data } = useQuery(pieceQuery(id!));
  if (!data || !me) return null;
  const { piece, design, readings } = data;
  const spec = design.spec as { length?: number; units?: string };
  return (
    <article aria-labelledby="piece-title">
      <p className="no-print mb-2">
        <Link className="underline" to="/">
          ← All pieces
        </Link>
      </p>
      <div className="mb-4 flex flex-wrap items-center gap-3">
        <h1 id="piece-title" className="text-3xl font-semibold">
          {piece.mark}
        </h1>
        <StatusBadge status={piece.status} />
      </div>
      <div className="mb-6 grid gap-4 md:grid-cols-2">
        <section className="card" aria-labelledby="design-title">
          <h2 id="design-title" className="mb-2 text-xl font-semibold">
            Design
          </h2>
          <dl className="grid grid-cols-2 gap-x-4 gap-y-1">
            <dt className="text-concrete-700">Design</dt>
            <dd>
              {design.code} (version {design.version})
            </dd>
            <dt className="text-concrete-700">Description</dt>
            <dd>{design.name}</dd>
            <dt className="text-concrete-700">Product</dt>
            <dd>{design.productType.replace('-', ' ')}</dd>
            <dt className="text-concrete-700">Length</dt>
            <dd>
              {spec.length} {spec.units === 'si' ? 'm' : 'ft'}
            </dd>
          </dl>
        </section>
        <section className="card" aria-labelledby="schedule-title">
          <h2 id="schedule-title" className="mb-2 text-xl font-semibold">
            Schedule
          </h2>
          <dl className="grid grid-cols-2 gap-x-4 gap-y-1">
            <dt className="text-concrete-700">Job</dt>
            <dd>{piece.jobNumber}</dd>
            <dt className="text-concrete-700">Bed</dt>
            <dd>{piece.bed ?? '—'}</dd>
            <dt className="text-concrete-700">Cast</dt>
            <dd>
              {piece.castDate} (age {ageDays(piece.castDate)} days)
            </dd>
            <dt className="text-concrete-700">Released</dt>
            <dd>{piece.releaseDate}</dd>
            <dt className="text-concrete-700">Ship date</dt>
            <dd>{piece.shipDate ?? '—'}</dd>
            <dt className="text-concrete-700">Erection</dt>
            <dd>
              {piece.erectionDate ?? '—'}
              {piece.bay ? ` · ${piece.bay}, position ${piece.bayPosition}` : ''}
            </dd>
          </dl>
        </section>
      </div>
      {CAN.logReading.includes(me.role) && piece.status !== 'shipped' && (
        <div className="mb-6 grid gap-3">
          <QueuePanel />
          <ReadingEntry piece={piece} spec={design.spec as DesignSpec} unit={me.unitSystem === 'us' ? 'in' : 'mm'} />
        </div>
      )}
      <section aria-labelledby="readings-title">
        <h2 id="readings-title" className="mb-2 text-xl font-semibold">
          Readings
        </h2>
        <ReadingsTable readings={readings} unit={me.unitSystem} timeZone={me.timeZone} />
      </section>
      <Caution />
    </article>
  );
}
