// Concrete and strand material properties, US customary (psi / ksi, lb/ft³ / kcf, in).
// Each function names the clause it implements; values from memory are marked [MEM] as in the
// team's engineering reference, which lists the confidence of each.

export type ModulusRule = 'aci318' | 'aashto2014' | 'aashto' | 'en1992' | 'mc2010' | 'measured';

/** ACI 318-19 §19.2.2.1(a): Ec = wc^1.5 · 33 · √f'c (psi), wc in lb/ft³ (90–160). [MEM-H] */
export const ecAci318 = (fcPsi: number, wcPcf: number): number => Math.pow(wcPcf, 1.5) * 33 * Math.sqrt(fcPsi);

/** ACI 318-19 §19.2.2.1(b): Ec = 57,000·√f'c (psi), normal-weight concrete. [MEM-H] */
export const ecAci318Normal = (fcPsi: number): number => 57000 * Math.sqrt(fcPsi);

/** AASHTO LRFD ≤ 7th ed. (2014) Eq. 5.4.2.4-1: Ec = 33,000·K1·wc^1.5·√f'c (ksi, wc kcf). [MEM-H] */
export const ecAashto2014 = (fcKsi: number, wcKcf: number, k1 = 1): number =>
  33000 * k1 * Math.pow(wcKcf, 1.5) * Math.sqrt(fcKsi);

/** AASHTO LRFD 7th ed. 2015 interims / 8th / 9th Eq. 5.4.2.4-1: Ec = 120,000·K1·wc^2·f'c^0.33 (ksi). [MEM-M] */
export const ecAashto2015 = (fcKsi: number, wcKcf: number, k1 = 1): number =>
  120000 * k1 * Math.pow(wcKcf, 2) * Math.pow(fcKsi, 0.33);

/** EN 1992-1-1:2004 Table 3.1: Ecm = 22·(fcm/10)^0.3 (GPa), fcm = fck + 8 MPa, quartzite aggregate. [MEM-H] */
export const ecmEn1992 = (fckMpa: number): number => 22 * Math.pow((fckMpa + 8) / 10, 0.3);

/** fib Model Code 2010 Eq. 5.1-21: Eci = Ec0·αE·(fcm/10)^(1/3), Ec0 = 21.5 GPa. [MEM-H] */
export const eciMc2010 = (fckMpa: number, alphaE = 1): number => 21.5 * alphaE * Math.cbrt((fckMpa + 8) / 10);

/** ACI 209R-92 Eq. 2-1: f'c(t) = t/(a + b·t)·f'c28; a, b by curing and cement type. [MEM-H] */
export function strengthRatioAci209(ageDays: number, curing: 'steam' | 'moist', cementType: 'I' | 'III' = 'I'): number {
  const [a, b] =
    curing === 'moist' ? (cementType === 'I' ? [4.0, 0.85] : [2.3, 0.92]) : cementType === 'I' ? [1.0, 0.95] : [0.7, 0.98];
  return ageDays / (a + b * ageDays);
}

/** ACI 318-19 §19.2.3.1: modulus of rupture fr = 7.5·λ·√f'c (psi). [MEM-H] */
export const frAci318 = (fcPsi: number, lambda = 1): number => 7.5 * lambda * Math.sqrt(fcPsi);

/** AASHTO LRFD 8th ed. 5.4.2.6: fr = 0.24·λ·√f'c (ksi). [MEM-M] */
export const frAashto = (fcKsi: number, lambda = 1): number => 0.24 * lambda * Math.sqrt(fcKsi);

/** AASHTO LRFD Table 3.5.1-1 default unit weight (kcf) when none is given. [MEM-M] */
export const defaultUnitWeightKcf = (fcKsi: number): number => (fcKsi <= 5 ? 0.145 : 0.14 + 0.001 * fcKsi);

/** Modulus in ksi by the chosen rule; f'c in ksi, unit weight in lb/ft³. */
export function modulusKsi(rule: ModulusRule, fcKsi: number, wcPcf: number, k1 = 1): number {
  switch (rule) {
    case 'aci318':
      return ecAci318(fcKsi * 1000, wcPcf) / 1000;
    case 'aashto2014':
      return ecAashto2014(fcKsi, wcPcf / 1000, k1);
    case 'aashto':
      return ecAashto2015(fcKsi, wcPcf / 1000, k1);
    case 'en1992':
      return (ecmEn1992(fcKsi * 6.894757293168) * 1000) / 6.894757293168;
    case 'mc2010':
      return (eciMc2010(fcKsi * 6.894757293168) * 1000) / 6.894757293168;
    case 'measured':
      throw new Error('a measured modulus must be given as a value');
  }
}

/** Strand modulus Ep = 28,500 ksi (AASHTO LRFD 5.4.4.2 default for strand). [MEM-H] */
export const EP_KSI = 28500;
/** Low-relaxation Grade 270 strand: fpu = 270 ksi, fpy = 0.90·fpu (AASHTO Table 5.4.4.1-1). [MEM-H] */
export const FPU_KSI = 270;
export const FPY_KSI = 0.9 * FPU_KSI;

/** Nominal areas of seven-wire strand, ASTM A416 (in²). [MEM-H] */
export const STRAND_AREA_IN2: Record<string, number> = {
  '0.375': 0.085,
  '0.5': 0.153,
  '0.52': 0.167,
  '0.6': 0.217,
  '0.7': 0.294,
};

/**
 * Transfer length of strand: AASHTO LRFD 5.9.4.3.1 ℓt = 60·db [MEM-H]; ACI 318-19 §22.5.9.1 ℓt = 50·db
 * for strand [MEM-M on the clause number].
 */
export const transferLengthIn = (rule: 'aashto' | 'aci' | 'none', dbIn: number): number => (rule === 'aashto' ? 60 * dbIn : rule === 'aci' ? 50 * dbIn : 0);

/** ACI 318-19 §21.2.3: ℓtr = (fse/3000)·db, fse in psi. [MEM-M] */
export const transferLengthAciStress = (fsePsi: number, dbIn: number): number => (fsePsi / 3000) * dbIn;

/** ACI 318-19 §25.4.8.1: ℓd = (fse/3000)·db + ((fps − fse)/1000)·db, psi. [MEM-H] */
export const developmentLengthAci = (fsePsi: number, fpsPsi: number, dbIn: number): number => (fsePsi / 3000) * dbIn + ((fpsPsi - fsePsi) / 1000) * dbIn;
