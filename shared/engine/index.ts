/** Public surface of the load engine: what the app, the server and the CLI import. */
export {
  computeBoundaryDetail,
  computeSurvey,
  computeSurveySummary,
  levelElevation,
  summariseBoundary,
  type ComputeOptions,
} from './compute-survey';
export { boundaryIndex, boundaryRow, boundaryRows, tableOfRows } from './boundary-table';
export { ENGINE_VERSION } from './version';
export { HEEL_AGREEMENT_TOLERANCE_DEG } from './frame';
export { joinWords, levelReadingMissing, missingShipReadings, withheldSentence } from './readings';
export type * from './results';
export {
  conditionAtAttitude,
  floodWeightsFromResults,
  responseFromWeights,
  shipResponseOf,
  LARGE_TRIM_FRACTION,
  SMALL_ANGLE_LIMIT_DEG,
  type FloodWeight,
  type ShipAttitude,
  type ShipResponse,
  type StabilityWarning,
} from './stability';
export { boxBmL, boxBmT, boxKb, intactShip, type IntactShip } from './hydrostatics';
export {
  downfloodingFreeboards,
  measuredAttitude,
  readingsVersusModel,
  READING_TOLERANCE,
  type DownfloodingFreeboard,
  type ReadingsCheck,
} from './stability-check';
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
