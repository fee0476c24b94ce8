import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { useUrlParams } from '../../lib/use-url-params';
import { reviewFilters } from './review-filters';
import { FLAG_KINDS, FLAG_LABELS } from '#shared/projection/project';
import { PRODUCT_TYPES } from '#shared/camber/schema';
import { Caution } from '../../components/ui/caution';
import { StatusBadge } from '../../components/ui/status-badge';
import { meQuery } from '../../features/auth/api';
import { jobsQuery } from '../../features/pieces/api';
import { reviewQuery } from '../../features/review/api';
import { FlagList } from '../../features/review/components/flag-list';
import { camberText } from '../../lib/format';


/** The QC manager's morning list: flagged pieces by urgency, with the evidence in each row. */
export function ReviewPage() {
  const [sp, update] = useUrlParams();
  const f = reviewFilters(sp);
  const { data: me } = useQuery(meQuery);
  const { data: jobs = [] } = useQuery(jobsQuery);
  const { data } = useQuery({ ...reviewQuery(f), placeholderData: keepPreviousData });
  const set = (k: string, v: string | undefined): void => {
    update((next) => {
      if (v) next.set(k, v);
      else next.delete(k);
      if (k !== 'page') next.delete('page');
    });
  };

  const unit = me?.unitSystem ?? 'us';
  return (
    <section aria-labelledby="review-title">
      <div className="mb-3 flex flex-wrap items-center gap-3">
        <h1 id="review-title" className="text-2xl font-semibold">
          Review list
        </h1>
        <a className="btn-quiet ml-auto" href={`/api/exports/review.csv?view=${f.view}`}>Export (CSV)</a>
      </div>
      <div className="mb-3 flex flex-wrap gap-2" role="tablist" aria-label="Which pieces">
        {(['needs-decision', 'all-flagged'] as const).map((v) => (
          <button key={v} type="button" role="tab" aria-selected={f.view === v} className={f.view === v ? 'btn-primary' : 'btn-quiet'} onClick={() => set('view', v === 'needs-decision' ? undefined : v)}>
            {v === 'needs-decision' ? 'Needs a decision' : 'All flagged pieces'}
          </button>
        ))}
      </div>
      <div className="mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-5">
        <div>
          <label className="label" htmlFor="r-job">Job</label>
          <select id="r-job" className="input" value={f.jobId ?? ''} onChange={(e) => set('jobId', e.target.value)}>
            <option value="">Any job</option>
            {jobs.map((j) => <option key={j.id} value={j.id}>{j.number} {j.name}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="r-product">Product</label>
          <select id="r-product" className="input" value={f.productType ?? ''} onChange={(e) => set('productType', e.target.value)}>
            <option value="">Any product</option>
            {PRODUCT_TYPES.map((p) => <option key={p} value={p}>{p.replace('-', ' ')}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="r-flag">Flag</label>
          <select id="r-flag" className="input" value={f.flag ?? ''} onChange={(e) => set('flag', e.target.value)}>
            <option value="">Any flag</option>
            {FLAG_KINDS.map((k) => <option key={k} value={k}>{FLAG_LABELS[k]}</option>)}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="r-bay">Bay</label>
          <input id="r-bay" className="input" defaultValue={f.bay ?? ''} onBlur={(e) => set('bay', e.target.value.trim())} />
        </div>
        <div>
          <label className="label" htmlFor="r-sort">Order</label>
          <select id="r-sort" className="input" value={f.sort} onChange={(e) => set('sort', e.target.value)}>
            <option value="urgency">Most urgent first</option>
            <option value="shipDate">Ship date</option>
            <option value="mark">Mark</option>
          </select>
        </div>
      </div>
      <div className="overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left">
          <caption className="sr-only">Flagged pieces, {data?.total ?? 0}</caption>
          <thead className="bg-concrete-100 text-sm">
            <tr>
              <th className="px-3 py-2">Piece</th>
              <th className="px-3 py-2">Why</th>
              <th className="px-3 py-2">Latest vs expected</th>
              <th className="px-3 py-2">Projected at ship</th>
              <th className="px-3 py-2">Ships</th>
            </tr>
          </thead>
          <tbody>
            {data?.items.map((r) => (
              <tr key={r.pieceId} className="border-t border-concrete-100 align-top">
                <td className="px-3 py-2">
                  <Link className="text-lg font-semibold underline" to={`/pieces/${r.pieceId}`}>{r.mark}</Link>
                  <p className="text-sm">{r.jobNumber}{r.bay ? ` · ${r.bay}` : ''}</p>
                  <StatusBadge status={r.status} />
                </td>
                <td className="min-w-[280px] px-3 py-2"><FlagList flags={r.flags} /></td>
                <td className="px-3 py-2">{r.latest ? <>{camberText(r.latest.mm, unit)}<br /><span className="text-sm">expected {camberText(r.latest.expectedMm, unit)} ({camberText(r.latest.lowMm, unit)} to {camberText(r.latest.highMm, unit)})</span></> : '—'}</td>
                <td className="px-3 py-2">{r.atShip ? <>{camberText(r.atShip.mm, unit)}<br /><span className="text-sm">{camberText(r.atShip.lowMm, unit)} to {camberText(r.atShip.highMm, unit)}</span></> : '—'}</td>
                <td className="px-3 py-2">{r.shipDate ? <>{r.shipDate}<br /><span className="text-sm">{r.daysToShip === null ? '' : r.daysToShip < 0 ? `${-r.daysToShip} days late` : r.daysToShip === 0 ? 'today' : `in ${r.daysToShip} days`}</span></> : '—'}</td>
              </tr>
            ))}
            {data && data.items.length === 0 && (
              <tr><td colSpan={5} className="px-3 py-6 text-center">{f.view === 'needs-decision' ? 'No flagged piece waits for a decision.' : 'No piece is flagged.'}</td></tr>
            )}
          </tbody>
        </table>
      </div>
      <Caution />
    </section>
  );
}
