import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { jobsQuery, piecesQuery } from '../../features/pieces/api';
import { PieceTag } from '../../features/yard/components/piece-tag';

/** Printable QR tags, one per piece, for the pieces of a job still in the plant. */
export function TagsPage() {
  const { data: jobs = [] } = useQuery(jobsQuery);
  const [jobId, setJobId] = useState('');
  const { data } = useQuery({ ...piecesQuery({ jobId: jobId || undefined, sort: 'mark', dir: 'asc', page: 1, pageSize: 200 }), enabled: !!jobId });
  const pieces = (data?.items ?? []).filter((p) => p.status !== 'shipped');
  return (
    <section aria-labelledby="tags-title">
      <h1 id="tags-title" className="mb-4 text-2xl font-semibold">
        Piece tags
      </h1>
      <div className="no-print mb-4 flex flex-wrap items-end gap-3">
        <div>
          <label className="label" htmlFor="tag-job">
            Job
          </label>
          <select id="tag-job" className="input" value={jobId} onChange={(e) => setJobId(e.target.value)}>
            <option value="">Choose a job</option>
            {jobs.map((j) => (
              <option key={j.id} value={j.id}>
                {j.number} {j.name}
              </option>
            ))}
          </select>
        </div>
        <button type="button" className="btn-primary" disabled={pieces.length === 0} onClick={() => window.print()}>
          Print {pieces.length} tags
        </button>
      </div>
      <div className="grid gap-3 sm:grid-cols-2 print:grid-cols-2">
        {pieces.map((p) => (
          <PieceTag key={p.id} pieceId={p.id} mark={p.mark} jobNumber={p.jobNumber} origin={window.location.origin} />
        ))}
      </div>
    </section>
  );
}
