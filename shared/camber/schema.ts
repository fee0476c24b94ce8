import { z } from 'zod';

// The prediction input. Units follow `units`: "us" → member lengths and positions in ft, section
// dimensions in in, stresses ksi, forces kip, unit weight lb/ft³, line loads kip/ft; "si" → m, mm,
// MPa, kN, kg/m³, kN/m. Eccentricities are section dimensions, positive below the centroid.

const pos = z.number().finite().positive();
const nonNeg = z.number().finite().nonnegative();

export const PRODUCT_TYPES = ['double-tee', 'single-tee', 'hollow-core', 'beam', 'inverted-tee', 'i-girder', 'box-beam', 'wall-panel'] as const;
export const productTypeSchema = z.enum(PRODUCT_TYPES);
export type ProductType = z.infer<typeof productTypeSchema>;

export const METHODS = ['multipliers', 'aci209', 'aashto', 'mc2010', 'en1992'] as const;
export const methodSchema = z.enum(METHODS);
export type Method = z.infer<typeof methodSchema>;

export const sectionPropsSchema = z.strictObject({
  area: pos,
  inertia: pos,
  yb: pos,
  height: pos,
  volumeToSurface: pos,
  /** Width of the compression face, used for the cracked-section check. */
  width: pos.optional(),
});

export const sectionShapeSchema = z.discriminatedUnion('shape', [
  z.strictObject({ shape: z.literal('rectangle'), width: pos, height: pos }),
  z.strictObject({
    shape: z.literal('double-tee'),
    flangeWidth: pos,
    flangeThickness: pos,
    stemCount: z.number().int().min(1).max(4).optional(),
    stemWidthTop: pos,
    stemWidthBottom: pos,
    height: pos,
  }),
  z.strictObject({ shape: z.literal('hollow-core'), width: pos, height: pos, voidCount: z.number().int().min(1).max(20), voidDiameter: pos }),
  z.strictObject({ shape: z.literal('inverted-tee'), webWidth: pos, height: pos, ledgeWidth: pos, ledgeHeight: pos }),
  z.strictObject({
    shape: z.literal('i-girder'),
    topFlangeWidth: pos,
    topFlangeThickness: pos,
    webWidth: pos,
    bottomFlangeWidth: pos,
    bottomFlangeThickness: pos,
    height: pos,
  }),
]);

export const sectionSchema = z.union([sectionShapeSchema, sectionPropsSchema]);

export const concreteSchema = z.strictObject({
  fci: pos,
  fc: pos,
  unitWeight: pos.optional(),
  modulus: z.enum(['aci318', 'aashto2014', 'aashto', 'en1992', 'mc2010', 'measured']).default('aci318'),
  /** Measured modulus at release (ksi or MPa), required with modulus "measured". */
  modulusAtRelease: pos.optional(),
  /** Measured 28-day modulus (ksi or MPa), optional with modulus "measured". */
  modulus28: pos.optional(),
  aggregateFactor: pos.max(2).default(1),
  curing: z.enum(['steam', 'moist']).default('steam'),
  releaseAgeDays: pos.max(60).default(1),
  cementType: z.enum(['I', 'III']).default('III'),
  cementClass: z.enum(['S', 'N', 'R']).default('R'),
  curingTemperature: z.number().min(5).max(80).optional(),
  mix: z
    .strictObject({ slump: pos.optional(), finesPercent: pos.max(100).optional(), airPercent: nonNeg.max(20).optional(), cementContent: pos.optional() })
    .optional(),
});

export const strandGroupSchema = z
  .strictObject({
    count: z.number().int().positive().max(200),
    area: pos.optional(),
    diameter: pos.optional(),
    profile: z.enum(['straight', 'harped-1', 'harped-2']),
    eccEnd: z.number().finite().optional(),
    eccMid: z.number().finite(),
    harpAt: pos.optional(),
    debondLength: nonNeg.optional(),
    jackingStress: pos.optional(),
  })
  .superRefine((g, ctx) => {
    if (g.area === undefined && g.diameter === undefined) ctx.addIssue({ code: 'custom', path: ['area'], message: 'give the strand area or its nominal diameter' });
    if (g.profile !== 'straight' && g.eccEnd === undefined) ctx.addIssue({ code: 'custom', path: ['eccEnd'], message: 'a harped profile needs the eccentricity at the ends' });
    if (g.profile === 'harped-2' && g.harpAt === undefined) ctx.addIssue({ code: 'custom', path: ['harpAt'], message: 'a two-point harp needs harpAt, the distance of each harp point from its end' });
  });

