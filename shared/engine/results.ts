/**
 * The shape of computeSurvey's output. Plain JSON (numbers, strings, arrays, null), SI throughout:
 * m, m², m³, kg, N, N·m, Pa, s. Points are ship axes.
 */
import type { LoadDiagramPoint } from './plate';
import type { BeamResult } from './beam';
import type { BoundarySide } from '../schemas/survey';
import type { Withheld } from './readings';

export interface Point {
  x: number;
  y: number;
  z: number;
}

export type Severity = 'info' | 'warning' | 'danger';

export interface EngineWarning {
  code: string;
  severity: Severity;
  /** Id of the compartment, boundary, shore or layer concerned, if any. */
  entityId: string | null;
  message: string;
}

export interface FrameResult {
  heelDeg: number;
  trimDeg: number;
  /** T_aft − T_fwd, m. */
  trimM: number;
  heelSource: 'inclinometer' | 'midship drafts' | 'none';
  /** Earth-up unit vector in ship axes. */
  up: Point;
  waterlinePoint: Point;
  /** Elevation (m along earth-up from the ship origin) of the outside waterline. */
  waterlineElevationM: number;
  seaDensityKgM3: number;
  gravityMS2: number;
  /** Ship readings not entered yet ("draft forward", "heel …"): while any is missing, heel and trim are not real. Absent in older results. */
  missingReadings?: string[];
}

export interface Aggregate {
  volumeM3: number;
  massKg: number;
  centroid: Point | null;
}

export interface LayerResult {
  layerId: string;
  fluidId: string;
  fluidName: string;
  category: 'water' | 'oil' | 'other';
  densityKgM3: number;
  /** Elevation of the layer's top surface, m along earth-up. */
  levelElevationM: number;
  /** Where the top surface cuts the vertical (ship z) line through the compartment's centroid. */
  levelPoint: Point;
  /**
   * When the reading gives only a range (a zero sounding: at or below the pipe bottom), the lowest
   * and highest elevations the surface may have, m along earth-up; the loads use the highest.
   */
  levelRange: { lowElevationM: number; highElevationM: number } | null;
  /** Liquid volume with permeability applied, m³. */
  volumeM3: number;
  massKg: number;
  centroid: Point | null;
  /** Tanks: the part of volumeM3 that is the tank's own liquid, m³ (the rest is flood water); 0 elsewhere. */
  ownVolumeM3: number;
}

/**
 * A tank's own liquid told apart from flood water (shared/engine/tank-contents.ts): flood water can
 * take only the room the tank's own liquid leaves (SOLAS II-1/7-3: 0 for a full tank, 0.95 empty).
 */
export interface TankResult {
  /** As the surveyor stated it; 'not-stated' is taken as empty (the more flood water, the worse). */
  state: 'empty' | 'part-full' | 'full' | 'not-stated';
  ownFluidId: string | null;
  ownFluidName: string | null;
  /** Own liquid as stated, m³ (permeability applied). */
  ownStatedM3: number;
  /** Own liquid found in the layers, m³, and its mass, kg. */
  ownVolumeM3: number;
  ownMassKg: number;
  /** Stated own liquid not found in the layers, m³. */
  ownMissingM3: number;
  /** Flood water (every other liquid in the tank), m³ and kg. */
  floodVolumeM3: number;
  floodMassKg: number;
  /** The room flood water can take, m³, and as a fraction of the moulded volume. */
  floodRoomM3: number;
  floodPermeability: number;
  source: string;
}

export interface InflowResult {
  breaches: { id: string; headM: number; flowM3S: number }[];
  /** Sum of orifice flows, m³/s (positive = into the compartment). */
  orificeInflowM3S: number;
  /**
   * From the sounding log: the least-squares slope of liquid volume against time with the pumps that
   * ran added back (inflowM3S), the net rise as read, the fit's r² and residuals, and whether it
   * disagrees with the orifice inflow (ratio measured / orifice) by more than a factor of 2.
   */
  measured: {
    inflowM3S: number;
    netRiseM3S: number;
    r2: number;
    readings: { time: string; volumeM3: number; pumpedSinceM3: number; residualM3: number }[];
    ratio: number | null;
    disagree: boolean;
  } | null;
  pumpCapacityM3S: number;
  /** Inflow used for the pumping estimate: the measured one if there is a log, else the orifice estimate. */
  inflowUsedM3S: number;
  /** pumps − inflow, m³/s. */
  netRemovalM3S: number;
  /**
   * Seconds until the running pumps uncover their suction, the inflow growing as the level falls
   * (the flooding model, other spaces held); with no breach entered, against the measured rate held.
   * Null if they do not within 48 h.
   */
  timeToPumpOutS: number | null;
}

