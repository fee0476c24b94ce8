import { zodResolver } from '@hookform/resolvers/zod';
import { lazy, Suspense } from 'react';
import { useFieldArray, useForm, useWatch, type FieldPath } from 'react-hook-form';
import { designInputSchema, type DesignInput } from '#shared/api/designs';
import { predictInputSchema, PRODUCT_TYPES, METHODS } from '#shared/camber/schema';
import { predictParsed } from '#shared/camber/predict';
import { Icon } from '../../../components/ui/icon';

const PreviewChart = lazy(() => import('./preview-chart'));

const SHAPE_FIELDS: Record<string, string[]> = {
  properties: ['area', 'inertia', 'yb', 'height', 'volumeToSurface'],
  rectangle: ['width', 'height'],
  'double-tee': ['flangeWidth', 'flangeThickness', 'stemWidthTop', 'stemWidthBottom', 'height'],
  'hollow-core': ['width', 'height', 'voidCount', 'voidDiameter'],
  'inverted-tee': ['webWidth', 'height', 'ledgeWidth', 'ledgeHeight'],
  'i-girder': ['topFlangeWidth', 'topFlangeThickness', 'webWidth', 'bottomFlangeWidth', 'bottomFlangeThickness', 'height'],
};
const PREVIEW_AGES = [1, 3, 7, 14, 28, 42, 56, 90, 120, 180, 270, 365];
const num = { setValueAs: (v: string) => (v === '' || v === undefined ? undefined : Number(v)) };

interface Props {
  initial: DesignInput;
  codeLocked: boolean;
  onSave: (v: DesignInput) => Promise<void>;
  saveLabel: string;
}