export const predictBaseSchema = z
  .strictObject({
    units: z.enum(['us', 'si']).default('us'),
    length: pos,
    productType: productTypeSchema.optional(),
    section: sectionSchema,
    concrete: concreteSchema,
    strands: z.array(strandGroupSchema).min(1).max(20),
    prestress: z
      .strictObject({ forceAfterRelease: pos.optional(), jackingStress: pos.optional() })
      .default({}),
    transferLength: z.enum(['aashto', 'aci', 'none']).default('aashto'),
    supports: z
      .strictObject({ storage: z.array(z.strictObject({ fromAgeDays: pos, overhang: nonNeg })).max(10).default([]) })
      .default({ storage: [] }),
    loads: z.array(z.strictObject({ ageDays: pos, load: pos, label: z.string().max(60).optional() })).max(10).default([]),
    environment: z.strictObject({ relativeHumidity: z.number().min(20).max(100).default(70) }).default({ relativeHumidity: 70 }),
    method: methodSchema.default('aashto'),
    aashtoEdition: z.enum(['2005', '2015']).default('2015'),
    agesDays: z.array(pos.max(36500)).min(1).max(2000),
    band: z
      .strictObject({ release: nonNeg.max(1).optional(), growth: nonNeg.max(2).optional(), measurement: nonNeg.optional(), z: pos.max(4).optional() })
      .optional(),
    tolerance: z
      .strictObject({ ratePer10ft: nonNeg, cap: nonNeg, capLong: nonNeg.optional(), longOver: pos.optional() })
      .optional(),
    service: z
      .strictObject({
        superimposedDead: nonNeg.default(0),
        live: nonNeg.default(0),
        use: z.enum(['flat-roof', 'floor', 'supports-damageable', 'supports-nondamageable']).default('floor'),
        finalAgeDays: pos.default(20000),
        /** Age at which the piece is set on its bearings and the superimposed dead load goes on. */
        appliedAtAgeDays: pos.default(60),
      })
      .optional(),
  });

type MemberFields = Omit<z.output<typeof predictBaseSchema>, 'agesDays'>;

/** Cross-field checks shared by the prediction input and the stored design. */
export function checkMember(v: MemberFields, ctx: z.RefinementCtx): void {
  {
    const lengthIn = v.units === 'us' ? v.length * 12 : (v.length * 1000) / 25.4;
    v.strands.forEach((g, i) => {
      const toIn = (x: number): number => (v.units === 'us' ? x * 12 : (x * 1000) / 25.4);
      if (g.harpAt !== undefined && toIn(g.harpAt) >= lengthIn / 2) ctx.addIssue({ code: 'custom', path: ['strands', i, 'harpAt'], message: 'a harp point must lie between the end and midspan' });
      if (g.debondLength !== undefined && toIn(g.debondLength) >= lengthIn / 2) ctx.addIssue({ code: 'custom', path: ['strands', i, 'debondLength'], message: 'the debonded length must be shorter than half the member' });
    });
    v.supports.storage.forEach((s, i) => {
      const a = v.units === 'us' ? s.overhang * 12 : (s.overhang * 1000) / 25.4;
      if (a >= lengthIn / 2) ctx.addIssue({ code: 'custom', path: ['supports', 'storage', i, 'overhang'], message: 'the overhang must be shorter than half the member' });
      if (s.fromAgeDays < v.concrete.releaseAgeDays) ctx.addIssue({ code: 'custom', path: ['supports', 'storage', i, 'fromAgeDays'], message: 'storage cannot start before release' });
    });
    if (v.concrete.modulus === 'measured' && v.concrete.modulusAtRelease === undefined) ctx.addIssue({ code: 'custom', path: ['concrete', 'modulusAtRelease'], message: 'a measured modulus needs its value at release' });
    if (v.concrete.fci > v.concrete.fc) ctx.addIssue({ code: 'custom', path: ['concrete', 'fci'], message: "f'ci cannot exceed f'c" });
  }
}

export const predictInputSchema = predictBaseSchema.superRefine(checkMember);

export type PredictInput = z.input<typeof predictInputSchema>;
export type PredictParsed = z.output<typeof predictInputSchema>;

export interface CurvePoint {
  ageDays: number;
  camber: number;
  low: number;
  high: number;
  toleranceLow: number;
  toleranceHigh: number;
  creepCoefficient: number;
  prestressLoss: number;
  /** Elastic part at this age (release camber plus support changes and loads, elastic). */
  elastic: number;
  /** Time-dependent growth: camber − elastic. */
  growth: number;
}

export interface PredictResult {
  units: 'us' | 'si';
  unitOfCamber: 'in' | 'mm';
  method: Method;
  section: { area: number; inertia: number; yb: number; height: number; volumeToSurface: number; selfWeight: number };
  concrete: { eci: number; ec28: number };
  prestress: { jackingForce: number | null; elasticShorteningLoss: number | null; forceAfterRelease: number; strandArea: number };
  release: { prestress: number; selfWeight: number; net: number };
  points: CurvePoint[];
  multipliers?: { erection: number; final: number };
  tolerance: { plusMinus: number; rule: string; source: string };
  band: { release: number; growth: number; measurement: number; z: number; basis: string };
  service?: ServiceResult;
  sources: string[];
  caution: string;
}

export interface ServiceResult {
  finalCamber: number;
  superimposedDeadDeflection: number;
  liveLoadDeflection: number;
  bottomStress: number;
  modulusOfRupture: number;
  cracked: boolean;
  effectiveInertia: number;
  limit: number;
  limitRule: string;
  passes: boolean;
}

export const CAUTION =
  'Crownwatch supports, and does not replace, the engineer of record, the plant\'s quality manual and the governing codes. Limits must be set from the project specification.';
