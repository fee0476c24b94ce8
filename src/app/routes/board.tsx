import { useQuery } from '@tanstack/react-query';
import { lazy, Suspense } from 'react';
import { Link } from 'react-router';
import { PIECE_STATUS_LABELS } from '#shared/api/pieces';
import { FLAG_LABELS } from '#shared/projection/project';
import { Caution } from '../../components/ui/caution';
import { Icon } from '../../components/ui/icon';
import { StatusBadge } from '../../components/ui/status-badge';
import { boardQuery } from '../../features/review/api';

const RatioHistogram = lazy(() => import('../../features/board/components/ratio-histogram'));

/** The first page for QC managers and engineers: the yard at a glance. */
export function BoardPage() {
  const { data } = useQuery(boardQuery);
  if (!data) return null;
  const flagged = data.byFlag.reduce((a, f) => a + f.count, 0);
  return (
    <section aria-labelledby="board-title">
      <h1 id="board-title" className="mb-4 text-2xl font-semibold">
        Yard board · {data.today}
      </h1>
      <div className="mb-6 grid gap-4 md:grid-cols-3">
        <section className="card" aria-labelledby="b-status">
          <h2 id="b-status" className="mb-2 text-lg font-semibold">Pieces by status</h2>
          <ul>{data.byStatus.map((s) => <li key={s.status} className="flex justify-between"><span>{PIECE_STATUS_LABELS[s.status]}</span><span className="font-semibold">{s.count}</span></li>)}</ul>
        </section>
        <section className="card" aria-labelledby="b-flags">
          <h2 id="b-flags" className="mb-2 text-lg font-semibold">Active flags ({flagged})</h2>
          <ul>{data.byFlag.map((f) => <li key={f.kind} className="flex justify-between"><Link className="underline" to={`/review?view=all-flagged&flag=${f.kind}`}>{FLAG_LABELS[f.kind]}</Link><span className="font-semibold">{f.count}</span></li>)}</ul>
          {flagged === 0 && <p className="flex items-center gap-2"><Icon name="check" /> No flags.</p>}
          <Link className="btn-quiet mt-3" to="/review">Open the review list</Link>
        </section>
        <section className="card" aria-labelledby="b-today">
          <h2 id="b-today" className="mb-2 text-lg font-semibold">Readings logged today</h2>
          <p className="text-4xl font-semibold">{data.readingsToday}</p>
        </section>
      </div>
      <div className="mb-6 grid gap-4 lg:grid-cols-2">
        <section className="card" aria-labelledby="b-ship">
          <h2 id="b-ship" className="mb-2 text-lg font-semibold">Due to ship this week ({data.shippingThisWeek.length})</h2>
          {data.shippingThisWeek.length === 0 ? <p>Nothing is planned to ship in the next seven days.</p> : (
            <table className="w-full text-left text-sm">
              <thead><tr><th className="py-1">Piece</th><th>Ships</th><th>State</th><th>Open flags</th></tr></thead>
              <tbody>
                {data.shippingThisWeek.map((p) => (
                  <tr key={p.pieceId} className="border-t border-concrete-100">
                    <td className="py-1"><Link className="font-semibold underline" to={`/pieces/${p.pieceId}`}>{p.mark}</Link> <span>{p.jobNumber}</span></td>
                    <td>{p.shipDate}</td>
                    <td><StatusBadge status={p.status} /></td>
                    <td>{p.flags ? <span className="inline-flex items-center gap-1 font-semibold"><Icon name="warning" className="h-4 w-4" />{p.flags}{p.decided ? ' (decided)' : ''}</span> : 'none'}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </section>
        <section className="card" aria-labelledby="b-ratio">
          <h2 id="b-ratio" className="mb-2 text-lg font-semibold">Measured ÷ predicted camber</h2>
          <Suspense fallback={<p>Drawing…</p>}><RatioHistogram ratios={data.ratios} /></Suspense>
        </section>
      </div>
      <Caution />
    </section>
  );
}