/** A member design: form validated by the shared schema, with the engine's prediction live beside it. */
export function DesignEditor({ initial, codeLocked, onSave, saveLabel }: Props) {
  const form = useForm<DesignInput>({ resolver: zodResolver(designInputSchema), defaultValues: initial, mode: 'onBlur' });
  const { register, control, setValue, handleSubmit, formState } = form;
  const strands = useFieldArray({ control, name: 'spec.strands' });
  const spec = useWatch({ control, name: 'spec' });
  const section = (spec?.section ?? {}) as Record<string, unknown>;
  const mode = typeof section.shape === 'string' ? section.shape : 'properties';
  const units = spec?.units ?? 'us';
  const preview = predictInputSchema.safeParse({ ...spec, agesDays: PREVIEW_AGES });
  let result = null;
  let previewProblem: string | null = null;
  if (preview.success) {
    try {
      result = predictParsed(preview.data);
    } catch (e) {
      previewProblem = e instanceof Error ? e.message : 'the engine could not read this design';
    }
  } else previewProblem = preview.error.issues.slice(0, 3).map((i) => `${i.path.join('.')}: ${i.message}`).join('; ');
  const err = (path: string): string | undefined => {
    let node: unknown = formState.errors;
    for (const k of path.split('.')) node = (node as Record<string, unknown> | undefined)?.[k];
    return (node as { message?: string } | undefined)?.message;
  };
  const field = (path: string, label: string, numeric = true) => (
    <div>
      <label className="label" htmlFor={path}>{label}</label>
      <input id={path} className="input" inputMode={numeric ? 'decimal' : 'text'} {...register(path as FieldPath<DesignInput>, numeric ? num : undefined)} aria-invalid={!!err(path)} />
      {err(path) && <p className="text-sm font-semibold text-bad">{err(path)}</p>}
    </div>
  );
  const dim = units === 'us' ? 'in' : 'mm';
  const len = units === 'us' ? 'ft' : 'm';
  return (
    <form onSubmit={handleSubmit((v) => onSave(v))} className="grid gap-4 lg:grid-cols-2" noValidate>
      <div className="grid gap-4">
        <section className="card grid gap-3 sm:grid-cols-2" aria-label="Design">
          {field('code', 'Code', false)}
          {field('name', 'Name', false)}
          <div>
            <label className="label" htmlFor="spec.productType">Product</label>
            <select id="spec.productType" className="input" {...register('spec.productType')}>{PRODUCT_TYPES.map((p) => <option key={p} value={p}>{p.replace('-', ' ')}</option>)}</select>
          </div>
          <div>
            <label className="label" htmlFor="spec.units">Units</label>
            <select id="spec.units" className="input" {...register('spec.units')}><option value="us">US (ft, in, ksi, kip)</option><option value="si">SI (m, mm, MPa, kN)</option></select>
          </div>
          {field('spec.length', `Length (${len})`)}
          <div>
            <label className="label" htmlFor="spec.method">Prediction method</label>
            <select id="spec.method" className="input" {...register('spec.method')}>{METHODS.map((m) => <option key={m} value={m}>{m}</option>)}</select>
          </div>
        </section>
        <section className="card grid gap-3 sm:grid-cols-3" aria-label="Section">
          <div className="sm:col-span-3">
            <label className="label" htmlFor="section-mode">Section given as</label>
            <select id="section-mode" className="input" value={mode} onChange={(e) => setValue('spec.section', (e.target.value === 'properties' ? {} : { shape: e.target.value }) as DesignInput['spec']['section'], { shouldValidate: false })}>
              {Object.keys(SHAPE_FIELDS).map((s) => <option key={s} value={s}>{s === 'properties' ? 'Section properties' : s.replace('-', ' ')}</option>)}
            </select>
          </div>
          {SHAPE_FIELDS[mode]!.map((k) => field(`spec.section.${k}`, `${k} (${k === 'voidCount' ? 'count' : k === 'area' ? `${dim}²` : k === 'inertia' ? `${dim}⁴` : dim})`))}
        </section>
        <section className="card grid gap-3 sm:grid-cols-3" aria-label="Concrete">
          {field('spec.concrete.fci', `f′ci at release (${units === 'us' ? 'ksi' : 'MPa'})`)}
          {field('spec.concrete.fc', `f′c (${units === 'us' ? 'ksi' : 'MPa'})`)}
          {field('spec.concrete.unitWeight', `Unit weight (${units === 'us' ? 'lb/ft³' : 'kg/m³'})`)}
          <div><label className="label" htmlFor="spec.concrete.modulus">Modulus</label>
            <select id="spec.concrete.modulus" className="input" {...register('spec.concrete.modulus')}>{['aci318', 'aashto', 'aashto2014', 'en1992', 'mc2010'].map((m) => <option key={m} value={m}>{m}</option>)}</select></div>
          <div><label className="label" htmlFor="spec.concrete.curing">Curing</label>
            <select id="spec.concrete.curing" className="input" {...register('spec.concrete.curing')}><option value="steam">Steam</option><option value="moist">Moist</option></select></div>
          {field('spec.concrete.releaseAgeDays', 'Release age (days)')}
        </section>
        <section className="card" aria-label="Strands">
          <h3 className="mb-2 font-semibold">Strand groups</h3>
          {strands.fields.map((f, i) => (
            <fieldset key={f.id} className="mb-3 grid gap-2 border-t border-concrete-200 pt-2 sm:grid-cols-4">
              <legend className="sr-only">Group {i + 1}</legend>
              {field(`spec.strands.${i}.count`, 'Count')}
              {field(`spec.strands.${i}.area`, `Area each (${dim}²)`)}
              <div><label className="label" htmlFor={`spec.strands.${i}.profile`}>Profile</label>
                <select id={`spec.strands.${i}.profile`} className="input" {...register(`spec.strands.${i}.profile` as const)}><option value="straight">Straight</option><option value="harped-1">Harped at midspan</option><option value="harped-2">Harped at two points</option></select></div>
              {field(`spec.strands.${i}.eccMid`, `e at midspan (${dim})`)}
              {field(`spec.strands.${i}.eccEnd`, `e at the ends (${dim})`)}
              {field(`spec.strands.${i}.harpAt`, `Harp point from end (${len})`)}
              {field(`spec.strands.${i}.debondLength`, `Debonded each end (${len})`)}
              <div className="flex items-end"><button type="button" className="btn-quiet" onClick={() => strands.remove(i)} disabled={strands.fields.length === 1}>Remove group {i + 1}</button></div>
            </fieldset>
          ))}
          <button type="button" className="btn-quiet" onClick={() => strands.append({ count: 2, area: 0.153, profile: 'straight', eccMid: 10 })}>Add a strand group</button>
        </section>
        <section className="card grid gap-3 sm:grid-cols-3" aria-label="Prestress and storage">
          {field('spec.prestress.jackingStress', `Jacking stress (${units === 'us' ? 'ksi' : 'MPa'})`)}
          {field('spec.supports.storage.0.fromAgeDays', 'On dunnage from age (days)')}
          {field('spec.supports.storage.0.overhang', `Dunnage overhang (${len})`)}
          {field('spec.environment.relativeHumidity', 'Relative humidity (%)')}
        </section>
        <button type="submit" className="btn-primary" disabled={formState.isSubmitting}>{saveLabel}</button>
        {codeLocked && <p className="text-sm">A design that pieces use is saved as a new version; those pieces keep their version until re-assigned.</p>}
      </div>
      <section className="card h-fit lg:sticky lg:top-4" aria-labelledby="preview-title">
        <h2 id="preview-title" className="mb-2 text-xl font-semibold">Prediction</h2>
        {result ? (
          <>
            <p className="mb-2" role="status">
              Release: prestress {result.release.prestress.toFixed(2)} − self-weight {result.release.selfWeight.toFixed(2)} = <strong>{result.release.net.toFixed(2)} {result.unitOfCamber}</strong>; at 90 days {result.points.find((p) => p.ageDays === 90)?.camber.toFixed(2)} {result.unitOfCamber} (tolerance ±{result.tolerance.plusMinus.toFixed(2)}).
            </p>
            <Suspense fallback={<p>Drawing…</p>}><PreviewChart result={result} /></Suspense>
          </>
        ) : (
          <p className="flex items-start gap-2" role="status"><Icon name="warning" /> Not yet complete: {previewProblem}</p>
        )}
      </section>
    </form>
  );
}
