// Reading an uploaded CSV without losing or inventing anything: strict UTF-8 (a Windows-1252 file is
// refused, never stored with U+FFFD), no NUL bytes, the delimiter the person chose, a header without
// duplicates, every row with the header's number of columns. csv-parse accepts several of these
// silently, so they are checked here first (team ecosystem notes, finding 6).
import { Readable } from 'node:stream';
import { parse } from 'csv-parse';
import { AppError } from '../http/errors';

export const MAX_COLUMNS = 60;
/** A record longer than this is not a camber row (a 5,000-character field is refused at once). */
export const MAX_RECORD_CHARS = 4000;

const reject = (message: string, fieldErrors?: Record<string, string[]>): AppError => new AppError(422, 'csv_rejected', message, fieldErrors);

/** The text of the file, or a clear refusal. */
export function decodeCsv(bytes: Buffer): string {
  if (bytes.length === 0) throw reject('the file is empty (no data rows)');
  if (bytes.includes(0)) throw reject('the file contains NUL bytes: it is not a text CSV file');
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true }).decode(bytes);
  } catch {
    throw reject('the file is not UTF-8 text (Excel "CSV" often saves Windows-1252): save it as "CSV UTF-8" and upload again');
  }
  return text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
}

const CHUNK = 64 * 1024;

/** Streams the records of the text in 64 KiB pieces; each record comes with its line number in the file. */
export async function* csvRecords(text: string, delimiter: string): AsyncGenerator<{ line: number; cells: string[] }> {
  const chunks: string[] = [];
  for (let i = 0; i < text.length; i += CHUNK) chunks.push(text.slice(i, i + CHUNK));
  const parser = Readable.from(chunks).pipe(
    parse({ delimiter, bom: true, relax_column_count: false, skip_empty_lines: true, max_record_size: MAX_RECORD_CHARS, info: true, trim: false }),
  );
  try {
    for await (const rec of parser as AsyncIterable<{ record: string[]; info: { lines: number } }>) {
      if (rec.record.length > MAX_COLUMNS) throw reject(`line ${rec.info.lines} has ${rec.record.length} columns; at most ${MAX_COLUMNS} are read`);
      yield { line: rec.info.lines, cells: rec.record };
    }
  } catch (e) {
    if (e instanceof AppError) throw e;
    const err = e as { code?: string; lines?: number; message?: string };
    const where = err.lines ? `line ${err.lines}` : 'the file';
    const why: Record<string, string> = {
      CSV_INVALID_CLOSING_QUOTE: 'a quote is not closed properly',
      CSV_QUOTE_NOT_CLOSED: 'a quoted field is never closed',
      CSV_RECORD_INCONSISTENT_COLUMNS: 'has a different number of columns from the header',
      CSV_RECORD_INCONSISTENT_FIELDS_LENGTH: 'has a different number of columns from the header',
      CSV_MAX_RECORD_SIZE: `has a field or line too long to be a camber record (over ${MAX_RECORD_CHARS} characters)`,
    };
    throw reject(`${where}: ${why[err.code ?? ''] ?? err.message ?? 'could not be read'}`, { file: [`${where}: ${err.code ?? 'unreadable'}`] });
  }
}

/** Header checks: duplicates, a semicolon file read with commas, no data. */
export function checkHeader(header: string[], delimiter: string): string[] {
  const names = header.map((h) => h.trim());
  if (names.length === 1 && delimiter === ',' && /[;\t]/.test(names[0]!)) {
    throw reject(`the header "${names[0]}" looks ${names[0]!.includes(';') ? 'semicolon' : 'tab'}-separated: choose that delimiter, or save the file with commas`);
  }
  const seen = new Map<string, number>();
  for (const [i, n] of names.entries()) {
    const k = n.toLowerCase();
    if (!n) throw reject(`column ${i + 1} of the header has no name`);
    if (seen.has(k)) throw reject(`the header names "${n}" twice (columns ${seen.get(k)! + 1} and ${i + 1}); every column needs its own name`);
    seen.set(k, i);
  }
  return names;
}
