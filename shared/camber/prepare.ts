// Turns a validated prediction input into one consistent US-customary member model (in, kip, ksi):
// section, moduli, strand groups with forces after transfer, and the creep/shrinkage model.
import { prestressCamber, selfWeightDeflection, type StrandGroupModel } from './elastic';
import { elasticShorteningLoss, relaxationLoss } from './losses';
import { FPU_KSI, STRAND_AREA_IN2, modulusKsi, strengthRatioAci209, transferLengthIn } from './materials';
import { aashtoModel } from './models/aashto';
import { aci209Model } from './models/aci209';
import { en1992Model } from './models/en1992';
import { mc2010Model } from './models/mc2010';
import type { CreepShrinkageModel, ModelInputs } from './models/types';
import type { PredictParsed } from './schema';
import { sectionFromShape, type SectionProps, type ShapeInput } from './section';
import { KG_M3_PER_PCF, MM_PER_IN, MPA_PER_KSI, KN_PER_KIP, ftToIn, mToIn } from './units';

export interface PreparedMember {
  input: PredictParsed;
  lengthIn: number;
  lengthFt: number;
  section: SectionProps;
  widthIn: number | null;
  unitWeightPcf: number;
  selfWeightKipPerIn: number;
  fciKsi: number;
  fcKsi: number;
  eci: number;
  ec28: number;
  /** Modulus at age t (days since casting), ksi. */
  modulusAt: (ageDays: number) => number;
  groups: StrandGroupModel[];
  strandArea: number;
  forceAfterRelease: number;
  jackingForce: number | null;
  esLoss: number | null;
  /** Strand stress used for relaxation (jacking, or stress after transfer when only the force is known). */
  fpj: number;
  eccMidAvg: number;
  releaseAge: number;
  model: CreepShrinkageModel;
  /** Prestress camber at release on the end chord (in, upward). */
  dPs: number;
  /** Self-weight deflection with supports inset `overhang` in (in, downward), at Eci. */
  dSw: (overhangIn: number) => number;
  /** Uniform load q (kip/in) deflection on supports inset `overhang`, at Eci. */
  dLoad: (q: number, overhangIn: number) => number;
}

/** Nominal strand diameter (in) from its area: seven-wire strand has A ≈ 0.612·d² (ASTM A416 sizes, common practice). */
const diameterFromArea = (a: number): number => Math.sqrt(a / 0.612);

