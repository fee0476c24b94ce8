import { useQuery } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { Link, useParams } from 'react-router';
import { DECISION_LABELS } from '#shared/api/review';
import { projectionQuery } from '../../features/review/api';
import { DecisionForm } from '../../features/review/components/decision-form';
import { FlagList } from '../../features/review/components/flag-list';
import { camberText, dateTimeText } from '../../lib/format';
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

const CamberChart = lazy(() => import('../../features/pieces/components/camber-chart'));

export function PiecePage() {
  const { id } = useParams();
  const { data: me } = useQuery(meQuery);
  const { data } = useQuery(pieceQuery(id!));
  const { data: proj } = useQuery(projectionQuery(id!));
  if (!data || !me) return null;
  const { piece, design, readings, decisions } = data;
  const deciders = ['qc_manager', 'engineer', 'admin'];
  const p = proj?.projection;
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
        <a className="btn-quiet no-print ml-auto" href={`/api/reports/pieces/${piece.id}`} target="_blank" rel="noreferrer">
          Camber report (PDF)
        </a>
        <button type="button" className="btn-quiet no-print" onClick={() => window.print()}>
          Print this page
        </button>
      </div>
      <div className="mb-6 grid gap-4 lg:grid-cols-3">
        <section className="card lg:col-span-2" aria-labelledby="chart-title">
          <h2 id="chart-title" className="mb-2 text-xl font-semibold">
            Camber with age
          </h2>
          {p ? (
            <Suspense fallback={<p>Drawing the chart…</p>}>
              <CamberChart curve={p.curve} readings={readings} castDate={piece.castDate} shipDate={piece.shipDate} erectionDate={piece.erectionDate} unit={me.unitSystem} />
            </Suspense>
          ) : (
            <p>{proj?.failure ? `The projection failed: ${proj.failure}` : 'The projection for this piece has not run yet.'}</p>
          )}
          {p && (
            <dl className="mt-3 grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
              <dt className="text-concrete-700">At ship date</dt>
              <dd>{p.atShip ? `${camberText(p.atShip.mm, me.unitSystem)} (${camberText(p.atShip.lowMm, me.unitSystem)} to ${camberText(p.atShip.highMm, me.unitSystem)})` : '—'}</dd>
              <dt className="text-concrete-700">At erection</dt>
              <dd>{p.atErection ? `${camberText(p.atErection.mm, me.unitSystem)} (${camberText(p.atErection.lowMm, me.unitSystem)} to ${camberText(p.atErection.highMm, me.unitSystem)})` : '—'}</dd>
              <dt className="text-concrete-700">Growth factor</dt>
              <dd>
                {p.growthFactor.toFixed(2)} ± {p.growthFactorSd.toFixed(2)} ({p.note})
              </dd>
              <dt className="text-concrete-700">Method · computed</dt>
              <dd>
                {p.method} · {dateTimeText(p.computedAt, me.timeZone)}
              </dd>
            </dl>
          )}
        </section>
        <section className="card" aria-labelledby="flags-title">
          <h2 id="flags-title" className="mb-2 text-xl font-semibold">
            Flags
          </h2>
          <FlagList flags={proj?.flags ?? []} />
        </section>
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
      <div className="mb-6 grid gap-4 md:grid-cols-2">
        {deciders.includes(me.role) && piece.status !== 'shipped' && (
          <DecisionForm pieceId={piece.id} version={piece.version} role={me.role} flagged={(proj?.flags ?? []).some((f) => f.severity >= 2)} />
        )}
        <section className="card" aria-labelledby="decisions-title">
          <h2 id="decisions-title" className="mb-2 text-xl font-semibold">
            Decisions
          </h2>
          {decisions.length === 0 ? (
            <p>No decision yet.</p>
          ) : (
            <ol className="grid gap-2">
              {decisions.map((x) => (
                <li key={x.id} className="border-l-4 border-concrete-400 pl-3">
                  <p className="font-semibold">{DECISION_LABELS[x.kind as keyof typeof DECISION_LABELS] ?? x.kind}</p>
                  <p className="text-sm">
                    {x.decidedBy} · {dateTimeText(x.decidedAt, me.timeZone)}
                  </p>
                  {x.comment && <p>{x.comment}</p>}
                </li>
              ))}
            </ol>
          )}
        </section>
      </div>
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
