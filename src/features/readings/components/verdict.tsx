import type { BandCheck } from '#shared/yard/band-check';
import { formatLength } from '#shared/camber/tape';
import { Icon, type IconName } from '../../../components/ui/icon';

const signed = (mm: number, unit: 'in' | 'mm'): string => `${mm >= 0 ? '+' : '−'}${formatLength(Math.abs(mm), unit)}`;

/** Where a reading falls, in words and a symbol (never colour alone), with what to do next. */
export function Verdict({ check, unit, sunAfternoon }: { check: BandCheck; unit: 'in' | 'mm'; sunAfternoon: boolean }) {
  const range = `${formatLength(check.lowMm, unit)} to ${formatLength(check.highMm, unit)}`;
  const diff = signed(check.differenceMm, unit);
  const look: { icon: IconName; title: string; cls: string } =
    check.verdict === 'in-band'
      ? { icon: 'check', title: 'Inside the expected band', cls: 'border-ok bg-white text-ok' }
      : check.verdict === 'outside-band'
        ? { icon: check.differenceMm > 0 ? 'up' : 'down', title: `Outside the expected band (${check.differenceMm > 0 ? 'higher' : 'lower'})`, cls: 'border-warn bg-white text-warn' }
        : { icon: 'cross', title: 'Outside the tolerance limits', cls: 'border-bad bg-white text-bad' };
  return (
    <div className={`rounded-lg border-4 p-4 ${look.cls}`} role="status" aria-live="polite">
      <p className="flex items-center gap-2 text-2xl font-semibold text-ink">
        <Icon name={look.icon} className="h-7 w-7" /> {look.title}
      </p>
      <p className="mt-1 text-lg text-ink">
        Expected at {Math.floor(check.ageDays)} days: {formatLength(check.predictedMm, unit)} (band {range}); this reading is {diff} from it.
      </p>
      {sunAfternoon && (
        <p className="mt-2 text-lg font-semibold text-ink">
          <Icon name="sun" /> Taken in afternoon sun: the warm top flange bows the piece up, so this reading is marked as likely distorted.
        </p>
      )}
      {check.verdict !== 'in-band' && (
        <div className="mt-2 text-lg text-ink">
          <p className="font-semibold">Please measure again before saving. What often distorts a reading:</p>
          <ul className="ml-6 list-disc">
            <li>sun on the top flange (measure early morning or in shade);</li>
            <li>wrong reference points (use the piece ends, or the marked stations);</li>
            <li>the piece not sitting free (dunnage uneven, stacked load, touching a neighbour);</li>
            <li>a sagging string line (pull it tight, or use the level).</li>
          </ul>
        </div>
      )}
    </div>
  );
}
