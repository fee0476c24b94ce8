import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Caution } from '../../components/ui/caution';
import { Icon } from '../../components/ui/icon';
import { meQuery } from '../../features/auth/api';
import { adoptFactor, calibrationQuery } from '../../features/imports/settings-api';

/** How well predictions match by product family and age, and adopting a fitted factor. */
export function CalibrationPage() {
  const { data = [] } = useQuery(calibrationQuery);
  const { data: me } = useQuery(meQuery);
  const qc = useQueryClient();
  const adopt = useMutation({ mutationFn: (v: { productType: string; f: number; sd: number }) => adoptFactor(v.productType, v.f, v.sd), onSuccess: () => qc.invalidateQueries({ queryKey: ['calibration'] }) });
  const canAdopt = !!me && ['engineer', 'admin'].includes(me.role);
  const fmt = (v: number | null, d = 2): string => (v === null ? '—' : v.toFixed(d));
  return (
    <section aria-labelledby="cal-title">
      <h1 id="cal-title" className="mb-4 text-2xl font-semibold">Calibration</h1>
      <div className="grid gap-4">
        {data.map((f) => (
          <section key={f.productType} className="card" aria-labelledby={`cal-${f.productType}`}>
            <h2 id={`cal-${f.productType}`} className="mb-2 text-xl font-semibold">{f.productType.replace('-', ' ')}</h2>
            <table className="mb-3 w-full text-left text-sm">
              <caption className="sr-only">Measured ÷ predicted camber of {f.productType} by age</caption>
              <thead><tr><th className="py-1">Age</th><th>Readings</th><th>Mean measured ÷ predicted</th><th>Spread (1σ)</th></tr></thead>
              <tbody>{f.byAge.map((b) => (
                <tr key={b.label} className="border-t border-concrete-100"><td className="py-1">{b.label}</td><td>{b.count}</td>
                  <td><span className="inline-block h-3 bg-concrete-700 align-middle" style={{ width: `${Math.min(200, (b.meanRatio ?? 0) * 100)}px` }} aria-hidden="true" /> {fmt(b.meanRatio)}</td><td>{fmt(b.sdRatio)}</td></tr>
              ))}</tbody>
            </table>
            <p>Fitted growth factor from {f.pieces} pieces: <strong>{fmt(f.growthFactorMean)}</strong>{f.interval ? ` (95 % interval ${fmt(f.interval[0])} to ${fmt(f.interval[1])})` : ''}{f.growthFactorSd !== null ? `, spread ${fmt(f.growthFactorSd)}` : ''}.</p>
            <p className="mt-1">{f.adopted ? `In use: ${fmt(f.adopted.growthFactor)} ± ${fmt(f.adopted.growthFactorSd)}, adopted by ${f.adopted.by} on ${f.adopted.at.slice(0, 10)}.` : 'In use: the design prediction as it is (factor 1.00).'}</p>
            {canAdopt && f.growthFactorMean !== null && f.growthFactorSd !== null && (
              <button type="button" className="btn-primary mt-2" onClick={() => adopt.mutate({ productType: f.productType, f: f.growthFactorMean!, sd: Math.max(0.05, f.growthFactorSd!) })}>
                Adopt {fmt(f.growthFactorMean)} for {f.productType.replace('-', ' ')}
              </button>
            )}
          </section>
        ))}
      </div>
      {adopt.isSuccess && <p className="mt-2 flex items-center gap-2 font-semibold text-ok" role="status"><Icon name="check" /> Adopted; the projections are being recomputed with it.</p>}
      <Caution />
    </section>
  );
}
