import { useQuery } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Link, useParams } from 'react-router';
import type { DesignSpec } from '#shared/api/designs';
import { Caution } from '../../components/ui/caution';
import { meQuery } from '../../features/auth/api';
import { ReadingEntry } from '../../features/readings/components/reading-entry';
import { QueuePanel } from '../../features/readings/components/queue-panel';
import { yardPackQuery } from '../../features/yard/pack';
import { rememberPiece } from '../../features/yard/recent';
import { camberText, dateTimeText } from '../../lib/format';

export function YardPiecePage() {
  const { id } = useParams();
  const { data: me } = useQuery(meQuery);
  const { data: pack } = useQuery(yardPackQuery);
  useEffect(() => {
    if (id) rememberPiece(id);
  }, [id]);
  if (!pack || !me) return null;
  const piece = pack.pieces.find((p) => p.id === id);
  if (!piece) {
    return (
      <section className="mx-auto max-w-3xl">
        <h1 className="text-3xl font-semibold">Piece not in the yard list</h1>
        <p className="mt-2 text-lg">This piece is not among the pieces in storage (it may have shipped, or belong to another plant).</p>
        <Link className="btn-quiet mt-4 min-h-[56px] text-lg" to="/yard">
          ← Back to the yard
        </Link>
      </section>
    );
  }
  const design = pack.designs.find((d) => d.id === piece.designId);
  return (
    <section aria-labelledby="piece-mark" className="mx-auto max-w-3xl text-ink">
      <Link className="mb-3 inline-flex min-h-[48px] items-center text-lg underline" to="/yard">
        ← Find another piece
      </Link>
      <h1 id="piece-mark" className="text-4xl font-semibold">
        {piece.mark}
      </h1>
      <p className="mb-3 text-lg">
        Job {piece.jobNumber} · {design?.code ?? 'design unknown'} · {piece.bed ?? 'no bed'} · cast {piece.castDate}
        {piece.latestReading ? ` · last reading ${camberText(piece.latestReading.valueMm, me.unitSystem)} on ${dateTimeText(piece.latestReading.takenAt, me.timeZone)}` : ' · no reading yet'}
      </p>
      <div className="mb-4">
        <QueuePanel />
      </div>
      <ReadingEntry piece={piece} spec={(design?.spec as DesignSpec | undefined) ?? null} unit={me.unitSystem === 'us' ? 'in' : 'mm'} />
      <Caution />
    </section>
  );
}
