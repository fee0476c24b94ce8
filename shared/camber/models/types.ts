/** A creep and shrinkage model as the time-dependent camber calculation uses it. Ages in days since casting. */
export interface CreepShrinkageModel {
  /** Creep coefficient from loading at age t0 to age t, relative to the elastic strain at loading. */
  creep(t: number, t0: number): number;
  /** Shrinkage strain (shortening positive) accumulated between the release age and age t. */
  shrinkage(t: number): number;
}

/** Inputs the models share, US customary (ksi, in, %). Mix data absent → the model's standard conditions. */
export interface ModelInputs {
  fciKsi: number;
  fcKsi: number;
  relativeHumidity: number;
  volumeToSurfaceIn: number;
  curing: 'steam' | 'moist';
  releaseAgeDays: number;
  cementType: 'I' | 'III';
  /** ACI 209 mix data */
  slumpIn?: number;
  finesPercent?: number;
  airPercent?: number;
  cementLbPerYd3?: number;
  /** fib MC2010 / EN 1992 cement strength class */
  cementClass: 'S' | 'N' | 'R';
  /** Curing temperature, °C, for the temperature-adjusted age of MC2010 / EN 1992. */
  curingTemperatureC: number;
  /** E(t0)/E28 used to convert MC2010 / EN 1992 creep to the ratio-to-elastic-strain definition. */
  modulusRatio: (ageDays: number) => number;
  aashtoEdition: '2005' | '2015';
}