export interface CompartmentResult {
  id: string;
  name: string;
  spaceType: string;
  permeability: number;
  /** Where the permeability comes from (a named default, or the surveyor). */
  permeabilitySource: string;
  grossVolumeM3: number;
  openToSea: boolean;
  gasGaugePressurePa: number;
  layers: LayerResult[];
  liquid: Aggregate;
  /** Fraction of the permeable volume filled with liquid. */
  fillFraction: number;
  inflow: InflowResult | null;
  /** Tanks only: their own liquid and the flood water apart; null for every other space. */
  tank: TankResult | null;
}

export interface SideResult {
  kind: 'compartment' | 'sea' | 'air';
  compartmentId: string | null;
  /** Resultant of this side's pressure alone, N (pushes on the plate from this side). */
  forceN: number;
  peakPressurePa: number;
  /** Plate area below this side's top liquid surface, m². */
  wettedAreaM2: number;
  liquidTopElevationM: number | null;
}

export interface PartResult {
  forceN: number;
  areaM2: number;
  centreOfPressure: Point | null;
}

export interface NetResult {
  /**
   * Net force along referenceDirection, N, positive towards side B. Flat plates: ∫(p_A − p_B) dA
   * along the plate normal. Faceted surfaces: the resultant's component along the facets'
   * area-weighted mean normal.
   */
  forceN: number;
  /** The direction forceN is measured along (ship axes, unit, pointing from side A to side B). */
  referenceDirection: Point | null;
  /**
   * The two sides nearly cancel (net force under 2 % of the larger side's force): the load is
   * reported as the net force and a couple, and no centre of pressure is given (it would lie far
   * off the plate).
   */
  nearlyCancels: boolean;
  /** Moment of the net pressure about the plate's (or surface's) centroid, N·m: given when nearlyCancels. */
  coupleNm: number | null;
  resultantN: number;
  /** Resultant force vector, ship axes, N. */
  forceVector: Point;
  /** Earth components: vertical (positive up) and horizontal magnitude with its direction. */
  verticalN: number;
  horizontalN: number;
  horizontalDirection: Point | null;
  /** Point of action (for faceted surfaces: point of the line of action closest to the surface centroid). */
  centreOfPressure: Point | null;
  centreOfPressurePlate: { u: number; v: number } | null;
  /** Height (earth-vertical) of the centre of pressure above the plate's lowest point, m. */
  centreOfPressureAboveLowestM: number | null;
  lineOfAction: { point: Point; direction: Point } | null;
  /** Faceted surfaces only: couple left about the line of action (a wrench), N·m. */
  residualMomentNm: number;
  positive: PartResult;
  negative: PartResult;
  /** True when the net pressure reverses across the plate. */
  signChange: boolean;
  /** Net pressure of largest magnitude and where it acts. */
  peak: { pressurePa: number; point: Point };
  maxPressurePa: number;
  minPressurePa: number;
}

/** One stiffener: its beam result under its strip of the plate load (and any shores on it), and its check. */
export interface StiffenerItem extends BeamResult {
  /** Distance across the plate from the plate's edge where the stiffeners start (the first line is firstOffsetM from it), m. */
  offsetM: number;
  /** Width of plate the stiffener carries (half way to each neighbour or to the edge), m. */
  tributaryWidthM: number;
  /** Sum of the forces the shores put on this stiffener (against the load), N. */
  shoreForcesN: number;
  requiredModulusM3: number;
  utilisation: number;
}

export interface StiffenerResult {
  endFixity: 'simply-supported' | 'fixed';
  spacingM: number;
  items: StiffenerItem[];
  governingIndex: number | null;
  /** Largest stiffener utilisation, or null when no stiffener could be checked (never 0 % for "none"). */
  maxUtilisation: number | null;
  status: 'ok' | 'normal-to-plate' | 'none-inside';
  /** Why there is no check, when status is not ok. */
  note: string | null;
  /** Load the plate's edges take directly (outer strips, less what shores between stiffeners pass to an edge), N. */
  edgeLoadN: number | null;
  /** The plate edge offsets are measured from, in words ("starboard edge", "lower edge", …). */
  offsetFromEdge: string;
  /** More than the largest number of stiffeners built; the rest are not checked. */
  truncated: boolean;
  /** What the model assumes, in words. */
  model: string;
}

