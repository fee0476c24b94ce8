import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router';
import { STARTER_SPEC, type DesignInput } from '#shared/api/designs';
import { Icon } from '../../components/ui/icon';
import { addPieces, copyDesign, createDesign, createJob, designQuery, designsQuery, updateDesign } from '../../features/designs/api';
import { DesignEditor } from '../../features/designs/components/design-editor';
import { jobsQuery } from '../../features/pieces/api';
import { ApiFailure } from '../../lib/api';

const message = (e: unknown): string | null => (e instanceof ApiFailure ? `${e.message}${e.body.fieldErrors ? `: ${Object.entries(e.body.fieldErrors).map(([k, v]) => `${k} ${v.join(', ')}`).join('; ')}` : ''}` : e ? 'failed' : null);

/** Designs (every version) and the piece schedule. */
export function DesignsPage() {
  const { data: designs = [] } = useQuery(designsQuery);
  const { data: jobs = [] } = useQuery(jobsQuery);
  const qc = useQueryClient();
  const latest = new Map<string, number>();
  for (const d of designs) latest.set(d.code, Math.max(latest.get(d.code) ?? 0, d.version));
  const copy = useMutation({ mutationFn: (v: { id: string; code: string }) => copyDesign(v.id, v.code, `Copy of ${v.code}`), onSuccess: () => qc.invalidateQueries({ queryKey: ['designs'] }) });
  const [job, setJob] = useState({ number: '', name: '' });
  const addJob = useMutation({ mutationFn: () => createJob(job.number, job.name), onSuccess: () => qc.invalidateQueries({ queryKey: ['jobs'] }) });
  const [bulk, setBulk] = useState({ jobId: '', designId: '', markPattern: 'DT-{n}', start: 1, count: 6, castDate: '', shipDate: '', bay: '' });
  const add = useMutation({
    mutationFn: () => addPieces({ ...bulk, shipDate: bulk.shipDate || undefined, bay: bulk.bay || undefined }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['pieces'] }),
  });
  return (
    <section aria-labelledby="designs-title">
      <div className="mb-4 flex items-center gap-3">
        <h1 id="designs-title" className="text-2xl font-semibold">Member designs</h1>
        <Link className="btn-primary ml-auto" to="/designs/new">New design</Link>
      </div>
      <div className="mb-6 overflow-x-auto rounded-lg border border-concrete-200 bg-white">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">Designs and their versions</caption>
          <thead className="bg-concrete-100"><tr><th className="px-3 py-2">Code</th><th className="px-3 py-2">Version</th><th className="px-3 py-2">Name</th><th className="px-3 py-2">Product</th><th className="px-3 py-2">Pieces</th><th className="px-3 py-2"><span className="sr-only">Actions</span></th></tr></thead>
          <tbody>{designs.map((d) => (
            <tr key={d.id} className="border-t border-concrete-100">
              <td className="px-3 py-2 font-semibold">{d.code}</td><td className="px-3 py-2">{d.version}</td><td className="px-3 py-2">{d.name}</td><td className="px-3 py-2">{d.productType}</td><td className="px-3 py-2">{d.pieces}</td>
              <td className="px-3 py-2">
                {latest.get(d.code) === d.version && <Link className="btn-quiet mr-2" to={`/designs/${d.id}/edit`}>Edit {d.code}</Link>}
                <button type="button" className="btn-quiet" onClick={() => { const code = window.prompt('Code of the copy', `${d.code}-B`); if (code) copy.mutate({ id: d.id, code }); }}>Copy</button>
              </td>
            </tr>
          ))}</tbody>
        </table>
      </div>
      <h2 className="mb-2 text-xl font-semibold">Piece schedule</h2>
      <div className="grid gap-4 lg:grid-cols-2">
        <form className="card grid gap-3 sm:grid-cols-2" onSubmit={(e) => { e.preventDefault(); addJob.mutate(); }} aria-label="Add a job">
          <div><label className="label" htmlFor="job-number">Job number</label><input id="job-number" className="input" value={job.number} onChange={(e) => setJob({ ...job, number: e.target.value })} /></div>
          <div><label className="label" htmlFor="job-name">Job name</label><input id="job-name" className="input" value={job.name} onChange={(e) => setJob({ ...job, name: e.target.value })} /></div>
          <button type="submit" className="btn-quiet">Add the job</button>
          {addJob.error && <p className="font-semibold text-bad" role="alert">{message(addJob.error)}</p>}
          {addJob.isSuccess && <p className="flex items-center gap-2 text-ok" role="status"><Icon name="check" /> Job added.</p>}
        </form>
        <form className="card grid gap-3 sm:grid-cols-2" onSubmit={(e) => { e.preventDefault(); add.mutate(); }} aria-label="Add pieces">
          <div><label className="label" htmlFor="b-job">Job</label><select id="b-job" className="input" value={bulk.jobId} onChange={(e) => setBulk({ ...bulk, jobId: e.target.value })}><option value="">Choose</option>{jobs.map((j) => <option key={j.id} value={j.id}>{j.number} {j.name}</option>)}</select></div>
          <div><label className="label" htmlFor="b-design">Design</label><select id="b-design" className="input" value={bulk.designId} onChange={(e) => setBulk({ ...bulk, designId: e.target.value })}><option value="">Choose</option>{designs.map((d) => <option key={d.id} value={d.id}>{d.code} v{d.version}</option>)}</select></div>
          <div><label className="label" htmlFor="b-pattern">Mark pattern ({'{n}'} is the number)</label><input id="b-pattern" className="input" value={bulk.markPattern} onChange={(e) => setBulk({ ...bulk, markPattern: e.target.value })} /></div>
          <div className="grid grid-cols-2 gap-2">
            <div><label className="label" htmlFor="b-start">First number</label><input id="b-start" className="input" inputMode="numeric" value={bulk.start} onChange={(e) => setBulk({ ...bulk, start: Number(e.target.value) })} /></div>
            <div><label className="label" htmlFor="b-count">How many</label><input id="b-count" className="input" inputMode="numeric" value={bulk.count} onChange={(e) => setBulk({ ...bulk, count: Number(e.target.value) })} /></div>
          </div>
          <div><label className="label" htmlFor="b-cast">Cast date</label><input id="b-cast" type="date" className="input" value={bulk.castDate} onChange={(e) => setBulk({ ...bulk, castDate: e.target.value })} /></div>
          <div><label className="label" htmlFor="b-ship">Planned ship date</label><input id="b-ship" type="date" className="input" value={bulk.shipDate} onChange={(e) => setBulk({ ...bulk, shipDate: e.target.value })} /></div>
          <div><label className="label" htmlFor="b-bay">Erection bay (positions in order)</label><input id="b-bay" className="input" value={bulk.bay} onChange={(e) => setBulk({ ...bulk, bay: e.target.value })} /></div>
          <button type="submit" className="btn-primary">Add the pieces</button>
          {add.error && <p className="font-semibold text-bad sm:col-span-2" role="alert">{message(add.error)}</p>}
          {add.isSuccess && <p className="flex items-center gap-2 text-ok sm:col-span-2" role="status"><Icon name="check" /> {add.data.created.length} pieces added.</p>}
        </form>
      </div>
    </section>
  );
}

