import type { FlagDto } from '#shared/api/review';
import { FLAG_LABELS } from '#shared/projection/project';
import { Icon } from '../../../components/ui/icon';

/** Flags with their reasons; severity in words and a symbol, not colour alone. */
export function FlagList({ flags, compact = false }: { flags: FlagDto[]; compact?: boolean }) {
  if (flags.length === 0) return <p className="flex items-center gap-2"><Icon name="check" /> No flags.</p>;
  return (
    <ul className="grid gap-2">
      {flags.map((f) => (
        <li key={f.kind} className={`rounded border-l-4 bg-white px-3 py-2 ${f.severity >= 3 ? 'border-bad' : f.severity === 2 ? 'border-warn' : 'border-concrete-400'}`}>
          <p className="flex items-center gap-2 font-semibold">
            <Icon name={f.severity >= 3 ? 'cross' : f.severity === 2 ? 'warning' : 'clock'} className="h-4 w-4" />
            {FLAG_LABELS[f.kind]}
            <span className="sr-only">, severity {f.severity >= 3 ? 'high' : f.severity === 2 ? 'medium' : 'low'}</span>
          </p>
          {!compact && <p className="text-sm">{f.reason}</p>}
        </li>
      ))}
    </ul>
  );
}
