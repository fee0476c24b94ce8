// Intl.DateTimeFormat objects are costly to build and cheap to use: one per locale, options and time
// zone, kept for the life of the process (a plant has one time zone; the set stays tiny). Callers pass
// module-level option objects, so finding the formatter costs two map lookups and no string building.
const cache = new WeakMap<Intl.DateTimeFormatOptions, Map<string, Intl.DateTimeFormat>>();

export function dateFormat(locale: string, options: Intl.DateTimeFormatOptions, timeZone: string): Intl.DateTimeFormat {
  let byZone = cache.get(options);
  if (!byZone) cache.set(options, (byZone = new Map()));
  const key = `${locale}|${timeZone}`;
  let f = byZone.get(key);
  if (!f) byZone.set(key, (f = new Intl.DateTimeFormat(locale, { ...options, timeZone })));
  return f;
}
