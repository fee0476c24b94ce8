import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { familySettingsSchema, type FamilySettings } from '#shared/api/settings';
import { METHODS } from '#shared/camber/schema';
import { Icon } from '../../components/ui/icon';
import { meQuery } from '../../features/auth/api';
import { saveSettings, settingsQuery } from '../../features/imports/settings-api';
import { ApiFailure } from '../../lib/api';

function FamilyForm({ productType, initial, canEdit }: { productType: string; initial: FamilySettings; canEdit: boolean }) {
  const qc = useQueryClient();
  const [s, setS] = useState<FamilySettings>(initial);
  const [ages, setAges] = useState(initial.readingAges.join(', '));
  const [problem, setProblem] = useState<string | null>(null);
  const save = useMutation({
    mutationFn: (v: FamilySettings) => saveSettings(productType, v),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['settings'] }),
    onError: (e) => setProblem(e instanceof ApiFailure ? `${e.message}: ${Object.entries(e.fieldErrors).map(([k, v]) => `${k} ${v.join(', ')}`).join('; ')}` : 'not saved'),
  });
  const submit = (e: React.FormEvent): void => {
    e.preventDefault();
    const parsed = familySettingsSchema.safeParse({ ...s, readingAges: ages.split(/[,\s]+/).filter(Boolean).map(Number) });
    if (!parsed.success) {
      setProblem(parsed.error.issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; '));
      return;
    }
    setProblem(null);
    save.mutate(parsed.data);
  };
  const num = (v: string): number => Number(v);
  const id = (k: string): string => `${productType}-${k}`;
  const t = s.tolerance;
  return (
    <form className="card" onSubmit={submit} aria-labelledby={id('title')}>
      <h2 id={id('title')} className="mb-2 text-xl font-semibold">{productType.replace('-', ' ')}</h2>
      <fieldset disabled={!canEdit} className="grid gap-3 sm:grid-cols-3">
        <div><label className="label" htmlFor={id('method')}>Prediction method</label>
          <select id={id('method')} className="input" value={s.method ?? ''} onChange={(e) => setS({ ...s, method: (e.target.value || null) as FamilySettings['method'] })}>
            <option value="">Each design's own</option>{METHODS.map((m) => <option key={m} value={m}>{m}</option>)}
          </select></div>
        <div><label className="label" htmlFor={id('rh')}>Relative humidity (%)</label><input id={id('rh')} className="input" inputMode="decimal" value={s.relativeHumidity ?? ''} onChange={(e) => setS({ ...s, relativeHumidity: e.target.value ? num(e.target.value) : null })} /></div>
        <div><label className="label" htmlFor={id('curing')}>Default curing</label>
          <select id={id('curing')} className="input" value={s.defaultCuring} onChange={(e) => setS({ ...s, defaultCuring: e.target.value as 'steam' | 'moist' })}><option value="steam">Steam</option><option value="moist">Moist</option></select></div>
        <div><label className="label" htmlFor={id('br')}>Band: release (1σ, fraction)</label><input id={id('br')} className="input" value={s.band.release} onChange={(e) => setS({ ...s, band: { ...s.band, release: num(e.target.value) } })} /></div>
        <div><label className="label" htmlFor={id('bg')}>Band: growth (1σ, fraction)</label><input id={id('bg')} className="input" value={s.band.growth} onChange={(e) => setS({ ...s, band: { ...s.band, growth: num(e.target.value) } })} /></div>
        <div><label className="label" htmlFor={id('bm')}>Band: measurement (mm, 1σ)</label><input id={id('bm')} className="input" value={s.band.measurementMm} onChange={(e) => setS({ ...s, band: { ...s.band, measurementMm: num(e.target.value) } })} /></div>
        <div><label className="label" htmlFor={id('rate')}>Tolerance: in per 10 ft</label><input id={id('rate')} className="input" value={t.ratePer10ft} onChange={(e) => setS({ ...s, tolerance: { ...t, ratePer10ft: num(e.target.value) } })} /></div>
        <div><label className="label" htmlFor={id('cap')}>Tolerance: at most (in)</label><input id={id('cap')} className="input" value={t.cap} onChange={(e) => setS({ ...s, tolerance: { ...t, cap: num(e.target.value) } })} /></div>
        <div><label className="label" htmlFor={id('diff')}>Neighbours: in per 10 ft, at most (in)</label>
          <div className="flex gap-2"><input aria-label="Neighbours: in per 10 ft" className="input" value={t.differentialPer10ft} onChange={(e) => setS({ ...s, tolerance: { ...t, differentialPer10ft: num(e.target.value) } })} /><input id={id('diff')} aria-label="Neighbours: at most (in)" className="input" value={t.differentialCap} onChange={(e) => setS({ ...s, tolerance: { ...t, differentialCap: num(e.target.value) } })} /></div></div>
        <div className="sm:col-span-2"><label className="label" htmlFor={id('source')}>Source of the tolerance</label><input id={id('source')} className="input" value={t.source} onChange={(e) => setS({ ...s, tolerance: { ...t, source: e.target.value } })} /></div>
        <div><label className="label" htmlFor={id('conf')}>Confidence</label>
          <select id={id('conf')} className="input" value={t.confidence} onChange={(e) => setS({ ...s, tolerance: { ...t, confidence: e.target.value as FamilySettings['tolerance']['confidence'] } })}>
            <option value="plant">Set by the plant (project specification)</option><option value="MEM-M">From memory, medium confidence</option><option value="MEM-L">From memory, low confidence</option>
          </select></div>
        <div className="sm:col-span-3"><label className="label" htmlFor={id('ages')}>Readings due at these ages (days after casting; the release reading comes first)</label><input id={id('ages')} className="input" value={ages} onChange={(e) => setAges(e.target.value)} /></div>
      </fieldset>
      {problem && <p className="mt-2 font-semibold text-bad" role="alert"><Icon name="warning" /> {problem}</p>}
      {canEdit && <button type="submit" className="btn-primary mt-3" disabled={save.isPending}>Save {productType.replace('-', ' ')} settings</button>}
      {save.isSuccess && <p className="mt-2 flex items-center gap-2 font-semibold text-ok" role="status"><Icon name="check" /> Saved; the projections are being recomputed.</p>}
    </form>
  );
}

/** Model and tolerance settings per product family. */
export function SettingsPage() {
  const { data = [] } = useQuery(settingsQuery);
  const { data: me } = useQuery(meQuery);
  const canEdit = !!me && ['engineer', 'admin'].includes(me.role);
  return (
    <section aria-labelledby="settings-title">
      <h1 id="settings-title" className="mb-2 text-2xl font-semibold">Model and tolerance settings</h1>
      <p className="mb-4">Defaults come from the engineering reference and are marked with their confidence; set the tolerances from the project specification.</p>
      <div className="grid gap-4">{data.map((f) => <FamilyForm key={f.productType} productType={f.productType} initial={f.settings} canEdit={canEdit} />)}</div>
    </section>
  );
}