export function prepareMember(v: PredictParsed): PreparedMember {
  const si = v.units === 'si';
  const len = (x: number): number => (si ? mToIn(x) : ftToIn(x)); // member lengths: ft or m
  const dim = (x: number): number => (si ? x / MM_PER_IN : x); // section dimensions: in or mm
  const stress = (x: number): number => (si ? x / MPA_PER_KSI : x);
  const force = (x: number): number => (si ? x / KN_PER_KIP : x);

  const lengthIn = len(v.length);
  const section = sectionIn(v.section, si);
  const widthIn = 'width' in v.section && v.section.width !== undefined ? dim(v.section.width) : 'shape' in v.section ? shapeWidth(v.section as ShapeInput, si) : null;
  const c = v.concrete;
  const fciKsi = stress(c.fci);
  const fcKsi = stress(c.fc);
  const unitWeightPcf = c.unitWeight === undefined ? 150 : si ? c.unitWeight / KG_M3_PER_PCF : c.unitWeight;
  const selfWeightKipPerIn = ((section.area / 144) * unitWeightPcf) / 1000 / 12;

  let eci: number;
  let ec28: number;
  if (c.modulus === 'measured') {
    eci = stress(c.modulusAtRelease!);
    ec28 = c.modulus28 !== undefined ? stress(c.modulus28) : eci * Math.sqrt(fcKsi / fciKsi);
  } else {
    eci = modulusKsi(c.modulus, fciKsi, unitWeightPcf, c.aggregateFactor);
    ec28 = modulusKsi(c.modulus, fcKsi, unitWeightPcf, c.aggregateFactor);
  }
  const releaseAge = c.releaseAgeDays;
  // Modulus grows with √strength (ACI 209R-92 Eq. 2-5), scaled to pass through Eci at release and Ec at 28 d.
  const s = (t: number): number => Math.sqrt(strengthRatioAci209(t, c.curing, c.cementType));
  const sRel = s(releaseAge);
  const s28 = s(28);
  const modulusAt = (t: number): number =>
    t <= releaseAge || s28 <= sRel ? eci : eci + ((ec28 - eci) * (s(t) - sRel)) / (s28 - sRel);

  // Strand groups
  const em = (x: number): number => dim(x);
  const groupsRaw = v.strands.map((g) => {
    const area = g.area !== undefined ? (si ? g.area / (MM_PER_IN * MM_PER_IN) : g.area) : strandAreaFromDiameter(dim(g.diameter!));
    const db = g.diameter !== undefined ? dim(g.diameter) : diameterFromArea(area);
    const lt = transferLengthIn(v.transferLength, db);
    return {
      aps: g.count * area,
      fpj: g.jackingStress !== undefined ? stress(g.jackingStress) : v.prestress.jackingStress !== undefined ? stress(v.prestress.jackingStress) : 0.75 * FPU_KSI,
      model: {
        force: 0,
        profile: g.profile,
        eccEnd: em(g.eccEnd ?? g.eccMid),
        eccMid: em(g.eccMid),
        harpAt: g.harpAt !== undefined ? len(g.harpAt) : undefined,
        debondLength: g.debondLength !== undefined ? len(g.debondLength) : undefined,
        transferLength: lt,
      } satisfies StrandGroupModel,
    };
  });
  const strandArea = groupsRaw.reduce((a, g) => a + g.aps, 0);
  const eccMidAvg = groupsRaw.reduce((a, g) => a + g.aps * g.model.eccMid, 0) / strandArea;
  const mg = (selfWeightKipPerIn * lengthIn * lengthIn) / 8;

  let forceAfterRelease: number;
  let jackingForce: number | null = null;
  let esLoss: number | null = null;
  let fpj: number;
  if (v.prestress.forceAfterRelease !== undefined) {
    forceAfterRelease = force(v.prestress.forceAfterRelease);
    for (const g of groupsRaw) g.model.force = (forceAfterRelease * g.aps) / strandArea;
    fpj = forceAfterRelease / strandArea; // only the stress after transfer is known
  } else {
    jackingForce = groupsRaw.reduce((a, g) => a + g.aps * g.fpj, 0);
    fpj = jackingForce / strandArea;
    // Relaxation between stressing (taken as the casting day) and release reduces the stress before transfer.
    const fpbt = fpj - relaxationLoss(fpj, releaseAge);
    esLoss = elasticShorteningLoss({ aps: strandArea, fpbt, ig: section.inertia, ag: section.area, em: eccMidAvg, mg, eci });
    for (const g of groupsRaw) g.model.force = g.aps * (g.fpj - relaxationLoss(g.fpj, releaseAge) - esLoss);
    forceAfterRelease = groupsRaw.reduce((a, g) => a + g.model.force, 0);
  }
  const groups = groupsRaw.map((g) => g.model);

  const mi: ModelInputs = {
    fciKsi,
    fcKsi,
    relativeHumidity: v.environment.relativeHumidity,
    volumeToSurfaceIn: section.volumeToSurface,
    curing: c.curing,
    releaseAgeDays: releaseAge,
    cementType: c.cementType,
    slumpIn: c.mix?.slump !== undefined ? dim(c.mix.slump) : undefined,
    finesPercent: c.mix?.finesPercent,
    airPercent: c.mix?.airPercent,
    cementLbPerYd3: c.mix?.cementContent !== undefined ? (si ? c.mix.cementContent / 0.593276 : c.mix.cementContent) : undefined,
    cementClass: c.cementClass,
    curingTemperatureC: c.curingTemperature ?? (c.curing === 'steam' ? 55 : 20),
    modulusRatio: (t) => modulusAt(t) / ec28,
    aashtoEdition: v.aashtoEdition,
  };
  const model =
    v.method === 'aashto' ? aashtoModel(mi) : v.method === 'mc2010' ? mc2010Model(mi) : v.method === 'en1992' ? en1992Model(mi) : aci209Model(mi);

  // Deflection is linear in the load: one integration per support layout, reused for every age.
  const perLayout = new Map<number, number>();
  const unitDeflection = (overhang: number): number => {
    let d = perLayout.get(overhang);
    if (d === undefined) {
      d = selfWeightDeflection(1, lengthIn, overhang, eci, section.inertia);
      perLayout.set(overhang, d);
    }
    return d;
  };

  return {
    input: v,
    lengthIn,
    lengthFt: lengthIn / 12,
    section,
    widthIn,
    unitWeightPcf,
    selfWeightKipPerIn,
    fciKsi,
    fcKsi,
    eci,
    ec28,
    modulusAt,
    groups,
    strandArea,
    forceAfterRelease,
    jackingForce,
    esLoss,
    fpj,
    eccMidAvg,
    releaseAge,
    model,
    dPs: prestressCamber(groups, lengthIn, eci, section.inertia),
    dSw: (a) => unitDeflection(a) * selfWeightKipPerIn,
    dLoad: (q, a) => unitDeflection(a) * q,
  };
}

function strandAreaFromDiameter(dbIn: number): number {
  const key = Object.keys(STRAND_AREA_IN2).find((k) => Math.abs(Number(k) - dbIn) < 0.02);
  return key !== undefined ? STRAND_AREA_IN2[key]! : 0.612 * dbIn * dbIn;
}

function sectionIn(s: PredictParsed['section'], si: boolean): SectionProps {
  if ('shape' in s) {
    const k = si ? 1 / MM_PER_IN : 1;
    const scaled = Object.fromEntries(Object.entries(s).map(([key, val]) => [key, typeof val === 'number' && !['stemCount', 'voidCount'].includes(key) ? val * k : val]));
    return sectionFromShape(scaled as ShapeInput);
  }
  if (!si) return { area: s.area, inertia: s.inertia, yb: s.yb, height: s.height, volumeToSurface: s.volumeToSurface };
  return {
    area: s.area / MM_PER_IN ** 2,
    inertia: s.inertia / MM_PER_IN ** 4,
    yb: s.yb / MM_PER_IN,
    height: s.height / MM_PER_IN,
    volumeToSurface: s.volumeToSurface / MM_PER_IN,
  };
}

function shapeWidth(s: ShapeInput, si: boolean): number {
  const k = si ? 1 / MM_PER_IN : 1;
  switch (s.shape) {
    case 'rectangle':
    case 'hollow-core':
      return s.width * k;
    case 'double-tee':
      return s.flangeWidth * k;
    case 'inverted-tee':
      return s.webWidth * k;
    case 'i-girder':
      return s.topFlangeWidth * k;
  }
}