/** The plating between stiffeners, panel by panel (Roark's rectangular-plate coefficients). */
export interface PlatingPanelResult {
  /** Distance across the plate from the edge where the stiffeners start, to the panel's middle, m. */
  offsetM: number;
  /** Long and short sides, m. */
  longSideM: number;
  shortSideM: number;
  /** Net pressure at the panel's corners: least and greatest magnitude, Pa (signed). */
  pressureMinPa: number;
  pressureMaxPa: number;
  /** Greatest bending stress, Pa. */
  stressPa: number;
  utilisation: number;
}

export interface PlatingResult {
  netThicknessM: number;
  /** The stress utilisation is measured against, and the yield stress given beside it, Pa. */
  allowableStressPa: number;
  yieldStressPa: number;
  edges: 'simply-supported' | 'fixed';
  source: string;
  panels: PlatingPanelResult[];
  governingIndex: number | null;
  maxUtilisation: number | null;
  notes: string[];
}

export interface ShoreResult {
  id: string;
  /** What the shore's head bears on: the plate (no stiffeners), a stiffener, or the plating between two. */
  bearsOn: 'plate' | 'stiffener' | 'panel' | 'edge';
  /** Plate area nearer this shore than any other (plates without stiffeners), m²; null when the load comes through stiffeners. */
  tributaryAreaM2: number | null;
  /** Load the shore takes from the plate, along the plate normal towards its side (negative: pulled away), N. */
  tributaryForceN: number;
  /** Load along the shore's axis (tributary force / cos angle), N. */
  axialLoadN: number;
  loaded: boolean;
  effectiveLengthFactor: number;
  /** The column design method and its factor, in words. */
  designMethod: 'aisc-360-e3' | 'nds-3.7.1' | 'generic' | 'legacy';
  designMethodLabel: string;
  /** Allowable axial load by the design method, N. */
  designCapacityN: number;
  /** Stress the design capacity rests on (Fcr/Ωc, Fc', …), Pa. */
  designStressPa: number;
  /** Euler (elastic) buckling load, N: a secondary figure, never the capacity. */
  eulerLoadN: number;
  /** Axial load over the Euler load. */
  eulerRatio: number;
  /** Axial stress P / A, Pa. */
  stressPa: number;
  /** Slenderness as the method measures it, its name and limit. */
  slenderness: number;
  slendernessName: 'KL/r' | 'le/d';
  slendernessLimit: number | null;
  slendernessExceeded: boolean;
  /** NDS column stability factor Cp, or null. */
  columnStabilityFactor: number | null;
  /** Axial load over the design capacity. */
  utilisation: number;
  /** Length over least thickness (solid sections only; null for a tube, whose diameter is no thickness). */
  lengthToLeastDimension: number | null;
  /** Common-practice flag: longer than 30 × least thickness (no source). */
  slender: boolean;
}

export interface CapacityResult {
  kind: 'pressure' | 'force';
  /** Which way the rating holds: 'either' for a rating without direction. */
  direction: 'towards-A' | 'towards-B' | 'either';
  rated: number;
  /** Peak net pressure (Pa) or net force (N) pushing that way. */
  actual: number;
  utilisation: number;
}

export interface FacetResult {
  areaM2: number;
  forceN: number;
  centreOfPressure: Point | null;
}

export interface BoundaryResult {
  id: string;
  name: string;
  kind: string;
  geometryKind: 'polygon' | 'rectangle' | 'circle' | 'faceted';
  parentBoundaryId: string | null;
  /** Loaded area (openings of child boundaries excluded), m². */
  areaM2: number;
  normal: Point | null;
  centroid: Point;
  plateAxes: { origin: Point; u: Point; v: Point } | null;
  /** Ids of child boundaries cut out of this plate. */
  openingsExcluded: string[];
  sideA: SideResult;
  sideB: SideResult;
  net: NetResult;
  loadDiagram: LoadDiagramPoint[];
  facets: FacetResult[] | null;
  /** Faceted surfaces: facets walked the other way round from their neighbours (indices). */
  reversedFacets: number[];
  stiffeners: StiffenerResult | null;
  plating: PlatingResult | null;
  shores: ShoreResult[];
  /** What the shore and stiffener model assumes, in words (null when the plate has neither). */
  structureModel: string | null;
  capacity: CapacityResult | null;
  /** Ratings with a direction: one entry per direction rated. */
  capacities: CapacityResult[];
  /** Largest of capacity, stiffener and shore utilisations, or null if nothing is rated. */
  maxUtilisation: number | null;
}

export interface ShipTotals {
  /** Water that came in: every water layer except a tank's own (its ballast or fresh water). */
  floodWater: Aggregate;
  oil: Aggregate;
  other: Aggregate;
  /** Tanks' own liquids (fuel, ballast, fresh water they held before the casualty), of any kind. */
  tankContents: Aggregate;
  allLiquids: Aggregate;
}

