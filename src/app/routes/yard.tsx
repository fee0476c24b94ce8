import { useQuery } from '@tanstack/react-query';
import { Icon } from '../../components/ui/icon';
import { lazy, Suspense, useCallback, useState } from 'react';
import { useNavigate } from 'react-router';
import { QueuePanel } from '../../features/readings/components/queue-panel';
import { PieceFinder } from '../../features/yard/components/piece-finder';
import { yardPackQuery } from '../../features/yard/pack';

const TagScanner = lazy(() => import('../../features/yard/components/tag-scanner'));

/** The inspector's start: find the piece by mark, tag, recent use or today's schedule. */
export function YardPage() {
  const { data: pack } = useQuery(yardPackQuery);
  const [scanning, setScanning] = useState(false);
  const navigate = useNavigate();
  const open = useCallback((id: string) => navigate(`/yard/pieces/${id}`), [navigate]);
  if (!pack) return null;
  return (
    <section aria-labelledby="yard-title" className="mx-auto max-w-3xl text-ink">
      <h1 id="yard-title" className="mb-3 text-3xl font-semibold">
        Yard readings
      </h1>
      {pack.offline && (
        <p className="mb-3 rounded-lg border-2 border-ink bg-warn-light p-3 text-lg font-semibold" role="status">
          <Icon name="warning" /> No connection: working from the yard list kept on this tablet ({new Date(pack.generatedAt).toLocaleString()}). Readings are kept and sent later.
        </p>
      )}
      <div className="mb-4">
        <QueuePanel />
      </div>
      <button type="button" className="btn-primary mb-4 min-h-[64px] w-full text-2xl" onClick={() => setScanning((s) => !s)} aria-expanded={scanning}>
        {scanning ? 'Stop scanning' : '▣ Scan a piece tag'}
      </button>
      {scanning && (
        <Suspense fallback={<p className="text-lg">Starting the camera…</p>}>
          <div className="mb-4">
            <TagScanner onPiece={open} onClose={() => setScanning(false)} />
          </div>
        </Suspense>
      )}
      <PieceFinder pieces={pack.pieces} />
    </section>
  );
}
