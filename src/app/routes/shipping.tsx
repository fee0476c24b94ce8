import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link } from 'react-router';
import { Caution } from '../../components/ui/caution';
import { Icon } from '../../components/ui/icon';
import { StatusBadge } from '../../components/ui/status-badge';
import { meQuery } from '../../features/auth/api';
import { shippingQuery, shipPieces } from '../../features/shipping/api';
import { ApiFailure } from '../../lib/api';
import { camberText } from '../../lib/format';

const todayLocal = (): string => new Date(Date.now() - new Date().getTimezoneOffset() * 60_000).toISOString().slice(0, 10);

/** The shipping list of a day: readiness of each piece, and marking a truck shipped. */
export function ShippingPage() {
  const { data: me } = useQuery(meQuery);
  const [date, setDate] = useState(todayLocal);
  const { data } = useQuery(shippingQuery(date));
  const [picked, setPicked] = useState<string[]>([]);
  const [override, setOverride] = useState('');
  const qc = useQueryClient();
  const ship = useMutation({
    mutationFn: () => shipPieces({ pieceIds: picked, overrideComment: override.trim() || undefined }),
    onSuccess: async () => {
      setPicked([]);
      setOverride('');
      await qc.invalidateQueries({ queryKey: ['pieces'] });
    },
  });
  const unit = me?.unitSystem ?? 'us';
  const rows = data?.rows ?? [];
  const blockedPicked = rows.filter((r) => picked.includes(r.pieceId) && r.blockers.length);
  const err = ship.error instanceof ApiFailure ? ship.error : null;
  const canShip = me && ['qc_manager', 'admin'].includes(me.role);
  return (
    <section aria-labelledby="ship-title">
      <h1 id="ship-title" className="mb-4 text-2xl font-semibold">Shipping</h1>
      <label className="label" htmlFor="ship-date">Planned ship date</label>
      <input id="ship-date" type="date" className="input mb-4 max-w-xs" value={date} onChange={(e) => { setPicked([]); setDate(e.target.value); }} />
      <div className="overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Pieces planned to ship on {date}</caption>
          <thead className="bg-concrete-100"><tr><th className="px-3 py-2">Ship</th><th className="px-3 py-2">Piece</th><th className="px-3 py-2">Decision</th><th className="px-3 py-2">Latest reading</th><th className="px-3 py-2">At erection</th><th className="px-3 py-2">Ready?</th><th className="px-3 py-2">Report</th></tr></thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.pieceId} className="border-t border-concrete-100 align-top">
                <td className="px-3 py-2">
                  <input type="checkbox" className="h-6 w-6" aria-label={`Ship ${r.mark}`} checked={picked.includes(r.pieceId)} disabled={!canShip} onChange={(e) => setPicked((p) => (e.target.checked ? [...p, r.pieceId] : p.filter((x) => x !== r.pieceId)))} />
                </td>
                <td className="px-3 py-2"><Link className="font-semibold underline" to={`/pieces/${r.pieceId}`}>{r.mark}</Link><br />{r.jobNumber}{r.bay ? ` · ${r.bay} #${r.position}` : ''}<br /><StatusBadge status={r.status} /></td>
                <td className="px-3 py-2">{r.lastDecision ? `${r.lastDecision.kind} by ${r.lastDecision.by}` : '—'}</td>
                <td className="px-3 py-2">{r.latestReading ? `${camberText(r.latestReading.mm, unit)}, ${r.latestReading.ageDays} days ago` : 'none'}</td>
                <td className="px-3 py-2">{r.atErection ? `${camberText(r.atErection.mm, unit)} (${camberText(r.atErection.lowMm, unit)} to ${camberText(r.atErection.highMm, unit)})` : '—'}</td>
                <td className="px-3 py-2">{r.blockers.length === 0 ? <span className="flex items-center gap-1 font-semibold text-ok"><Icon name="check" className="h-4 w-4" /> Ready</span> : <ul>{r.blockers.map((b) => <li key={b} className="flex items-start gap-1 font-semibold text-bad"><Icon name="warning" className="h-4 w-4" /> {b}</li>)}</ul>}</td>
                <td className="px-3 py-2"><a className="underline" href={`/api/reports/pieces/${r.pieceId}`} target="_blank" rel="noreferrer">PDF</a></td>
              </tr>
            ))}
            {rows.length === 0 && <tr><td colSpan={7} className="px-3 py-6 text-center">Nothing is planned to ship on {date}.</td></tr>}
          </tbody>
        </table>
      </div>
      {canShip && picked.length > 0 && (
        <form className="card mt-4" onSubmit={(e) => { e.preventDefault(); ship.mutate(); }}>
          {blockedPicked.length > 0 && (
            <>
              <p className="mb-2 font-semibold">{blockedPicked.length} of the chosen pieces are not ready. A QC manager may ship them with an override:</p>
              <label className="label" htmlFor="override">Override comment (why they may ship)</label>
              <textarea id="override" className="input min-h-[80px] py-2" value={override} onChange={(e) => setOverride(e.target.value)} />
            </>
          )}
          <button type="submit" className="btn-primary mt-3" disabled={ship.isPending}>Mark {picked.length} piece{picked.length === 1 ? '' : 's'} shipped</button>
          {err && <p className="mt-2 font-semibold text-bad" role="alert">{err.message}{err.fieldErrors.overrideComment ? `: ${err.fieldErrors.overrideComment.join(' | ')}` : ''}</p>}
        </form>
      )}
      {ship.isSuccess && <p className="mt-2 flex items-center gap-2 font-semibold text-ok" role="status"><Icon name="check" /> Marked shipped.</p>}
      <Caution />
    </section>
  );
}
