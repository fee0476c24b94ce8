export * from './schema';
export { predict, predictParsed, predictPrepared, bandOf, toleranceOf } from './predict';
export { prepareMember, type PreparedMember } from './prepare';
export { camberAt, timelineOf } from './growth';
export { calibrate, type Calibration, type CalibrationReading } from './calibrate';
export { DEFAULT_TOLERANCE_RULES, toleranceFor, differentialToleranceFor, type ToleranceRule } from './tolerance';
export { parseTape, formatLength, formatSixteenths, echoTape, TapeParseError, type TapeValue } from './tape';
