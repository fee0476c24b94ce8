import { useState } from 'react';
import { Icon } from '../../../components/ui/icon';
import type { DesignSpec } from '#shared/api/designs';
import { isLikelyDistorted, READING_METHOD_LABELS, READING_METHODS, SKIES, SKY_LABELS, SUPPORT_LABELS, SUPPORTS, type CreateReadingInput } from '#shared/api/readings';
import { echoTape, parseTape, TapeParseError } from '#shared/camber/tape';
import { checkReading, type BandCheck } from '#shared/yard/band-check';
import { ChoiceGroup } from '../../../components/ui/choice-group';
import { newIdempotencyKey } from '../../../lib/api';
import { shrinkPhoto } from '../../../lib/image';
import { enqueue } from '../outbox';
import { TapeKeypad } from './tape-keypad';
import { Verdict } from './verdict';

const localNow = (): string => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

interface Props {
  piece: { id: string; mark: string; castDate: string };
  spec: DesignSpec | null;
  unit: 'in' | 'mm';
  onSaved?: () => void;
}

type Method = (typeof READING_METHODS)[number];
type Support = (typeof SUPPORTS)[number];
type Sky = (typeof SKIES)[number];

/**
 * Logs a reading as the inspector reads it. The value is echoed as understood and checked against the
 * expected band at once (the engine runs on the tablet), then the reading goes to the tablet's queue,
 * which sends it now or when the connection returns.
 */
