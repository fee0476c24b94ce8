import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { IMPORT_FIELDS, type ImportKind, type ImportSummary, type Mapping } from '#shared/api/imports';
import { Icon } from '../../components/ui/icon';
import { commitImport, importsQuery, previewImport, uploadCsv } from '../../features/imports/api';
import { ApiFailure } from '../../lib/api';

/** Upload → column mapping → preview with every error → commit; refused rows can be downloaded. */
export function ImportsPage() {
  const qc = useQueryClient();
  const { data: recent = [] } = useQuery(importsQuery);
  const [kind, setKind] = useState<ImportKind>('readings');
  const [delimiter, setDelimiter] = useState(',');
  const [file, setFile] = useState<File | null>(null);
  const [imp, setImp] = useState<ImportSummary | null>(null);
  const [mapping, setMapping] = useState<Mapping>({});
  const [saveAs, setSaveAs] = useState('');
  const [allOrNothing, setAllOrNothing] = useState(false);
  const up = useMutation({
    mutationFn: () => uploadCsv(file!, kind, delimiter),
    onSuccess: (s) => {
      setImp(s);
      setMapping(s.proposedMapping);
      preview.reset();
      commit.reset();
    },
  });
  const preview = useMutation({ mutationFn: () => previewImport(imp!.id, mapping, saveAs.trim() || undefined) });
  const commit = useMutation({
    mutationFn: () => commitImport(imp!.id, mapping, allOrNothing, saveAs.trim() || undefined),
    onSuccess: async (s) => {
      setImp(s);
      await qc.invalidateQueries();
    },
  });
  const fields = imp ? IMPORT_FIELDS[imp.kind] : [];
  const failure = (e: unknown): string | null => (e instanceof ApiFailure ? `${e.message}${e.body.fieldErrors ? ` — ${Object.values(e.body.fieldErrors).flat().join('; ')}` : ''}` : e ? 'failed' : null);
  return (
    <section aria-labelledby="imports-title">
      <h1 id="imports-title" className="mb-4 text-2xl font-semibold">CSV imports</h1>
      <form className="card mb-4 grid gap-3 sm:grid-cols-4" onSubmit={(e) => { e.preventDefault(); if (file) up.mutate(); }}>
        <div>
          <label className="label" htmlFor="imp-kind">What the file holds</label>
          <select id="imp-kind" className="input" value={kind} onChange={(e) => setKind(e.target.value as ImportKind)}>
            <option value="readings">Bed-survey and yard readings</option>
            <option value="pieces">Piece schedule</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="imp-delim">Delimiter</label>
          <select id="imp-delim" className="input" value={delimiter} onChange={(e) => setDelimiter(e.target.value)}>
            <option value=",">Comma</option>
            <option value=";">Semicolon</option>
            <option value={'\t'}>Tab</option>
          </select>
        </div>
        <div>
          <label className="label" htmlFor="imp-file">CSV file (UTF-8)</label>
          <input id="imp-file" type="file" accept=".csv,text/csv" className="block min-h-touch w-full" onChange={(e) => setFile(e.target.files?.[0] ?? null)} />
        </div>
        <div className="flex items-end"><button type="submit" className="btn-primary w-full" disabled={!file || up.isPending}>Upload</button></div>
        {up.error && <p className="font-semibold text-bad sm:col-span-4" role="alert"><Icon name="warning" /> {failure(up.error)}</p>}
      </form>
      {imp && (
        <div className="grid gap-4">
          <section className="card" aria-labelledby="map-title">
            <h2 id="map-title" className="mb-2 text-xl font-semibold">{imp.filename}: match the columns</h2>
            {imp.repeated && <p className="mb-2 font-semibold" role="status">This file was uploaded before; its first import is shown and nothing will be added twice.</p>}
            {imp.savedMappings.length > 0 && (
              <p className="mb-2">Saved mappings: {imp.savedMappings.map((m) => <button key={m.name} type="button" className="btn-quiet mr-2" onClick={() => setMapping(m.mapping)}>{m.name}</button>)}</p>
            )}
            <table className="w-full text-left text-sm">
              <thead><tr><th className="py-1">Field</th><th>Column in the file</th></tr></thead>
              <tbody>
                {fields.map((f) => (
                  <tr key={f.key} className="border-t border-concrete-100">
                    <td className="py-1"><label htmlFor={`map-${f.key}`}>{f.label}{f.required ? ' (required)' : ''}</label></td>
                    <td>
                      <select id={`map-${f.key}`} className="input" value={mapping[f.key] ?? ''} onChange={(e) => setMapping({ ...mapping, [f.key]: e.target.value || null })}>
                        <option value="">Not imported</option>
                        {imp.header.map((h) => <option key={h} value={h}>{h}</option>)}
                      </select>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            {imp.ignoredColumns.length > 0 && <p className="mt-2 text-sm">Columns not imported: {imp.ignoredColumns.join(', ')}</p>}
            <div className="mt-3 flex flex-wrap items-end gap-3">
              <div><label className="label" htmlFor="save-as">Save this mapping as</label><input id="save-as" className="input" value={saveAs} onChange={(e) => setSaveAs(e.target.value)} /></div>
              <button type="button" className="btn-quiet" onClick={() => preview.mutate()} disabled={imp.status !== 'uploaded'}>Preview</button>
            </div>
            {preview.error && <p className="mt-2 font-semibold text-bad" role="alert">{failure(preview.error)}</p>}
          </section>
          {preview.data && (
            <section className="card" aria-labelledby="preview-title">
              <h2 id="preview-title" className="mb-2 text-xl font-semibold">Preview: {preview.data.valid} of {preview.data.total} rows can be imported</h2>
              {preview.data.missing.length > 0 && <p className="font-semibold text-bad">Map these first: {preview.data.missing.join(', ')}</p>}
              {preview.data.errors.length > 0 && (
                <div className="mb-3">
                  <h3 className="font-semibold">Rows that will be refused ({preview.data.invalid})</h3>
                  <table className="w-full text-left text-sm"><thead><tr><th>Line</th><th>Column</th><th>Why</th></tr></thead>
                    <tbody>{preview.data.errors.map((e, i) => <tr key={i} className="border-t border-concrete-100"><td className="py-1">{e.line}</td><td>{e.column}</td><td>{e.reason}</td></tr>)}</tbody>
                  </table>
                </div>
              )}
              <h3 className="font-semibold">As understood (first rows)</h3>
              <div className="overflow-x-auto"><table className="w-full text-left text-sm">
                <tbody>{preview.data.rows.map((r) => <tr key={r.line} className="border-t border-concrete-100"><td className="py-1 pr-2">{r.line}</td>{Object.entries(r.values).filter(([k]) => !k.endsWith('Id')).map(([k, v]) => <td key={k} className="pr-2">{v}</td>)}</tr>)}</tbody>
              </table></div>
              <label className="mt-3 flex items-center gap-2"><input type="checkbox" className="h-5 w-5" checked={allOrNothing} onChange={(e) => setAllOrNothing(e.target.checked)} /> All or nothing: import no row if any row is refused</label>
              <button type="button" className="btn-primary mt-3" onClick={() => commit.mutate()} disabled={commit.isPending || imp.status !== 'uploaded' || preview.data.missing.length > 0}>Import</button>
              {commit.error && <p className="mt-2 font-semibold text-bad" role="alert">{failure(commit.error)}</p>}
            </section>
          )}
          {imp.result && (
            <section className="card" aria-labelledby="result-title" role="status">
              <h2 id="result-title" className="mb-2 text-xl font-semibold">{imp.status === 'committed' ? 'Imported' : 'Nothing imported'}</h2>
              <p>{imp.result.added} added · {imp.result.duplicates} already there · {imp.result.rejected} refused · {imp.result.total} rows in the file</p>
              {imp.result.rejected > 0 && <a className="btn-quiet mt-2" href={`/api/imports/${imp.id}/refused.csv`}>Download the refused rows (CSV with the reason)</a>}
            </section>
          )}
        </div>
      )}
      <h2 className="mb-2 mt-6 text-xl font-semibold">Recent imports</h2>
      <ul className="grid gap-1 text-sm">{recent.map((r) => <li key={r.id}>{r.filename} · {r.kind} · {r.status}{r.result ? ` · ${r.result.added} added, ${r.result.rejected} refused` : ''}</li>)}</ul>
    </section>
  );
}
