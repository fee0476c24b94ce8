// Camber at any age after release: age-adjusted effective modulus (AAEM) form of the engineering
// reference §2.3 (Trost 1967; Bažant 1972; Tadros, Ghali & Meyer, PCI Journal 30(1), 1985):
//   C(t) = Δpi·(1 + φ) − Δpi·(ΔP/Pi)·(1 + χ·φ) − Δsw·(1 + φ) + Σ later events·(1 + φ(t, t_event))
// with the prestress loss after transfer from AASHTO LRFD 5.9.3.4 (refined estimates) evaluated at
// intermediate ages (reference §4.3), and the PCI multipliers (Martin 1977) for method "multipliers".
import { aci209CreepRatio } from './models/aci209';
import { fcgp, kid, relaxationLoss } from './losses';
import { EP_KSI } from './materials';
import type { PreparedMember } from './prepare';

/** Aging coefficient χ; AASHTO's refined-loss equations use 0.7 (reference §2.3). [MEM-H] */
export const CHI = 0.7;
/** Age taken as "final" for the Kid factor, as in AASHTO design examples (tf ≈ 20,000 d). [MEM-M] */
export const FINAL_AGE_DAYS = 20000;

/** PCI Design Handbook long-time multipliers (Martin 1977), non-composite column. [MEM-H, SRC-secondary] */
export const PCI_MULTIPLIERS = {
  erection: { selfWeight: 1.85, prestress: 1.8 },
  final: { selfWeight: 2.7, prestress: 2.45, superimposed: 3.0 },
  finalComposite: { selfWeight: 2.4, prestress: 2.2, superimposed: 3.0, topping: 2.3 },
};

export interface SupportEvent { ageDays: number; overhangIn: number }
export interface LoadEvent { ageDays: number; kipPerIn: number }

export interface AgeState {
  camber: number;
  elastic: number;
  growth: number;
  creep: number;
  loss: number;
}

export interface Timeline {
  supports: SupportEvent[];
  loads: LoadEvent[];
}

/** Support and load history from the input (storage from its age, loads at theirs). */
export function timelineOf(m: PreparedMember): Timeline {
  const si = m.input.units === 'si';
  const toIn = (x: number): number => (si ? (x * 1000) / 25.4 : x * 12);
  const q = (x: number): number => (si ? x / 4.4482216152605 / 39.37007874015748 : x / 12); // kN/m or kip/ft → kip/in
  return {
    supports: m.input.supports.storage.map((s) => ({ ageDays: s.fromAgeDays, overhangIn: toIn(s.overhang) })).sort((a, b) => a.ageDays - b.ageDays),
    loads: m.input.loads.map((l) => ({ ageDays: l.ageDays, kipPerIn: q(l.load) })).sort((a, b) => a.ageDays - b.ageDays),
  };
}

/**
 * The AAEM camber expression (reference §2.3): Δpi·(1 + φ) − Δpi·(ΔP/Pi)·(1 + χ·φ) − Δsw·(1 + φ).
 * With χ = 0.5 it is Branson's form as given in ACI 435R-95.
 */
export const aaemCamber = (dPs: number, dSw: number, phi: number, lossRatio: number, chi = CHI): number =>
  dPs * (1 + phi) - dPs * lossRatio * (1 + chi * phi) - dSw * (1 + phi);

const lossConstants = new WeakMap<PreparedMember, { fc: number; k: number }>();

/** fcgp at midspan after transfer (AASHTO 5.9.3.2.3a) and Kid (5.9.3.4.2a): constant for a member. */
function lossConstantsOf(m: PreparedMember): { fc: number; k: number } {
  let c = lossConstants.get(m);
  if (!c) {
    const { area: ag, inertia: ig } = m.section;
    const mg = (m.selfWeightKipPerIn * m.lengthIn ** 2) / 8;
    c = {
      fc: fcgp(m.forceAfterRelease, ag, ig, m.eccMidAvg, mg),
      k: kid({ aps: m.strandArea, ag, ig, epg: m.eccMidAvg, eci: m.eci, creepFinal: m.model.creep(FINAL_AGE_DAYS, m.releaseAge) }),
    };
    lossConstants.set(m, c);
  }
  return c;
}

