// Intl.DateTimeFormat objects are costly to build and cheap to use: one per locale, options and time
// zone, kept for the life of the process (a plant has one time zone; the set stays tiny).
const cache = new Map<string, Intl.DateTimeFormat>();

export function dateFormat(locale: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
  const key = `${locale}|${JSON.stringify(options)}`;
  let f = cache.get(key);
  if (!f) cache.set(key, (f = new Intl.DateTimeFormat(locale, options)));
  return f;
}
