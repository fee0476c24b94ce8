import { Link } from 'react-router';
import { Icon } from '../../../components/ui/icon';
import { discard, flush, retry } from '../outbox';
import { useOutbox } from '../use-outbox';

/** How many readings wait on this tablet, which need attention and why; never silent. */
export function QueuePanel() {
  const s = useOutbox();
  const waiting = s.entries.filter((e) => e.status === 'waiting');
  const failed = s.entries.filter((e) => e.status === 'failed');
  return (
    <section aria-label="Readings on this tablet" className="rounded-lg border-2 border-ink bg-white p-3">
      <p className="flex items-center gap-2 text-lg font-semibold" role="status" aria-live="polite" data-testid="queue-status">
        <Icon name={waiting.length === 0 ? 'check' : 'clock'} />
        {waiting.length === 0 ? 'All readings sent' : `${waiting.length} ${waiting.length === 1 ? 'reading waits' : 'readings wait'} to be sent${s.sending ? ' (sending…)' : ''}`}
      </p>
      {s.signInNeeded && (
        <p className="mt-2 text-lg font-semibold text-bad" role="alert">
          <Icon name="key" /> Your sign-in has expired. The readings stay on this tablet.{' '}
          <Link className="underline" to="/login?next=/yard">
            Sign in again
          </Link>{' '}
          to send them.
        </p>
      )}
      {waiting.length > 0 && !s.signInNeeded && (
        <button type="button" className="btn-quiet mt-2 min-h-[48px]" onClick={() => void flush()}>
          Send now
        </button>
      )}
      {failed.length > 0 && (
        <div className="mt-3">
          <h2 className="flex items-center gap-2 text-lg font-semibold text-bad">
            <Icon name="warning" /> Needs attention ({failed.length})
          </h2>
          <ul className="mt-1 grid gap-2">
            {failed.map((e) => (
              <li key={e.key} className="rounded border border-bad p-2">
                <p className="font-semibold">
                  {e.mark}: {e.input.value} {e.input.unit}
                </p>
                <p>The server refused it: {e.error}</p>
                <div className="mt-1 flex gap-2">
                  <button type="button" className="btn-quiet" onClick={() => void retry(e.key)}>
                    Try again
                  </button>
                  <button type="button" className="btn-quiet" onClick={() => window.confirm(`Discard the reading of ${e.mark}? It was never stored on the server.`) && void discard(e.key)}>
                    Discard
                  </button>
                </div>
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
