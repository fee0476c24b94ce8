import { CAUTION } from '#shared/camber/schema';

/** The caution shown wherever results are shown. */
export function Caution() {
  return (
    <p className="mt-6 border-l-4 border-concrete-400 bg-concrete-100 px-3 py-2 text-sm text-concrete-800" role="note">
      {CAUTION}
    </p>
  );
}
