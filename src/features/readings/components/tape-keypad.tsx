const KEYS = ['7', '8', '9', '4', '5', '6', '1', '2', '3', '-', '0', '.'];
// Laid out like a phone keypad: three columns.
const FRACTIONS = ['1/16', '1/8', '3/16', '1/4', '5/16', '3/8', '7/16', '1/2', '9/16', '5/8', '11/16', '3/4', '13/16', '7/8', '15/16'];

/** An on-screen keypad for gloved hands: digits, and the tape's fractions in one tap. */
export function TapeKeypad({ value, onChange, inches }: { value: string; onChange: (v: string) => void; inches: boolean }) {
  const key = 'min-h-[56px] rounded-lg border-2 border-ink bg-white text-2xl font-semibold active:bg-concrete-200';
  return (
    <div className="mt-2" aria-label="Keypad">
      <div className="grid grid-cols-3 gap-2">
        {KEYS.map((k) => (
          <button key={k} type="button" className={key} onClick={() => onChange(value + k)} aria-label={k === '-' ? 'minus' : k === '.' ? 'decimal point' : k}>
            {k}
          </button>
        ))}
        <button type="button" className={key} onClick={() => onChange(value.slice(0, -1))} aria-label="delete last character">
          ⌫
        </button>
        <button type="button" className={`${key} col-span-2`} onClick={() => onChange('')}>
          Clear
        </button>
      </div>
      {inches && (
        <div className="mt-2 grid grid-cols-5 gap-2">
          {FRACTIONS.map((f) => (
            <button key={f} type="button" className={`${key} text-lg`} onClick={() => onChange(`${value.replace(/\s*\d+\/\d+$/, '').trimEnd()} ${f}`.trimStart())} aria-label={`add ${f}`}>
              {f}
            </button>
          ))}
        </div>
      )}
    </div>
  );
}
