import { PIECE_STATUS_LABELS, type PieceStatus } from '#shared/api/pieces';
import { Icon, type IconName } from './icon';

// Status is never colour alone: every badge has a symbol and words.
const LOOK: Record<PieceStatus, { icon: IconName; cls: string }> = {
  cast: { icon: 'clock', cls: 'bg-concrete-100 text-concrete-800' },
  in_storage: { icon: 'stack', cls: 'bg-concrete-100 text-concrete-800' },
  hold: { icon: 'hand', cls: 'bg-warn-light text-warn' },
  engineering: { icon: 'warning', cls: 'bg-warn-light text-warn' },
  cleared: { icon: 'check', cls: 'bg-ok-light text-ok' },
  shipped: { icon: 'truck', cls: 'bg-concrete-200 text-concrete-700' },
};

export function StatusBadge({ status }: { status: PieceStatus }) {
  const l = LOOK[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-sm font-semibold ${l.cls}`}>
      <Icon name={l.icon} className="h-4 w-4" />
      {PIECE_STATUS_LABELS[status]}
    </span>
  );
}
