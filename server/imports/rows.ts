// Validating one CSV row of each kind against the plant's pieces, jobs and designs. Every problem names
// its line and column; nothing is guessed.
import type { ImportKind, Mapping, RowError } from '#shared/api/imports';
import { READING_METHODS, SKIES, SUPPORTS } from '#shared/api/readings';
import { parseTape, TapeParseError } from '#shared/camber/tape';
import { parseDateCell, parseLocalDateTime } from '#shared/imports/local-time';

export interface ImportContext {
  timeZone: string;
  unit: 'in' | 'mm';
  now: Date;
  /** mark key → pieces with that mark (one per job) */
  pieces: Map<string, Array<{ id: string; jobNumber: string }>>;
  jobs: Map<string, string>; // job number (lower case) → id
  designs: Map<string, string>; // design code (lower case) → id of its latest version
}

export interface ReadingRow { pieceId: string; takenAt: Date; valueMm: number; enteredText: string; enteredUnit: 'in' | 'mm'; method: string; support: string; sky: string | null; airTempC: number | null; note: string | null }
export interface PieceRow { jobId: string; designId: string; mark: string; bed: string | null; castDate: string; releaseDate: string; shipDate: string | null; erectionDate: string | null; bay: string | null; position: number | null }

export const markKey = (s: string): string => s.toLowerCase().replace(/[^a-z0-9]/g, '');

const WORDS: Record<string, Record<string, string>> = {
  method: { level: 'level', 'level and rod': 'level', laser: 'laser', 'laser level': 'laser', 'total station': 'total-station', totalstation: 'total-station', 'total-station': 'total-station', tape: 'tape-string-line', 'string line': 'tape-string-line', 'tape and string line': 'tape-string-line', 'tape-string-line': 'tape-string-line' },
  support: { bed: 'bed', 'on the bed': 'bed', dunnage: 'dunnage', 'on dunnage': 'dunnage', storage: 'dunnage', truck: 'truck', trailer: 'truck' },
  sky: { sun: 'sun-on-top', sunny: 'sun-on-top', 'sun-on-top': 'sun-on-top', 'sun on the top': 'sun-on-top', overcast: 'overcast', cloudy: 'overcast', shade: 'shade', 'in shade': 'shade', night: 'night', dawn: 'night', 'before sunrise': 'night' },
};

function word(kind: 'method' | 'support' | 'sky', text: string): string | null {
  const v = WORDS[kind]![text.trim().toLowerCase()];
  return v ?? null;
}

