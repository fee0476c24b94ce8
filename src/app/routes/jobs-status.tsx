import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { jobsStatusQuery } from '../../features/review/api';
import { meQuery } from '../../features/auth/api';
import { dateTimeText } from '../../lib/format';

/** What the projection queue holds, and which pieces failed and why. */
export function JobsStatusPage() {
  const { data } = useQuery(jobsStatusQuery);
  const { data: me } = useQuery(meQuery);
  if (!data || !me) return null;
  return (
    <section aria-labelledby="jobs-title">
      <h1 id="jobs-title" className="mb-4 text-2xl font-semibold">Projection jobs</h1>
      <p className="mb-3">Last nightly run: {data.lastNightly ? dateTimeText(data.lastNightly, me.timeZone) : 'not yet'}</p>
      <div className="mb-6 overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left">
          <caption className="sr-only">Jobs by queue and state</caption>
          <thead className="bg-concrete-100 text-sm"><tr><th className="px-3 py-2">Queue</th><th className="px-3 py-2">State</th><th className="px-3 py-2">Jobs</th></tr></thead>
          <tbody>{data.queues.map((q) => <tr key={`${q.name}-${q.state}`} className="border-t border-concrete-100"><td className="px-3 py-2">{q.name}</td><td className="px-3 py-2">{q.state}</td><td className="px-3 py-2">{q.count}</td></tr>)}</tbody>
        </table>
      </div>
      <h2 className="mb-2 text-xl font-semibold">Pieces whose projection failed ({data.failures.length})</h2>
      {data.failures.length === 0 ? <p>None.</p> : (
        <ul className="grid gap-2">{data.failures.map((f) => <li key={f.pieceId} className="card"><Link className="font-semibold underline" to={`/pieces/${f.pieceId}`}>{f.mark}</Link> · {dateTimeText(f.failedAt, me.timeZone)}<p className="text-sm">{f.message}</p></li>)}</ul>
      )}
    </section>
  );
}
