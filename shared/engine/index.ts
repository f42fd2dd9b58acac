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
export { facetOrientation, reverseFacets, type FacetOrientation } from './facets';
export { aiscE3, columnCheck, ndsColumnStability, AISC_OMEGA_C, NDS_LE_D_LIMIT } from './column-design';
export { ROARK_SOURCE } from './plating';
export { governingCheck, type GoverningCheck } from './governing';
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
