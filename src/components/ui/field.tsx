import type { ReactNode } from 'react';
import { Icon } from './icon';

interface Props {
  id: string;
  label: string;
  error?: string;
  hint?: ReactNode;
  children: ReactNode;
}

/** A labelled control with its hint and its error, linked for screen readers. */
export function Field({ id, label, error, hint, children }: Props) {
  return (
    <div className="mb-4">
      <label htmlFor={id} className="label">
        {label}
      </label>
      {children}
      {hint && (
        <p id={`${id}-hint`} className="mt-1 text-sm text-concrete-700">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${id}-error`} className="mt-1 text-sm font-semibold text-bad" role="alert">
          <Icon name="warning" className="h-4 w-4" /> {error}
        </p>
      )}
    </div>
  );
}

export function FormError({ message }: { message?: string | null }) {
  if (!message) return null;
  return (
    <p className="mb-4 rounded-md border border-bad bg-bad-light px-3 py-2 font-semibold text-bad" role="alert">
      <Icon name="warning" className="h-4 w-4" /> {message}
    </p>
  );
}