export function validateRow(kind: ImportKind, get: (field: string) => string | undefined, ctx: ImportContext, line: number, column: (field: string) => string): { row: ReadingRow | PieceRow | null; errors: RowError[] } {
  const errors: RowError[] = [];
  const err = (field: string, reason: string): void => {
    errors.push({ line, column: column(field), reason });
  };
  const req = (field: string, what: string): string | null => {
    const v = get(field)?.trim();
    if (!v) {
      err(field, `${what} is empty`);
      return null;
    }
    return v;
  };
  if (kind === 'readings') {
    const mark = req('mark', 'the piece mark');
    const job = get('job')?.trim().toLowerCase();
    let pieceId: string | null = null;
    if (mark) {
      const found = (ctx.pieces.get(markKey(mark)) ?? []).filter((p) => !job || p.jobNumber.toLowerCase() === job);
      if (found.length === 0) err('mark', `no piece "${mark}"${job ? ` in job ${get('job')}` : ''} in this plant`);
      else if (found.length > 1) err('mark', `"${mark}" is a mark in several jobs (${found.map((p) => p.jobNumber).join(', ')}); add a job column`);
      else pieceId = found[0]!.id;
    }
    const unitText = get('unit')?.trim().toLowerCase();
    const unit: 'in' | 'mm' | null = !unitText ? ctx.unit : ['in', 'inch', 'inches', '"'].includes(unitText) ? 'in' : unitText === 'mm' ? 'mm' : null;
    if (!unit) err('unit', `"${get('unit')}" is not a unit we read (in or mm)`);
    const text = req('value', 'the camber');
    let valueMm: number | null = null;
    let enteredUnit: 'in' | 'mm' = unit ?? ctx.unit;
    if (text && unit) {
      try {
        const t = parseTape(text, unit);
        if (Math.abs(t.mm) > 1000) err('value', `${text} is not a plausible camber`);
        else {
          valueMm = t.mm;
          enteredUnit = t.unit;
        }
      } catch (e) {
        err('value', e instanceof TapeParseError ? e.message : 'not a reading');
      }
    }
    const when = req('takenAt', 'the date and time');
    let takenAt: Date | null = null;
    if (when) {
      const r = parseLocalDateTime(when, ctx.timeZone);
      if ('error' in r) err('takenAt', r.error);
      else if (r.at.getTime() > ctx.now.getTime() + 10 * 60_000) err('takenAt', `${when} is in the future`);
      else takenAt = r.at;
    }
    const pick = (field: 'method' | 'support' | 'sky', fallback: string | null): string | null => {
      const v = get(field)?.trim();
      if (!v) return fallback;
      const w = word(field, v);
      if (!w) err(field, `"${v}" is not one of ${(field === 'method' ? READING_METHODS : field === 'support' ? SUPPORTS : SKIES).join(', ')}`);
      return w;
    };
    const method = pick('method', 'level');
    const support = pick('support', 'bed');
    const sky = pick('sky', null);
    const tempText = get('airTemp')?.trim();
    let airTempC: number | null = null;
    if (tempText) {
      const t = Number(tempText.replace(/°?\s*[CF]$/i, ''));
      if (!Number.isFinite(t) || Math.abs(t) > 150) err('airTemp', `"${tempText}" is not a temperature`);
      else airTempC = ctx.unit === 'in' && !/c$/i.test(tempText) ? ((t - 32) * 5) / 9 : t;
      if (airTempC !== null && (airTempC < -50 || airTempC > 60)) err('airTemp', `${tempText} is outside −50 to 60 °C`);
    }
    const note = get('note')?.trim() || null;
    if (note && note.length > 500) err('note', 'the note is longer than 500 characters');
    if (errors.length) return { row: null, errors };
    return { row: { pieceId: pieceId!, takenAt: takenAt!, valueMm: valueMm!, enteredText: text!, enteredUnit, method: method!, support: support!, sky, airTempC, note }, errors };
  }
  // pieces
  const mark = req('mark', 'the piece mark');
  if (mark && mark.length > 40) err('mark', 'the mark is longer than 40 characters');
  const jobNo = req('job', 'the job number');
  const jobId = jobNo ? ctx.jobs.get(jobNo.toLowerCase()) : undefined;
  if (jobNo && !jobId) err('job', `job ${jobNo} is not in this plant; add the job first`);
  const code = req('design', 'the design code');
  const designId = code ? ctx.designs.get(code.toLowerCase()) : undefined;
  if (code && !designId) err('design', `design ${code} is not in this plant`);
  const date = (field: string, required: boolean): string | null => {
    const v = get(field)?.trim();
    if (!v) {
      if (required) err(field, 'the date is empty');
      return null;
    }
    const r = parseDateCell(v);
    if ('error' in r) {
      err(field, r.error);
      return null;
    }
    return r.date;
  };
  const cast = date('castDate', true);
  let release = date('releaseDate', false);
  if (cast && !release) release = new Date(Date.parse(`${cast}T00:00:00Z`) + 86_400_000).toISOString().slice(0, 10);
  if (cast && release && release < cast) err('releaseDate', 'release cannot come before casting');
  const ship = date('shipDate', false);
  const erection = date('erectionDate', false);
  const posText = get('position')?.trim();
  const position = posText ? Number(posText) : null;
  if (posText && (!Number.isInteger(position) || position! < 1 || position! > 99)) err('position', `"${posText}" is not a position from 1 to 99`);
  if (errors.length) return { row: null, errors };
  return {
    row: { jobId: jobId!, designId: designId!, mark: mark!, bed: get('bed')?.trim() || null, castDate: cast!, releaseDate: release!, shipDate: ship, erectionDate: erection, bay: get('bay')?.trim() || null, position },
    errors,
  };
}

/** The proposed mapping: each field to the first header whose name matches one of its words. */
export function proposeMapping(fields: Array<{ key: string; synonyms: string[] }>, header: string[]): Mapping {
  const norm = header.map((h) => h.toLowerCase().replace(/[^a-z0-9]/g, ''));
  const used = new Set<number>();
  const out: Mapping = {};
  for (const f of fields) {
    const i = norm.findIndex((h, idx) => !used.has(idx) && f.synonyms.some((s) => h === s || h.startsWith(s)));
    out[f.key] = i >= 0 ? header[i]! : null;
    if (i >= 0) used.add(i);
  }
  return out;
}
