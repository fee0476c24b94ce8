// Closed forms for the standard cases, used to cross-check the curvature integrator (elastic.ts).
// Sources: PCI Design Handbook camber equations for strand profiles [MEM-H]; debonding and dunnage
// forms derived by moment-area in the engineering reference §1.2–1.3 [CALC].

/** Straight strands: Δ = P·e·L²/(8EI). */
export const straightCamber = (p: number, e: number, l: number, E: number, i: number): number => (p * e * l * l) / (8 * E * i);

/** Single-point harp at midspan: Δ = P·e_e·L²/(8EI) + P·e′·L²/(12EI), e′ = e_c − e_e. */
export const harp1Camber = (p: number, eEnd: number, eMid: number, l: number, E: number, i: number): number =>
  (p * eEnd * l * l) / (8 * E * i) + (p * (eMid - eEnd) * l * l) / (12 * E * i);

/** Two-point harp at a from each end: Δ = P·e_e·L²/(8EI) + (P·e′/EI)·(L²/8 − a²/6). */
export const harp2Camber = (p: number, eEnd: number, eMid: number, a: number, l: number, E: number, i: number): number =>
  (p * eEnd * l * l) / (8 * E * i) + ((p * (eMid - eEnd)) / (E * i)) * ((l * l) / 8 - (a * a) / 6);

/** Straight debonded d each end with linear transfer over lt: Δ = (P·e/EI)·[L²/8 − d²/2 − d·lt/2 − lt²/6]. */
export const debondedCamber = (p: number, e: number, d: number, lt: number, l: number, E: number, i: number): number =>
  ((p * e) / (E * i)) * ((l * l) / 8 - (d * d) / 2 - (d * lt) / 2 - (lt * lt) / 6);

/** Uniform load on end supports: Δ = 5wL⁴/(384EI). */
export const uniformEndSupports = (w: number, l: number, E: number, i: number): number => (5 * w * l ** 4) / (384 * E * i);

/** Uniform load, supports inset a: midspan relative to the end chord, (w/EI)(5L⁴/384 − aL³/16 + a³L/12). */
export const uniformInsetEndChord = (w: number, l: number, a: number, E: number, i: number): number =>
  (w / (E * i)) * ((5 * l ** 4) / 384 - (a * l ** 3) / 16 + (a ** 3 * l) / 12);

/** Uniform load, supports inset a: midspan relative to the supports, wLs²(5Ls² − 24a²)/(384EI). */
export const uniformInsetSupports = (w: number, l: number, a: number, E: number, i: number): number => {
  const ls = l - 2 * a;
  return (w * ls * ls * (5 * ls * ls - 24 * a * a)) / (384 * E * i);
};

/** Camber on a chord inset a from each end, for a parabolic shape measured C on the end chord. */
export const insetChordCamber = (c: number, l: number, a: number): number => c * (1 - (2 * a) / l) ** 2;

/** Camber from three elevations: C(x) = z(x) − [zA + (zB − zA)(x − xA)/(xB − xA)]. */
export const camberFromElevations = (zA: number, zB: number, zMid: number, xA = 0, xB = 1, x = 0.5): number =>
  zMid - (zA + ((zB - zA) * (x - xA)) / (xB - xA));
