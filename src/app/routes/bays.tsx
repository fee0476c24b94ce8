import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { useSearchParams } from 'react-router';
import type { BayCandidateDto } from '#shared/api/bays';
import { arrangementDifferences } from '#shared/bays/match';
import { Caution } from '../../components/ui/caution';
import { Icon } from '../../components/ui/icon';
import { meQuery } from '../../features/auth/api';
import { arrangeBay, bayQuery, baysQuery } from '../../features/shipping/api';
import { ApiFailure } from '../../lib/api';
import { camberText } from '../../lib/format';

/** Bay matching: the current arrangement, the proposal, and placing pieces by hand. */
export function BaysPage() {
  const [sp, setSp] = useSearchParams();
  const { data: me } = useQuery(meQuery);
  const { data: bays = [] } = useQuery(baysQuery);
  const key = sp.get('bay') ?? '';
  const [jobId, bay] = key ? (key.split('|') as [string, string]) : ['', ''];
  const { data } = useQuery({ ...bayQuery(jobId, bay), enabled: !!key });
  const qc = useQueryClient();
  const [draft, setDraft] = useState<string[] | null>(null);
  const save = useMutation({
    mutationFn: (ids: string[]) => arrangeBay({ jobId, bay, pieceIds: ids }),
    onSuccess: async () => {
      setDraft(null);
      await qc.invalidateQueries({ queryKey: ['pieces'] });
    },
  });
  const unit = me?.unitSystem ?? 'us';
  const canArrange = me && ['engineer', 'qc_manager', 'admin'].includes(me.role);
  const byId = new Map((data?.pool ?? []).map((p) => [p.id, p]));
  const shown: BayCandidateDto[] = (draft ?? data?.current.map((p) => p.id) ?? []).map((id) => byId.get(id)!).filter(Boolean);
  const diffs = arrangementDifferences(shown, {});
  const move = (i: number, by: number): void => {
    const ids = shown.map((p) => p.id);
    const j = i + by;
    if (j < 0 || j >= ids.length) return;
    [ids[i], ids[j]] = [ids[j]!, ids[i]!];
    setDraft(ids);
  };
  return (
    <section aria-labelledby="bays-title">
      <h1 id="bays-title" className="mb-4 text-2xl font-semibold">Bay matching</h1>
      <label className="label" htmlFor="bay-pick">Erection bay</label>
      <select id="bay-pick" className="input mb-4 max-w-md" value={key} onChange={(e) => { setDraft(null); setSp(e.target.value ? { bay: e.target.value } : {}); }}>
        <option value="">Choose a bay</option>
        {bays.map((b) => <option key={`${b.jobId}|${b.bay}`} value={`${b.jobId}|${b.bay}`}>{b.jobNumber} · {b.bay} ({b.pieces} pieces)</option>)}
      </select>
      {data && (
        <div className="grid gap-4 lg:grid-cols-2">
          <section className="card" aria-labelledby="current-title">
            <h2 id="current-title" className="mb-1 text-xl font-semibold">{draft ? 'Your arrangement (not saved)' : 'Current arrangement'}</h2>
            <p className="mb-2 text-sm">Neighbours may differ by at most {camberText(data.toleranceMm, unit)} (projection uncertainty included).</p>
            <ol className="grid gap-1">
              {shown.map((p, i) => (
                <li key={p.id} className="rounded border border-concrete-200 p-2">
                  <div className="flex flex-wrap items-center gap-2">
                    <span className="w-6 font-semibold">{i + 1}</span>
                    <span className="font-semibold">{p.mark}</span>
                    <span className="text-sm">at erection {camberText(p.camberMm, unit)}{p.committed ? ' · cleared for this bay' : ''}</span>
                    {canArrange && (
                      <span className="ml-auto flex gap-1">
                        <button type="button" className="btn-quiet min-h-[36px] px-2" aria-label={`Move ${p.mark} up`} onClick={() => move(i, -1)}>↑</button>
                        <button type="button" className="btn-quiet min-h-[36px] px-2" aria-label={`Move ${p.mark} down`} onClick={() => move(i, 1)}>↓</button>
                      </span>
                    )}
                  </div>
                  {i < diffs.length && (
                    <p className={`mt-1 flex items-center gap-1 text-sm ${diffs[i]! > data.toleranceMm ? 'font-semibold text-bad' : ''}`}>
                      <Icon name={diffs[i]! > data.toleranceMm ? 'warning' : 'check'} className="h-4 w-4" /> to the next: {camberText(diffs[i]!, unit)}{diffs[i]! > data.toleranceMm ? ' — over the tolerance' : ''}
                    </p>
                  )}
                </li>
              ))}
            </ol>
            {draft && canArrange && (
              <button type="button" className="btn-primary mt-3" onClick={() => save.mutate(draft)} disabled={save.isPending}>Save this arrangement</button>
            )}
          </section>
          <section className="card" aria-labelledby="proposal-title">
            <h2 id="proposal-title" className="mb-1 text-xl font-semibold">Proposal</h2>
            <p className={`mb-2 flex items-center gap-2 font-semibold ${data.proposal.feasible ? 'text-ok' : 'text-bad'}`} role="status">
              <Icon name={data.proposal.feasible ? 'check' : 'warning'} />
              {data.proposal.feasible ? `Every pair of neighbours within tolerance; margin ${camberText(data.proposal.marginMm, unit)}` : data.proposal.reason}
            </p>
            <ol className="ml-6 list-decimal">
              {data.proposal.order.map((id) => <li key={id}>{byId.get(id)?.mark} — {camberText(byId.get(id)?.camberMm ?? 0, unit)} at erection, cast {byId.get(id)?.ageDays} days ago</li>)}
            </ol>
            {data.withoutProjection.length > 0 && <p className="mt-2 text-sm">Not considered (no projection yet): {data.withoutProjection.join(', ')}</p>}
            {canArrange && data.proposal.order.length > 0 && (
              <button type="button" className="btn-primary mt-3" onClick={() => save.mutate(data.proposal.order)} disabled={save.isPending}>Accept the proposal</button>
            )}
            {save.error && <p className="mt-2 font-semibold text-bad" role="alert">{save.error instanceof ApiFailure ? save.error.message : 'not saved'}</p>}
            {save.isSuccess && <p className="mt-2 flex items-center gap-2 font-semibold text-ok" role="status"><Icon name="check" /> Arrangement saved.</p>}
            <a className="btn-quiet mt-3" href={`/api/reports/bay?jobId=${jobId}&bay=${encodeURIComponent(bay)}`} target="_blank" rel="noreferrer">Bay report (PDF)</a>
          </section>
        </div>
      )}
      <Caution />
    </section>
  );
}
