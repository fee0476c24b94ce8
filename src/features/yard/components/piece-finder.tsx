import { useState } from 'react';
import { Icon } from '../../../components/ui/icon';
import { Link } from 'react-router';
import type { YardPiece } from '#shared/api/yard';
import { markKey } from '../pack';
import { recentPieceIds } from '../recent';

function PieceButton({ p }: { p: YardPiece }) {
  return (
    <li>
      <Link to={`/yard/pieces/${p.id}`} className="flex min-h-[56px] items-center justify-between gap-3 rounded-lg border-2 border-ink bg-white px-4 py-2 text-yard font-semibold">
        <span>{p.mark}</span>
        <span className="text-base font-normal">
          {p.jobNumber} · {p.bed ?? ''}
          {p.overdue ? (
            <span className="ml-1 inline-flex items-center gap-1 font-semibold">
              · <Icon name="warning" /> overdue
            </span>
          ) : p.due ? (
            <span className="ml-1 inline-flex items-center gap-1">
              · <Icon name="clock" /> due today
            </span>
          ) : null}
        </span>
      </Link>
    </li>
  );
}

/** Search by mark as you type, recent pieces, and pieces due a reading today. */
export function PieceFinder({ pieces }: { pieces: YardPiece[] }) {
  const [q, setQ] = useState('');
  const key = markKey(q);
  const matches = key ? pieces.filter((p) => markKey(p.mark).includes(key)).slice(0, 12) : [];
  const byId = new Map(pieces.map((p) => [p.id, p]));
  const recent = recentPieceIds().map((id) => byId.get(id)).filter((p): p is YardPiece => !!p);
  const due = pieces.filter((p) => p.due).sort((a, b) => Number(b.overdue) - Number(a.overdue) || a.mark.localeCompare(b.mark));
  return (
    <div>
      <label htmlFor="mark-search" className="mb-2 block text-yard font-semibold">
        Piece mark
      </label>
      <input
        id="mark-search"
        className="input min-h-[56px] border-2 border-ink text-2xl"
        type="search"
        autoComplete="off"
        placeholder="e.g. DT-104"
        value={q}
        onChange={(e) => setQ(e.target.value)}
      />
      {key && (
        <section aria-label="Matching pieces" className="mt-3">
          {matches.length === 0 ? <p className="text-yard">No piece in the yard has a mark like “{q}”.</p> : <ul className="grid gap-2">{matches.map((p) => <PieceButton key={p.id} p={p} />)}</ul>}
        </section>
      )}
      {!key && recent.length > 0 && (
        <section aria-labelledby="recent-title" className="mt-6">
          <h2 id="recent-title" className="mb-2 text-xl font-semibold">
            Recent pieces
          </h2>
          <ul className="grid gap-2">{recent.map((p) => <PieceButton key={p.id} p={p} />)}</ul>
        </section>
      )}
      {!key && (
        <section aria-labelledby="due-title" className="mt-6">
          <h2 id="due-title" className="mb-2 text-xl font-semibold">
            Due a reading today ({due.length})
          </h2>
          {due.length === 0 ? <p>Every piece in the yard has its scheduled reading.</p> : <ul className="grid gap-2">{due.map((p) => <PieceButton key={p.id} p={p} />)}</ul>}
        </section>
      )}
    </div>
  );
}
