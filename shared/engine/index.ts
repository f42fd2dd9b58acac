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
export { DEFAULT_SEA_DENSITY_KG_M3, HEEL_AGREEMENT_TOLERANCE_DEG } from './frame';
/** Solids and outlines for drawing (the 3D model), cut by the same geometry the loads use. */
export { boundaryPolygons, compartmentSolid, liquidBody } from './mesh';
export type { V3 } from './vec';
export { facetOrientation, reverseFacets, type FacetOrientation } from './facets';
export { aiscE3, columnCheck, ndsColumnStability, AISC_OMEGA_C, NDS_LE_D_LIMIT } from './column-design';
export { ROARK_SOURCE } from './plating';
export { governingCheck, type GoverningCheck } from './governing';
export { joinWords, levelReadingMissing, missingShipReadings, withheldSentence } from './readings';
export type * from './results';
export {
  conditionAtAttitude,
  floodWeightsAtLevels,
  floodWeightsFromResults,
  responseFromWeights,
  type GroundForce,
  type GroundState,
  LARGE_TRIM_FRACTION,
  SMALL_ANGLE_LIMIT_DEG,
  type FloodWeight,
  type ShipAttitude,
  type ShipResponse,
  type StabilityWarning,
} from './stability';
export { draftAtX, groundedAt, groundedResponse, shipResponseOf } from './grounding';
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
  type LimitRating,
  type PlanStepForecast,
  type SpaceForecast,
} from './flooding';
export { soundingEvidence, type SoundingEvidence } from './flooding-soundings';
export { ATTITUDE_STEP_M, conditionAtPredictedAttitude, type DownfloodingForecast } from './flooding-attitude';
export { dormandPrince, rosenbrock23, type Linearisation } from './flooding-ode';
export { bandFactorise, bandPays, bandSolve, bandwidths, denseFactorise, denseSolve, newBandLu, reverseCuthillMcKee, type BandLu } from './sparse-band';
export { levelOfMouldedVolume, mouldedVolumeM3, splitOwnLiquid, tankFloodRoom, TANK_PERMEABILITY_SOURCE, type OwnSplit, type TankRoom } from './tank-contents';
