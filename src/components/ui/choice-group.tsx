interface Props<T extends string> {
  legend: string;
  name: string;
  value: T | '';
  options: readonly T[];
  labels: Record<T, string>;
  onChange: (v: T) => void;
}

/** Large touch toggles for one choice among a few (radio semantics for keyboards and screen readers). */
export function ChoiceGroup<T extends string>({ legend, name, value, options, labels, onChange }: Props<T>) {
  return (
    <fieldset className="mb-4">
      <legend className="mb-1 text-lg font-semibold">{legend}</legend>
      <div className="flex flex-wrap gap-2">
        {options.map((o) => (
          <label
            key={o}
            className={`flex min-h-[52px] cursor-pointer items-center rounded-lg border-2 px-4 text-lg font-semibold focus-within:outline focus-within:outline-4 focus-within:outline-accent ${value === o ? 'border-ink bg-ink text-white' : 'border-ink bg-white text-ink'}`}
          >
            <input type="radio" className="sr-only" name={name} value={o} checked={value === o} onChange={() => onChange(o)} />
            {value === o && <span aria-hidden="true">✓&nbsp;</span>}
            {labels[o]}
          </label>
        ))}
      </div>
    </fieldset>
  );
}