const NEW_DESIGN: DesignInput = { code: '', name: '', spec: STARTER_SPEC };

export function DesignEditPage() {
  const { id } = useParams();
  const navigate = useNavigate();
  const qc = useQueryClient();
  const { data } = useQuery({ ...designQuery(id ?? ''), enabled: !!id });
  const [problem, setProblem] = useState<string | null>(null);
  if (id && !data) return null;
  const initial: DesignInput = data ? { code: data.code, name: data.name, spec: data.spec as DesignInput['spec'] } : NEW_DESIGN;
  const save = async (v: DesignInput): Promise<void> => {
    try {
      const saved = data ? await updateDesign(data.id, { name: v.name, spec: v.spec }) : await createDesign(v);
      await qc.invalidateQueries({ queryKey: ['designs'] });
      navigate(`/designs?saved=${saved.code}-v${saved.version}`);
    } catch (e) {
      setProblem(message(e));
    }
  };
  return (
    <section aria-labelledby="edit-title">
      <h1 id="edit-title" className="mb-4 text-2xl font-semibold">{data ? `Edit ${data.code} (version ${data.version})` : 'New design'}</h1>
      {problem && <p className="mb-3 font-semibold text-bad" role="alert">{problem}</p>}
      <DesignEditor initial={initial} codeLocked={!!data && data.pieces > 0} saveLabel={data ? 'Save the design' : 'Create the design'} onSave={save} />
    </section>
  );
}
