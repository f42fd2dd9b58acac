/** Public surface of the load engine: what the app, the server and the CLI import. */
export { computeSurvey, levelElevation, type ComputeOptions } from './compute-survey';
export {
  checkPumpingSequence,
  type PumpingBoundaryChange,
  type PumpingCheck,
  type PumpingStep,
  type PumpingStepResult,
} from './pumping';
export { ENGINE_VERSION } from './version';
export { HEEL_AGREEMENT_TOLERANCE_DEG } from './frame';
export { joinWords, levelReadingMissing, missingShipReadings, withheldSentence } from './readings';
export type * from './results';
