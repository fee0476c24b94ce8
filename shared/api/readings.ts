import { z } from 'zod';
import { parseTape, TapeParseError } from '../camber/tape';

export const READING_METHODS = ['tape-string-line', 'level', 'laser', 'total-station'] as const;
export const READING_METHOD_LABELS: Record<(typeof READING_METHODS)[number], string> = {
  'tape-string-line': 'Tape and string line',
  level: 'Level and rod',
  laser: 'Laser level',
  'total-station': 'Total station',
};
export const SUPPORTS = ['bed', 'dunnage', 'truck'] as const;
export const SUPPORT_LABELS: Record<(typeof SUPPORTS)[number], string> = { bed: 'On the bed', dunnage: 'On dunnage', truck: 'On a truck' };
export const SKIES = ['sun-on-top', 'overcast', 'shade', 'night'] as const;
export const SKY_LABELS: Record<(typeof SKIES)[number], string> = {
  'sun-on-top': 'Sun on the top',
  overcast: 'Overcast',
  shade: 'In shade',
  night: 'Night or before sunrise',
};

/** What a client sends to log a reading; the Idempotency-Key header makes a retry safe. */
export const createReadingSchema = z
  .object({
    pieceId: z.string().uuid(),
    value: z.string().trim().min(1, 'enter the reading').max(40),
    unit: z.enum(['in', 'mm']).default('in'),
    takenAt: z.string().datetime({ offset: true, message: 'give the time with its offset, e.g. 2026-12-01T07:30:00-05:00' }),
    method: z.enum(READING_METHODS),
    support: z.enum(SUPPORTS),
    overhangMm: z.number().finite().min(0).max(20000).optional(),
    airTempC: z.number().finite().min(-50).max(60).optional(),
    sky: z.enum(SKIES).optional(),
    note: z.string().trim().max(500).optional(),
    supersedes: z.string().uuid().optional(),
    correctionReason: z.string().trim().min(3).max(300).optional(),
  })
  .superRefine((v, ctx) => {
    try {
      const parsed = parseTape(v.value, v.unit);
      if (Math.abs(parsed.mm) > 1000) ctx.addIssue({ code: 'custom', path: ['value'], message: 'a camber over 1 m (39 in) is not plausible; check the reading' });
    } catch (e) {
      if (e instanceof TapeParseError) ctx.addIssue({ code: 'custom', path: ['value'], message: e.message });
      else throw e;
    }
    if (v.supersedes && !v.correctionReason) ctx.addIssue({ code: 'custom', path: ['correctionReason'], message: 'say why the earlier reading is corrected' });
    if (new Date(v.takenAt).getTime() > Date.now() + 10 * 60_000) ctx.addIssue({ code: 'custom', path: ['takenAt'], message: 'the time is in the future' });
  });
export type CreateReadingInput = z.input<typeof createReadingSchema>;

export const idempotencyKeySchema = z.string().min(8, 'the Idempotency-Key header is missing or too short').max(100).regex(/^[A-Za-z0-9._:-]+$/, 'the Idempotency-Key header has characters it may not have');

export const readingSchema = z.object({
  id: z.string().uuid(),
  pieceId: z.string().uuid(),
  takenAt: z.string(),
  receivedAt: z.string(),
  valueMm: z.number(),
  enteredText: z.string(),
  enteredUnit: z.enum(['in', 'mm']),
  method: z.string(),
  support: z.string(),
  overhangMm: z.number().nullable(),
  airTempC: z.number().nullable(),
  sky: z.string().nullable(),
  note: z.string().nullable(),
  takenBy: z.string(),
  supersedes: z.string().uuid().nullable(),
  supersededBy: z.string().uuid().nullable(),
  correctionReason: z.string().nullable(),
  hasPhoto: z.boolean(),
  likelyDistorted: z.boolean(),
});
export type ReadingDto = z.infer<typeof readingSchema>;

/** The afternoon-sun rule below as data, so the server's SQL (piece page, reading lookup) applies the same one. */
export const SUN_DISTORTION = { sky: 'sun-on-top', fromHour: 12, toHour: 19 } as const;

/**
 * Sun on the top flange heats it and bows the piece upward, most in the afternoon (engineering
 * reference §6.2, [MEM-H]); such readings are kept but marked so trends and flags treat them with care.
 */
export function isLikelyDistorted(sky: string | null | undefined, localHour: number): boolean {
  return sky === SUN_DISTORTION.sky && localHour >= SUN_DISTORTION.fromHour && localHour < SUN_DISTORTION.toHour;
}
