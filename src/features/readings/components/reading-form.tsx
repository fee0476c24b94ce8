import { useMutation, useQueryClient } from '@tanstack/react-query';
import { useRef, useState } from 'react';
import { READING_METHOD_LABELS, READING_METHODS, SKIES, SKY_LABELS, SUPPORT_LABELS, SUPPORTS, type CreateReadingInput } from '#shared/api/readings';
import { echoTape, parseTape, TapeParseError } from '#shared/camber/tape';
import { Field, FormError } from '../../../components/ui/field';
import { ApiFailure, newIdempotencyKey } from '../../../lib/api';
import { postReading } from '../api';

const localNow = (): string => {
  const d = new Date();
  d.setMinutes(d.getMinutes() - d.getTimezoneOffset());
  return d.toISOString().slice(0, 16);
};

/** Logs one reading for a piece; the echo shows how the typed value was understood before saving. */
export function ReadingForm({ pieceId, unit, onSaved }: { pieceId: string; unit: 'in' | 'mm'; onSaved: () => void }) {
  const qc = useQueryClient();
  const [value, setValue] = useState('');
  const [method, setMethod] = useState<(typeof READING_METHODS)[number]>('tape-string-line');
  const [support, setSupport] = useState<(typeof SUPPORTS)[number]>('dunnage');
  const [sky, setSky] = useState<(typeof SKIES)[number] | ''>('');
  const [takenAt, setTakenAt] = useState(localNow);
  const [airTemp, setAirTemp] = useState('');
  const [note, setNote] = useState('');
  const [fieldErrors, setFieldErrors] = useState<Record<string, string[]>>({});
  // One key per reading being entered, kept across retries of the same reading.
  const key = useRef(newIdempotencyKey());

  let echo: string | null = null;
  let parseError: string | null = null;
  if (value.trim()) {
    try {
      echo = echoTape(parseTape(value, unit));
    } catch (e) {
      parseError = e instanceof TapeParseError ? e.message : 'not understood';
    }
  }

  const save = useMutation({
    mutationFn: (input: CreateReadingInput) => postReading(input, key.current),
    onSuccess: async () => {
      key.current = newIdempotencyKey();
      setValue('');
      setNote('');
      setFieldErrors({});
      await qc.invalidateQueries({ queryKey: ['pieces'] });
      onSaved();
    },
    onError: (e) => setFieldErrors(e instanceof ApiFailure ? e.fieldErrors : {}),
  });

  const submit = (e: React.FormEvent) => {
    e.preventDefault();
    if (parseError || !value.trim()) {
      setFieldErrors({ value: [parseError ?? 'enter the reading'] });
      return;
    }
    const temp = airTemp.trim() === '' ? undefined : Number(airTemp);
    save.mutate({
      pieceId,
      value,
      unit,
      takenAt: new Date(takenAt).toISOString(),
      method,
      support,
      sky: sky || undefined,
      airTempC: temp === undefined || Number.isNaN(temp) ? undefined : unit === 'in' ? ((temp - 32) * 5) / 9 : temp,
      note: note.trim() || undefined,
    });
  };
  const err = (k: string): string | undefined => fieldErrors[k]?.[0];

  return (
    <form onSubmit={submit} className="card" aria-labelledby="log-reading-title" noValidate>
      <h2 id="log-reading-title" className="mb-3 text-xl font-semibold">
        Log a reading
      </h2>
      <FormError message={save.error && !(save.error instanceof ApiFailure && save.error.fieldErrors.value) ? save.error.message : null} />
      <Field id="value" label={`Camber (${unit === 'in' ? 'inches, e.g. 1 3/8' : 'millimetres'})`} error={err('value') ?? parseError ?? undefined} hint={echo ? <span aria-live="polite">Understood as {echo}</span> : undefined}>
        <input id="value" className="input text-yard" inputMode="text" autoComplete="off" value={value} onChange={(e) => setValue(e.target.value)} aria-describedby="value-hint value-error" />
      </Field>
      <div className="grid gap-x-4 sm:grid-cols-2">
        <Field id="method" label="Method">
          <select id="method" className="input" value={method} onChange={(e) => setMethod(e.target.value as typeof method)}>
            {READING_METHODS.map((m) => (
              <option key={m} value={m}>
                {READING_METHOD_LABELS[m]}
              </option>
            ))}
          </select>
        </Field>
        <Field id="support" label="Where the piece sits">
          <select id="support" className="input" value={support} onChange={(e) => setSupport(e.target.value as typeof support)}>
            {SUPPORTS.map((s) => (
              <option key={s} value={s}>
                {SUPPORT_LABELS[s]}
              </option>
            ))}
          </select>
        </Field>
        <Field id="takenAt" label="Taken at" error={err('takenAt')}>
          <input id="takenAt" type="datetime-local" className="input" value={takenAt} onChange={(e) => setTakenAt(e.target.value)} />
        </Field>
        <Field id="sky" label="Sky">
          <select id="sky" className="input" value={sky} onChange={(e) => setSky(e.target.value as typeof sky)}>
            <option value="">Not noted</option>
            {SKIES.map((s) => (
              <option key={s} value={s}>
                {SKY_LABELS[s]}
              </option>
            ))}
          </select>
        </Field>
        <Field id="airTemp" label={`Air temperature (°${unit === 'in' ? 'F' : 'C'})`} error={err('airTempC')}>
          <input id="airTemp" className="input" inputMode="decimal" value={airTemp} onChange={(e) => setAirTemp(e.target.value)} />
        </Field>
        <Field id="note" label="Note" error={err('note')}>
          <input id="note" className="input" value={note} onChange={(e) => setNote(e.target.value)} maxLength={500} />
        </Field>
      </div>
      <button type="submit" className="btn-primary" disabled={save.isPending}>
        {save.isPending ? 'Saving…' : 'Save the reading'}
      </button>
      {save.isSuccess && (
        <p className="mt-2 font-semibold text-ok" role="status">
          ✓ Reading saved.
        </p>
      )}
    </form>
  );
}