export function ReadingEntry({ piece, spec, unit, onSaved }: Props) {
  const [value, setValue] = useState('');
  const [method, setMethod] = useState<Method>('tape-string-line');
  const [support, setSupport] = useState<Support>('dunnage');
  const [overhang, setOverhang] = useState('');
  const [sky, setSky] = useState<Sky | ''>('');
  const [takenAt, setTakenAt] = useState(localNow);
  const [airTemp, setAirTemp] = useState('');
  const [note, setNote] = useState('');
  const [showKeypad, setShowKeypad] = useState(true);
  const [saved, setSaved] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [key, setKey] = useState(newIdempotencyKey);
  const [photo, setPhoto] = useState<Blob | null>(null);
  const [photoName, setPhotoName] = useState('');

  let parsed: ReturnType<typeof parseTape> | null = null;
  let parseError: string | null = null;
  if (value.trim()) {
    try {
      parsed = parseTape(value, unit);
    } catch (e) {
      parseError = e instanceof TapeParseError ? e.message : 'not understood';
    }
  }
  let overhangMm: number | undefined;
  let overhangError: string | null = null;
  if (support === 'dunnage' && overhang.trim()) {
    try {
      overhangMm = parseTape(overhang, unit).mm;
    } catch (e) {
      overhangError = e instanceof TapeParseError ? e.message : 'not understood';
    }
  }
  const when = new Date(takenAt);
  let check: BandCheck | null = null;
  if (parsed && spec && !Number.isNaN(when.getTime())) {
    try {
      check = checkReading({ spec, castDate: piece.castDate, takenAt: when, valueMm: parsed.mm, support, overhangMm });
    } catch {
      check = null; // a design the engine cannot read: the reading is still saved, without the check
    }
  }
  const sunAfternoon = isLikelyDistorted(sky, when.getHours());

  const save = async (e: React.FormEvent): Promise<void> => {
    e.preventDefault();
    setSaved(null);
    if (!parsed) {
      setError(parseError ?? 'enter the reading first');
      return;
    }
    if (overhangError) {
      setError(`overhang: ${overhangError}`);
      return;
    }
    const temp = airTemp.trim() === '' ? undefined : Number(airTemp);
    const input: CreateReadingInput = {
      pieceId: piece.id,
      value,
      unit,
      takenAt: when.toISOString(),
      method,
      support,
      overhangMm,
      sky: sky || undefined,
      airTempC: temp === undefined || Number.isNaN(temp) ? undefined : unit === 'in' ? ((temp - 32) * 5) / 9 : temp,
      note: note.trim() || undefined,
    };
    setError(null);
    await enqueue(input, key, piece.mark, photo ?? undefined);
    setSaved(`${echoTape(parsed)} for ${piece.mark} is saved on this tablet.`);
    setKey(newIdempotencyKey());
    setValue('');
    setNote('');
    setPhoto(null);
    setPhotoName('');
    onSaved?.();
  };

  return (
    <form onSubmit={(e) => void save(e)} className="rounded-lg border-2 border-ink bg-white p-4" aria-labelledby="entry-title" noValidate>
      <h2 id="entry-title" className="mb-3 text-2xl font-semibold">
        Log a reading for {piece.mark}
      </h2>
      <label htmlFor="camber-value" className="block text-lg font-semibold">
        Camber ({unit === 'in' ? 'inches, e.g. 1 3/8' : 'millimetres'})
      </label>
      <input
        id="camber-value"
        className="input mt-1 min-h-[64px] border-2 border-ink text-3xl font-semibold"
        autoComplete="off"
        inputMode={unit === 'mm' ? 'decimal' : 'text'}
        value={value}
        onChange={(e) => setValue(e.target.value)}
        aria-describedby="camber-echo"
        aria-invalid={!!parseError}
      />
      <p id="camber-echo" className="mt-1 min-h-[28px] text-lg" aria-live="polite">
        {parsed ? `Understood as ${echoTape(parsed)}` : parseError ? <span className="font-semibold text-bad"><Icon name="warning" className="h-4 w-4" /> {parseError}</span> : ''}
      </p>
      <button type="button" className="text-base underline" onClick={() => setShowKeypad((s) => !s)} aria-expanded={showKeypad}>
        {showKeypad ? 'Hide the keypad' : 'Show the keypad'}
      </button>
      {showKeypad && <TapeKeypad value={value} onChange={setValue} inches={unit === 'in'} />}
      {check && (
        <div className="mt-4">
          <Verdict check={check} unit={unit} sunAfternoon={sunAfternoon} />
        </div>
      )}
      {!spec && <p className="mt-3 text-lg">The expected band is not available for this piece; the reading is still saved.</p>}
      <div className="mt-4">
        <ChoiceGroup legend="Method" name="method" value={method} options={READING_METHODS} labels={READING_METHOD_LABELS} onChange={setMethod} />
        <ChoiceGroup legend="Where the piece sits" name="support" value={support} options={SUPPORTS} labels={SUPPORT_LABELS} onChange={setSupport} />
        {support === 'dunnage' && (
          <div className="mb-4">
            <label htmlFor="overhang" className="block text-lg font-semibold">
              Overhang past the dunnage ({unit === 'in' ? "e.g. 2' or 24" : 'mm'}; leave empty for the design's)
            </label>
            <input id="overhang" className="input mt-1 min-h-[52px] border-2 border-ink text-xl" value={overhang} onChange={(e) => setOverhang(e.target.value)} aria-invalid={!!overhangError} />
            {overhangError && <p className="font-semibold text-bad"><Icon name="warning" className="h-4 w-4" /> {overhangError}</p>}
          </div>
        )}
        <ChoiceGroup legend="Sky" name="sky" value={sky} options={SKIES} labels={SKY_LABELS} onChange={setSky} />
        <div className="grid gap-4 sm:grid-cols-2">
          <div>
            <label htmlFor="taken-at" className="block text-lg font-semibold">
              Taken at
            </label>
            <input id="taken-at" type="datetime-local" className="input mt-1 min-h-[52px] border-2 border-ink text-xl" value={takenAt} onChange={(e) => setTakenAt(e.target.value)} />
          </div>
          <div>
            <label htmlFor="air-temp" className="block text-lg font-semibold">
              Air temperature (°{unit === 'in' ? 'F' : 'C'})
            </label>
            <input id="air-temp" className="input mt-1 min-h-[52px] border-2 border-ink text-xl" inputMode="decimal" value={airTemp} onChange={(e) => setAirTemp(e.target.value)} />
          </div>
        </div>
        <label htmlFor="note" className="mt-4 block text-lg font-semibold">
          Note
        </label>
        <input id="note" className="input mt-1 min-h-[52px] border-2 border-ink text-xl" value={note} maxLength={500} onChange={(e) => setNote(e.target.value)} />
        <label htmlFor="photo" className="mt-4 block text-lg font-semibold">
          Photo (optional)
        </label>
        <input
          id="photo"
          type="file"
          accept="image/*"
          capture="environment"
          className="mt-1 block min-h-[52px] w-full text-lg"
          onChange={(e) => {
            const f = e.target.files?.[0];
            if (!f) return;
            setPhotoName(f.name);
            shrinkPhoto(f).then(setPhoto, () => setPhoto(f));
          }}
        />
        {photoName && <p className="text-lg"><Icon name="camera" /> {photoName} will be sent with the reading.</p>}
      </div>
      {error && (
        <p className="mt-3 text-lg font-semibold text-bad" role="alert">
          <Icon name="warning" /> {error}
        </p>
      )}
      <button type="submit" className="btn-primary mt-4 min-h-[64px] w-full text-2xl">
        Save the reading
      </button>
      {saved && (
        <p className="mt-3 text-lg font-semibold text-ok" role="status">
          <Icon name="check" /> {saved}
        </p>
      )}
    </form>
  );
}
