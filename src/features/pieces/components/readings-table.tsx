import type { ReadingDto } from '#shared/api/readings';
import { Icon } from '../../../components/ui/icon';
import { READING_METHOD_LABELS, SKY_LABELS, SUPPORT_LABELS } from '#shared/api/readings';
import { camberText, dateTimeText } from '../../../lib/format';

const label = <K extends string>(map: Record<K, string>, k: string | null): string => (k ? (map[k as K] ?? k) : '—');

export function ReadingsTable({ readings, unit, timeZone }: { readings: ReadingDto[]; unit: 'us' | 'si'; timeZone: string }) {
  if (readings.length === 0) return <p>No readings yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-concrete-200 bg-white">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Readings, newest first</caption>
        <thead className="bg-concrete-100">
          <tr>
            <th className="px-3 py-2">Taken</th>
            <th className="px-3 py-2">Camber</th>
            <th className="px-3 py-2">As entered</th>
            <th className="px-3 py-2">Method</th>
            <th className="px-3 py-2">Supports</th>
            <th className="px-3 py-2">Sky</th>
            <th className="px-3 py-2">By</th>
            <th className="px-3 py-2">Note</th>
          </tr>
        </thead>
        <tbody>
          {readings.map((r) => (
            <tr key={r.id} className={`border-t border-concrete-100 ${r.supersededBy ? 'text-concrete-500 line-through' : ''}`}>
              <td className="px-3 py-2">{dateTimeText(r.takenAt, timeZone)}</td>
              <td className="px-3 py-2 font-semibold">
                {camberText(r.valueMm, unit)}
                {r.likelyDistorted && (
                  <span className="ml-2 rounded bg-warn-light px-1 text-warn no-underline" title="Taken in afternoon sun: the top flange is warmer and the piece bows up">
                    <Icon name="sun" className="h-4 w-4" /> sun-affected
                  </span>
                )}
                {r.supersededBy && <span className="sr-only"> (corrected by a later reading)</span>}
              </td>
              <td className="px-3 py-2">{r.enteredText}</td>
              <td className="px-3 py-2">{label(READING_METHOD_LABELS, r.method)}</td>
              <td className="px-3 py-2">{label(SUPPORT_LABELS, r.support)}</td>
              <td className="px-3 py-2">{label(SKY_LABELS, r.sky)}</td>
              <td className="px-3 py-2">{r.takenBy}</td>
              <td className="px-3 py-2">
                {r.correctionReason ? `Correction: ${r.correctionReason}. ` : ''}
                {r.note ?? ''}
                {r.hasPhoto && (
                  <a className="ml-1 underline" href={`/api/readings/${r.id}/photo`} target="_blank" rel="noreferrer">
                    <Icon name="camera" className="h-4 w-4" /> Photo
                  </a>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
