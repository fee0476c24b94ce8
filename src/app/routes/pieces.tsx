import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { useUrlParams } from '../../lib/use-url-params';
import { PIECE_SORTS, PIECE_STATUS_LABELS, PIECE_STATUSES, type PieceListQuery } from '#shared/api/pieces';
import { PRODUCT_TYPES } from '#shared/camber/schema';
import { StatusBadge } from '../../components/ui/status-badge';
import { meQuery } from '../../features/auth/api';
import { jobsQuery, piecesQuery } from '../../features/pieces/api';
import { camberText } from '../../lib/format';

/** The list filters live in the URL, so a filtered list can be bookmarked and shared. */
export function listFilters(sp: URLSearchParams): PieceListQuery {
  const get = (k: string): string | undefined => sp.get(k) ?? undefined;
  const sort = get('sort');
  return {
    q: get('q'),
    status: get('status') as PieceListQuery['status'],
    productType: get('productType'),
    jobId: get('jobId'),
    sort: (PIECE_SORTS as readonly string[]).includes(sort ?? '') ? (sort as PieceListQuery['sort']) : 'mark',
    dir: get('dir') === 'desc' ? 'desc' : 'asc',
    page: Number(get('page') ?? 1) || 1,
    pageSize: 25,
  };
}

const SORT_LABELS: Record<(typeof PIECE_SORTS)[number], string> = { mark: 'Mark', castDate: 'Cast', shipDate: 'Ship date', status: 'Status', job: 'Job' };

export function PiecesPage() {
  const [sp, update] = useUrlParams();
  const f = listFilters(sp);
  const { data: me } = useQuery(meQuery);
  const { data: jobs = [] } = useQuery(jobsQuery);
  const { data, isFetching } = useQuery({ ...piecesQuery(f), placeholderData: keepPreviousData });
  const set = (k: string, v: string | undefined): void => {
    update((next) => {
      if (v) next.set(k, v);
      else next.delete(k);
      if (k !== 'page') next.delete('page');
    });
  };

  const sortBy = (s: (typeof PIECE_SORTS)[number]): void => {
    update((next) => {
      next.set('sort', s);
      next.set('dir', f.sort === s && f.dir === 'asc' ? 'desc' : 'asc');
    });
  };
  const pages = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const unit = me?.unitSystem ?? 'us';
  return (
    <section aria-labelledby="pieces-title">
      <div className="mb-4 flex flex-wrap items-center gap-3">
        <h1 id="pieces-title" className="text-2xl font-semibold">
          Pieces
        </h1>
        {me && ['qc_manager', 'engineer', 'admin'].includes(me.role) && (
          <span className="ml-auto flex gap-2">
            <a className="btn-quiet" href={`/api/exports/pieces.csv${f.jobId ? `?jobId=${f.jobId}` : ''}`}>Export pieces (CSV)</a>
            <a className="btn-quiet" href={`/api/exports/readings.csv${f.jobId ? `?jobId=${f.jobId}` : ''}`}>Export readings (CSV)</a>
          </span>
        )}
      </div>
      <div className="mb-4 grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <div>
          <label className="label" htmlFor="q">
            Find by mark
          </label>
          <input id="q" className="input" type="search" placeholder="e.g. DT-104" defaultValue={f.q ?? ''} onChange={(e) => set('q', e.target.value.trim() || undefined)} />
        </div>
        <div>
          <label className="label" htmlFor="status">
            Status
          </label>
          <select id="status" className="input" value={f.status ?? ''} onChange={(e) => set('status', e.target.value || undefined)}>
            <option value="">Any status</option>
            {PIECE_STATUSES.map((s) => (
              <option key={s} value={s}>
                {PIECE_STATUS_LABELS[s]}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="productType">
            Product
          </label>
          <select id="productType" className="input" value={f.productType ?? ''} onChange={(e) => set('productType', e.target.value || undefined)}>
            <option value="">Any product</option>
            {PRODUCT_TYPES.map((p) => (
              <option key={p} value={p}>
                {p.replace('-', ' ')}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label className="label" htmlFor="jobId">
            Job
          </label>
          <select id="jobId" className="input" value={f.jobId ?? ''} onChange={(e) => set('jobId', e.target.value || undefined)}>
            <option value="">Any job</option>
            {jobs.map((j) => (
              <option key={j.id} value={j.id}>
                {j.number} {j.name}
              </option>
            ))}
          </select>
        </div>
      </div>
      <div className="overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left">
          <caption className="sr-only">Pieces, {data?.total ?? 0} found</caption>
          <thead className="bg-concrete-100 text-sm">
            <tr>
              {(['mark', 'job'] as const).map((s) => (
                <SortHeader key={s} label={SORT_LABELS[s]} active={f.sort === s} dir={f.dir} onClick={() => sortBy(s)} />
              ))}
              <th className="px-3 py-2">Design</th>
              <SortHeader label="Cast" active={f.sort === 'castDate'} dir={f.dir} onClick={() => sortBy('castDate')} />
              <SortHeader label="Ship date" active={f.sort === 'shipDate'} dir={f.dir} onClick={() => sortBy('shipDate')} />
              <th className="px-3 py-2">Latest camber</th>
              <SortHeader label="Status" active={f.sort === 'status'} dir={f.dir} onClick={() => sortBy('status')} />
            </tr>
          </thead>
          <tbody aria-busy={isFetching}>
            {data?.items.map((p) => (
              <tr key={p.id} className="border-t border-concrete-100">
                <td className="px-3 py-2 font-semibold">
                  <Link className="underline" to={`/pieces/${p.id}`}>
                    {p.mark}
                  </Link>
                </td>
                <td className="px-3 py-2">{p.jobNumber}</td>
                <td className="px-3 py-2">{p.designCode}</td>
                <td className="px-3 py-2">{p.castDate}</td>
                <td className="px-3 py-2">{p.shipDate ?? '—'}</td>
                <td className="px-3 py-2">{p.latestReading ? camberText(p.latestReading.valueMm, unit) : 'no reading'}</td>
                <td className="px-3 py-2">
                  <StatusBadge status={p.status} />
                </td>
              </tr>
            ))}
            {data && data.items.length === 0 && (
              <tr>
                <td colSpan={7} className="px-3 py-6 text-center">
                  No piece matches these filters.
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <div className="mt-3 flex items-center gap-3">
        <button type="button" className="btn-quiet" disabled={f.page <= 1} onClick={() => set('page', String(f.page - 1))}>
          ← Previous
        </button>
        <span>
          Page {f.page} of {pages} · {data?.total ?? 0} pieces
        </span>
        <button type="button" className="btn-quiet" disabled={f.page >= pages} onClick={() => set('page', String(f.page + 1))}>
          Next →
        </button>
      </div>
    </section>
  );
}

function SortHeader({ label, active, dir, onClick }: { label: string; active: boolean; dir: 'asc' | 'desc'; onClick: () => void }) {
  return (
    <th className="px-3 py-2" aria-sort={active ? (dir === 'asc' ? 'ascending' : 'descending') : 'none'}>
      <button type="button" className="font-semibold underline-offset-2 hover:underline" onClick={onClick}>
        {label} {active ? (dir === 'asc' ? '▲' : '▼') : ''}
      </button>
    </th>
  );
}
