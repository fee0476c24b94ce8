// Elastic camber of a simply supported prestressed member by integrating curvature along its length.
// The yard reads camber as the rise at midspan over the chord through the piece ends, so every
// result here is relative to that chord: δ(x) = ∫ κ(ξ)·G(x, ξ) dξ with G the simple-span influence
// line (unit-load method; engineering reference §1.1). Prestress curvature does not depend on the
// supports; only the self-weight moment does (§1.1, §1.3).

/** One strand group as the integrator needs it: US units (kip, in). */
export interface StrandGroupModel {
  force: number; // kip, force after transfer
  profile: 'straight' | 'harped-1' | 'harped-2';
  eccEnd: number; // in, below the centroid positive
  eccMid: number; // in
  harpAt?: number; // in from each end (harped-2)
  debondLength?: number; // in from each end
  transferLength: number; // in
}

const GAUSS_X = [-Math.sqrt(3 / 5), 0, Math.sqrt(3 / 5)];
const GAUSS_W = [5 / 9, 8 / 9, 5 / 9];

/** Eccentricity of a group at x (in from the left end). */
export function eccentricityAt(g: StrandGroupModel, x: number, length: number): number {
  const xs = Math.min(x, length - x); // symmetric profiles
  switch (g.profile) {
    case 'straight':
      return g.eccMid;
    case 'harped-1':
      return g.eccEnd + ((g.eccMid - g.eccEnd) * xs) / (length / 2);
    case 'harped-2': {
      const a = g.harpAt ?? 0.4 * length;
      return xs >= a ? g.eccMid : g.eccEnd + ((g.eccMid - g.eccEnd) * xs) / a;
    }
  }
}

/** Force in a group at x: zero over the debonded length, then rising linearly over the transfer length. */
export function forceAt(g: StrandGroupModel, x: number, length: number): number {
  const xs = Math.min(x, length - x);
  const d = g.debondLength ?? 0;
  if (xs <= d) return 0;
  const lt = g.transferLength;
  if (lt <= 0 || xs >= d + lt) return g.force;
  return (g.force * (xs - d)) / lt;
}

/** Prestress moment P(x)·e(x) (kip·in), positive when it bends the member upward. */
export const prestressMoment = (groups: StrandGroupModel[], x: number, length: number): number =>
  groups.reduce((m, g) => m + forceAt(g, x, length) * eccentricityAt(g, x, length), 0);

/**
 * Self-weight moment (kip·in, sagging positive) under uniform load w (kip/in) on two supports inset
 * `overhang` from each end (0 = end supports, as on the casting bed).
 */
export function selfWeightMoment(w: number, length: number, overhang: number, x: number): number {
  const r = (w * length) / 2;
  const a = overhang;
  let m = (-w * x * x) / 2;
  if (x > a) m += r * (x - a);
  if (x > length - a) m += r * (x - (length - a));
  return m;
}

/** Points where a group's curvature changes form: the integrand is smooth between them. */
export function groupBreakpoints(g: StrandGroupModel, length: number): number[] {
  const pts: number[] = [];
  const d = g.debondLength ?? 0;
  for (const s of [d, d + g.transferLength]) pts.push(s, length - s);
  if (g.profile === 'harped-2') {
    const a = g.harpAt ?? 0.4 * length;
    pts.push(a, length - a);
  }
  return pts;
}

/** Influence of unit curvature at ξ on the offset at x from the end chord (simple span). */
const influence = (x: number, xi: number, length: number): number =>
  xi <= x ? (xi * (length - x)) / length : (x * (length - xi)) / length;

/**
 * Offset at x of the deflected shape from the chord through the ends, for a curvature κ(ξ) given as
 * a function (positive κ = hogging = upward). Exact for curvature that is a polynomial of degree ≤ 4
 * between breakpoints (3-point Gauss–Legendre per segment); all our moment diagrams are ≤ quadratic.
 */
export function chordOffset(kappa: (xi: number) => number, length: number, x: number, breaks: number[]): number {
  const pts = [...new Set([0, length, x, length / 2, ...breaks].filter((p) => p >= 0 && p <= length))].sort((a, b) => a - b);
  let sum = 0;
  for (let k = 0; k < pts.length - 1; k++) {
    const a = pts[k]!;
    const b = pts[k + 1]!;
    if (b - a <= 0) continue;
    const half = (b - a) / 2;
    const mid = (a + b) / 2;
    for (let j = 0; j < 3; j++) {
      const xi = mid + half * GAUSS_X[j]!;
      sum += GAUSS_W[j]! * half * kappa(xi) * influence(x, xi, length);
    }
  }
  return sum;
}

/** Midspan prestress camber (in, upward) relative to the end chord. */
export function prestressCamber(groups: StrandGroupModel[], length: number, e: number, inertia: number, x = length / 2): number {
  const breaks = groups.flatMap((g) => groupBreakpoints(g, length));
  return chordOffset((xi) => prestressMoment(groups, xi, length) / (e * inertia), length, x, breaks);
}

/** Midspan self-weight deflection (in, downward positive) relative to the end chord. */
export function selfWeightDeflection(w: number, length: number, overhang: number, e: number, inertia: number, x = length / 2): number {
  return chordOffset((xi) => selfWeightMoment(w, length, overhang, xi) / (e * inertia), length, x, [overhang, length - overhang]);
}