export interface SurveyResults {
  engineVersion: string;
  surveyId: string;
  conditionId: string;
  conditionTime: string;
  frame: FrameResult;
  compartments: CompartmentResult[];
  boundaries: BoundaryResult[];
  ship: ShipTotals;
  summary: {
    maxUtilisation: number | null;
    maxUtilisationBoundaryId: string | null;
    /** Boundaries with any utilisation above 1. */
    overCapacityBoundaryIds: string[];
    totalInflowM3S: number;
    totalPumpCapacityM3S: number;
  };
  /** Compartments and boundaries left out because a reading they rest on is missing (absent in older results). */
  withheld?: Withheld[];
  warnings: EngineWarning[];
}

export type { LoadDiagramPoint, Withheld };

/**
 * One boundary's headline figures, flat (no nested objects): the row of the Loads table, the
 * colour and arrow of the 3D view, the utilisations the survey summary is built from. Every number
 * equals the same quantity in the boundary's full BoundaryResult (computeBoundaryDetail).
 */
export interface BoundarySummary {
  id: string;
  name: string;
  kind: string;
  geometryKind: BoundaryResult['geometryKind'];
  parentBoundaryId: string | null;
  /** The sides as the survey states them. */
  sideA: BoundarySide;
  sideB: BoundarySide;
  areaM2: number;
  /** net.forceN and net.resultantN, N. */
  forceN: number;
  resultantN: number;
  /** net.forceVector, ship axes, N. */
  forceX: number;
  forceY: number;
  forceZ: number;
  /** net.centreOfPressure (null when there is no net force). */
  copX: number | null;
  copY: number | null;
  copZ: number | null;
  /** Plate normal (null for faceted surfaces). */
  normalX: number | null;
  normalY: number | null;
  normalZ: number | null;
  /** net.peak.pressurePa. */
  peakPressurePa: number;
  signChange: boolean;
  capacityUtilisation: number | null;
  /**
   * The governing rating (capacity.direction, .kind, .rated, .actual), so a row can say which way
   * the rating holds and what it is: null when the boundary has none. Rated and actual are Pa for
   * a pressure rating, N for a force rating.
   */
  capacityDirection: CapacityResult['direction'] | null;
  capacityKind: CapacityResult['kind'] | null;
  capacityRated: number | null;
  capacityActual: number | null;
  /** stiffeners.maxUtilisation. */
  stiffenerUtilisation: number | null;
  /** plating.maxUtilisation. */
  platingUtilisation: number | null;
  /** Largest shore utilisation. */
  shoreUtilisation: number | null;
  maxUtilisation: number | null;
}

/** Numeric columns of a BoundaryTable, in BoundarySummary's names. */
export const BOUNDARY_NUMBER_FIELDS = [
  'areaM2',
  'forceN',
  'resultantN',
  'forceX',
  'forceY',
  'forceZ',
  'copX',
  'copY',
  'copZ',
  'normalX',
  'normalY',
  'normalZ',
  'peakPressurePa',
  'capacityUtilisation',
  'capacityRated',
  'capacityActual',
  'stiffenerUtilisation',
  'platingUtilisation',
  'shoreUtilisation',
  'maxUtilisation',
] as const satisfies readonly (keyof BoundarySummary)[];
export type BoundaryNumberField = (typeof BOUNDARY_NUMBER_FIELDS)[number];

/**
 * Every boundary's summary as columns: one typed array per number (NaN where the summary has
 * null), so a large vessel's per-edit results are a few flat buffers rather than thousands of
 * objects. Row i is boundaryRow(table, i); `length` rows are filled.
 */
export type BoundaryTable = {
  length: number;
  id: string[];
  name: string[];
  kind: string[];
  geometryKind: BoundaryResult['geometryKind'][];
  parentBoundaryId: (string | null)[];
  sideA: BoundarySide[];
  sideB: BoundarySide[];
  /** 1 where the net pressure reverses across the plate. */
  signChange: Uint8Array;
  capacityDirection: (CapacityResult['direction'] | null)[];
  capacityKind: (CapacityResult['kind'] | null)[];
} & Record<BoundaryNumberField, Float64Array>;

/** computeSurveySummary's output: SurveyResults with the boundaries as a BoundaryTable. */
export type SurveySummary = Omit<SurveyResults, 'boundaries'> & { boundaries: BoundaryTable };

/** What both kinds of results share (the compartment, totals and warnings views read only this). */
export type SurveyLevelResults = Omit<SurveyResults, 'boundaries'>;
