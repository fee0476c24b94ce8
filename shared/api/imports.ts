import { z } from 'zod';

export const IMPORT_KINDS = ['readings', 'pieces'] as const;
export type ImportKind = (typeof IMPORT_KINDS)[number];

export interface ImportField { key: string; label: string; required: boolean; synonyms: string[] }

/** The fields each kind of import fills, and the header names we recognise for each (lower case, no spaces). */
export const IMPORT_FIELDS: Record<ImportKind, ImportField[]> = {
  readings: [
    { key: 'mark', label: 'Piece mark', required: true, synonyms: ['mark', 'piece', 'piecemark', 'pieceid', 'member'] },
    { key: 'job', label: 'Job number', required: false, synonyms: ['job', 'jobnumber', 'jobno', 'project'] },
    { key: 'takenAt', label: 'Taken at (YYYY-MM-DD HH:mm)', required: true, synonyms: ['takenat', 'date', 'datetime', 'time', 'measured', 'measuredat', 'when'] },
    { key: 'value', label: 'Camber', required: true, synonyms: ['camber', 'value', 'reading', 'measurement', 'rise'] },
    { key: 'unit', label: 'Unit (in or mm)', required: false, synonyms: ['unit', 'units', 'uom'] },
    { key: 'method', label: 'Method', required: false, synonyms: ['method', 'instrument', 'how'] },
    { key: 'support', label: 'Where the piece sits', required: false, synonyms: ['support', 'supports', 'location', 'on'] },
    { key: 'sky', label: 'Sky', required: false, synonyms: ['sky', 'weather', 'sun'] },
    { key: 'airTemp', label: 'Air temperature', required: false, synonyms: ['airtemp', 'temperature', 'temp', 'air'] },
    { key: 'note', label: 'Note', required: false, synonyms: ['note', 'comment', 'remark'] },
  ],
  pieces: [
    { key: 'mark', label: 'Piece mark', required: true, synonyms: ['mark', 'piece', 'piecemark'] },
    { key: 'job', label: 'Job number', required: true, synonyms: ['job', 'jobnumber', 'jobno', 'project'] },
    { key: 'design', label: 'Design code', required: true, synonyms: ['design', 'designcode', 'type', 'product'] },
    { key: 'bed', label: 'Bed', required: false, synonyms: ['bed', 'line', 'form'] },
    { key: 'castDate', label: 'Cast date', required: true, synonyms: ['castdate', 'cast', 'pourdate', 'poured'] },
    { key: 'releaseDate', label: 'Release date', required: false, synonyms: ['releasedate', 'release', 'stripdate', 'detension'] },
    { key: 'shipDate', label: 'Planned ship date', required: false, synonyms: ['shipdate', 'ship', 'delivery'] },
    { key: 'erectionDate', label: 'Planned erection date', required: false, synonyms: ['erectiondate', 'erection', 'set', 'setdate'] },
    { key: 'bay', label: 'Erection bay', required: false, synonyms: ['bay', 'erectionbay', 'span'] },
    { key: 'position', label: 'Position in the bay', required: false, synonyms: ['position', 'pos', 'bayposition', 'sequence'] },
  ],
};

/** Field key → the header it reads from (or null: not imported). */
export const mappingSchema = z.record(z.string().max(40), z.string().max(200).nullable());
export type Mapping = z.infer<typeof mappingSchema>;

export const importKindSchema = z.enum(IMPORT_KINDS);
export const uploadFieldsSchema = z.object({ kind: importKindSchema, delimiter: z.enum([',', ';', '\t']).default(',') });
export const previewSchema = z.object({ mapping: mappingSchema, saveMappingAs: z.string().trim().min(1).max(60).optional() });
export const commitSchema = previewSchema.extend({ allOrNothing: z.boolean().default(false) });

export const rowErrorSchema = z.object({ line: z.number().int(), column: z.string(), reason: z.string() });
export type RowError = z.infer<typeof rowErrorSchema>;

export const importSummarySchema = z.object({
  id: z.string().uuid(),
  kind: importKindSchema,
  filename: z.string(),
  status: z.enum(['uploaded', 'committed', 'rejected']),
  header: z.array(z.string()),
  proposedMapping: mappingSchema,
  ignoredColumns: z.array(z.string()),
  savedMappings: z.array(z.object({ name: z.string(), mapping: mappingSchema })),
  result: z.object({ total: z.number().int(), added: z.number().int(), duplicates: z.number().int(), rejected: z.number().int() }).nullable(),
  repeated: z.boolean(),
});
export type ImportSummary = z.infer<typeof importSummarySchema>;

export const previewResultSchema = z.object({
  total: z.number().int(),
  valid: z.number().int(),
  invalid: z.number().int(),
  rows: z.array(z.object({ line: z.number().int(), values: z.record(z.string(), z.string()) })),
  errors: z.array(rowErrorSchema),
  missing: z.array(z.string()),
});
export type PreviewResult = z.infer<typeof previewResultSchema>;
