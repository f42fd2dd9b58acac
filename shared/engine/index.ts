/** Public surface of the load engine: what the app, the server and the CLI import. */
export { computeSurvey, levelElevation, type ComputeOptions } from './compute-survey';
export { ENGINE_VERSION } from './version';
export { HEEL_AGREEMENT_TOLERANCE_DEG } from './frame';
export { joinWords, levelReadingMissing, missingShipReadings, withheldSentence } from './readings';
export type * from './results';
export {
  applyFloodVariant,
  forecastFlooding,
  DEFAULT_HORIZON_H,
  type BoundaryForecast,
  type FloodForecast,
  type FloodVariant,
  type ForecastOptions,
  type Governs,
  type PlanStepForecast,
  type SpaceForecast,
} from './flooding';
export { soundingEvidence, type SoundingEvidence } from './flooding-soundings';
