// Status symbols drawn as SVG so they show on every tablet, whatever fonts it has. Decorative: the
// words beside them carry the meaning.
const PATHS = {
  check: 'M4 12.5l5 5L20 6.5',
  cross: 'M6 6l12 12M18 6L6 18',
  warning: 'M12 3l10 18H2L12 3zm0 6v6m0 3v.5',
  up: 'M12 4l8 10h-5v6H9v-6H4l8-10z',
  down: 'M12 20l8-10h-5V4H9v6H4l8 10z',
  clock: 'M12 3a9 9 0 1 0 0 18a9 9 0 1 0 0-18zm0 4v5l3 3',
  sun: 'M12 8a4 4 0 1 0 0 8a4 4 0 1 0 0-8zM12 2v2m0 16v2M2 12h2m16 0h2M4.9 4.9l1.4 1.4m11.4 11.4l1.4 1.4M4.9 19.1l1.4-1.4M17.7 6.3l1.4-1.4',
  key: 'M8 14a4 4 0 1 1 3.5-2H21v3h-2v2h-3v-2h-4.5A4 4 0 0 1 8 14z',
  camera: 'M4 7h4l2-3h4l2 3h4v13H4V7zm8 3a4 4 0 1 0 0 8a4 4 0 1 0 0-8z',
  hand: 'M7 11V5a1.5 1.5 0 0 1 3 0v5m0-6a1.5 1.5 0 0 1 3 0v6m0-5a1.5 1.5 0 0 1 3 0v6m0-3a1.5 1.5 0 0 1 3 0v5a7 7 0 0 1-14 0v-3a1.5 1.5 0 0 1 3 0',
  truck: 'M2 6h12v10H2zM14 10h4l3 3v3h-7M6 19a2 2 0 1 0 0-4a2 2 0 0 0 0 4zm11 0a2 2 0 1 0 0-4a2 2 0 0 0 0 4z',
  stack: 'M3 7h18M3 12h18M3 17h18',
} as const;

export type IconName = keyof typeof PATHS;

export function Icon({ name, className = 'h-5 w-5' }: { name: IconName; className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={`inline-block shrink-0 ${className}`} fill="none" stroke="currentColor" strokeWidth={2.2} strokeLinecap="round" strokeLinejoin="round" aria-hidden="true" focusable="false">
      <path d={PATHS[name]} />
    </svg>
  );
}
