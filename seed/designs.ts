import type { DesignSpec } from '#shared/api/designs';

// The demo scenario's member designs: an invented plant's own products, with section dimensions and
// strand patterns in the range a precast plant makes. Invented data, for the demo only.

export interface DemoDesign { code: string; name: string; productType: string; spec: DesignSpec }

const steam = { unitWeight: 150, curing: 'steam' as const, releaseAgeDays: 1 };

export const DEMO_DESIGNS: DemoDesign[] = [
  {
    code: 'DT28-60',
    name: 'Double tee 12 ft × 28 in, 60 ft span',
    productType: 'double-tee',
    spec: {
      units: 'us', length: 60, productType: 'double-tee',
      section: { shape: 'double-tee', flangeWidth: 144, flangeThickness: 4, stemWidthTop: 7.75, stemWidthBottom: 5.75, height: 28 },
      concrete: { fci: 4.2, fc: 6.0, modulus: 'aci318', ...steam },
      strands: [{ count: 20, area: 0.153, profile: 'harped-1', eccEnd: 4, eccMid: 16.5 }],
      supports: { storage: [{ fromAgeDays: 1, overhang: 2 }] },
      method: 'aashto',
    },
  },
  {
    code: 'HC8-30',
    name: 'Hollow-core 4 ft × 8 in, 30 ft span',
    productType: 'hollow-core',
    spec: {
      units: 'us', length: 30, productType: 'hollow-core',
      section: { shape: 'hollow-core', width: 48, height: 8, voidCount: 6, voidDiameter: 5.5 },
      concrete: { fci: 3.8, fc: 6.0, modulus: 'aci318', ...steam },
      strands: [{ count: 5, area: 0.153, profile: 'straight', eccMid: 2.75 }],
      supports: { storage: [{ fromAgeDays: 1, overhang: 1 }] },
      method: 'aashto',
    },
  },
  {
    code: 'IT36-30',
    name: 'Inverted tee beam 36 in deep, 30 ft span',
    productType: 'inverted-tee',
    spec: {
      units: 'us', length: 30, productType: 'inverted-tee',
      section: { shape: 'inverted-tee', webWidth: 12, height: 36, ledgeWidth: 24, ledgeHeight: 12 },
      concrete: { fci: 4.5, fc: 6.0, modulus: 'aci318', ...steam },
      strands: [{ count: 16, area: 0.153, profile: 'straight', eccMid: 11 }],
      supports: { storage: [{ fromAgeDays: 1, overhang: 1.5 }] },
      method: 'aashto',
    },
  },
  {
    code: 'BG54-110',
    name: 'Bridge I-girder 54 in deep, 110 ft span',
    productType: 'i-girder',
    spec: {
      units: 'us', length: 110, productType: 'i-girder',
      section: { shape: 'i-girder', topFlangeWidth: 42, topFlangeThickness: 5, webWidth: 6, bottomFlangeWidth: 26, bottomFlangeThickness: 8, height: 54 },
      concrete: { fci: 6.0, fc: 8.0, modulus: 'aashto', ...steam },
      strands: [
        { count: 30, area: 0.217, profile: 'straight', eccMid: 20 },
        { count: 8, area: 0.217, profile: 'harped-2', eccEnd: -10, eccMid: 18, harpAt: 44 },
      ],
      supports: { storage: [{ fromAgeDays: 2, overhang: 3 }] },
      method: 'aashto',
    },
  },
];

export const DEMO_JOBS = [
  { number: 'J-2611', name: 'Harbor Street Parking Deck', designs: ['DT28-60', 'IT36-30'] },
  { number: 'J-2614', name: 'Northgate Offices', designs: ['HC8-30'] },
  { number: 'J-2618', name: 'Millbrook School Annex', designs: ['HC8-30', 'DT28-60'] },
  { number: 'J-2620', name: 'Cedar Creek Bridge', designs: ['BG54-110'] },
];

export const DEMO_PLANT = { code: 'RIDGEBACK-MB', name: 'Ridgeback Precast — Millbrook yard', timeZone: 'America/Chicago', unitSystem: 'us' as const };

/** Demo accounts, one per role. The password is for the demo scenario only. */
export const DEMO_PASSWORD = 'camber-demo-2026';
export const DEMO_USERS = [
  { email: 'inspector@ridgeback.example', name: 'Dana Ortiz', role: 'inspector' as const },
  { email: 'qc@ridgeback.example', name: 'Sam Whitfield', role: 'qc_manager' as const },
  { email: 'engineer@ridgeback.example', name: 'Priya Raman', role: 'engineer' as const },
  { email: 'admin@ridgeback.example', name: 'Lee Novak', role: 'admin' as const },
  { email: 'viewer@ridgeback.example', name: 'Chris Erector (J-2620)', role: 'viewer' as const },
];
