import { PIECE_STATUS_LABELS, type PieceStatus } from '#shared/api/pieces';

// Status is never colour alone: every badge has a symbol and words.
const LOOK: Record<PieceStatus, { icon: string; cls: string }> = {
  cast: { icon: '◔', cls: 'bg-concrete-100 text-concrete-800' },
  in_storage: { icon: '▤', cls: 'bg-concrete-100 text-concrete-800' },
  hold: { icon: '✋', cls: 'bg-warn-light text-warn' },
  cleared: { icon: '✓', cls: 'bg-ok-light text-ok' },
  shipped: { icon: '➜', cls: 'bg-concrete-200 text-concrete-700' },
};

export function StatusBadge({ status }: { status: PieceStatus }) {
  const l = LOOK[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-sm font-semibold ${l.cls}`}>
      <span aria-hidden="true">{l.icon}</span>
      {PIECE_STATUS_LABELS[status]}
    </span>
  );
}