/** Creep, shrinkage and relaxation loss after transfer as a fraction of the force after transfer. */
export function lossFraction(m: PreparedMember, t: number): number {
  if (t <= m.releaseAge) return 0;
  const ti = m.releaseAge;
  const p = m.forceAfterRelease;
  const { fc, k } = lossConstantsOf(m);
  const sh = m.model.shrinkage(t) * EP_KSI * k; // ΔfpSR, Eq. 5.9.3.4.2a-1
  const cr = (EP_KSI / m.eci) * Math.max(0, fc) * m.model.creep(t, ti) * k; // ΔfpCR, Eq. 5.9.3.4.2b-1
  const re = relaxationLoss(m.fpj, t) - relaxationLoss(m.fpj, ti);
  return ((sh + cr + re) * m.strandArea) / p;
}

/** Camber state at age t (days since casting), in inches. */
export function camberAt(m: PreparedMember, tl: Timeline, t: number, method = m.input.method): AgeState {
  const ti = m.releaseAge;
  const dSwBed = m.dSw(0);
  if (t <= ti) {
    const net = m.dPs - dSwBed;
    return { camber: net, elastic: net, growth: 0, creep: 0, loss: 0 };
  }
  let currentOverhang = 0;
  let prevSw = dSwBed;
  let elastic = m.dPs - dSwBed;
  if (method === 'multipliers') {
    // Multipliers rise from 1 at release to their final values along the ACI 209 creep time ratio
    // (our interpolation, judgement); the self-weight term follows the supports the piece sits on.
    const r = aci209CreepRatio(t - ti);
    const f = PCI_MULTIPLIERS.final;
    for (const s of tl.supports) if (s.ageDays <= t) currentOverhang = s.overhangIn;
    const dSw = m.dSw(currentOverhang);
    let loads = 0;
    for (const l of tl.loads) if (l.ageDays <= t) loads += m.dLoad(l.kipPerIn, currentOverhang) * (1 + (f.superimposed - 1) * r);
    const mPs = 1 + (f.prestress - 1) * r;
    const phi = (f.selfWeight - 1) * r; // implied creep coefficient Cu = 1.70 (reference §2.1, [CALC])
    const camber = m.dPs * mPs - dSw * (1 + phi) - loads;
    elastic = m.dPs - dSw - tl.loads.filter((l) => l.ageDays <= t).reduce((a, l) => a + m.dLoad(l.kipPerIn, currentOverhang), 0);
    const loss = (1 + phi - mPs) / (1 + CHI * phi);
    return { camber, elastic, growth: camber - elastic, creep: phi, loss };
  }
  const phi = m.model.creep(t, ti);
  const loss = lossFraction(m, t);
  let camber = aaemCamber(m.dPs, dSwBed, phi, loss);
  for (const s of tl.supports) {
    if (s.ageDays > t) break;
    const dNew = m.dSw(s.overhangIn);
    // The change of support moment is a load applied at the lifting age (reference §2.3).
    const delta = ((prevSw - dNew) * m.eci) / m.modulusAt(s.ageDays);
    camber += delta * (1 + m.model.creep(t, s.ageDays));
    elastic += delta;
    prevSw = dNew;
    currentOverhang = s.overhangIn;
  }
  for (const l of tl.loads) {
    if (l.ageDays > t) break;
    let overhang = 0;
    for (const s of tl.supports) if (s.ageDays <= l.ageDays) overhang = s.overhangIn;
    const d = (m.dLoad(l.kipPerIn, overhang) * m.eci) / m.modulusAt(l.ageDays);
    camber -= d * (1 + m.model.creep(t, l.ageDays));
    elastic -= d;
  }
  return { camber, elastic, growth: camber - elastic, creep: phi, loss };
}
