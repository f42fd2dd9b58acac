/**
 * The survey format: one JSON document per casualty survey. Everything is SI (m, m², m³, kg/m³,
 * Pa, N, s) in ship axes: x forward from the aft perpendicular, y to port, z up from the baseline.
 * Types are inferred from these schemas; the published JSON Schema (survey.schema.json) is
 * generated from them by scripts/gen-schema.ts.
 */
import { z } from 'zod';
import { catalogueFluid } from '../fluids/catalogue';
import { CargoStateSchema, SpaceTypeSchema } from './space-types';
import { SURVEY_LIMITS as L, TEXT_LIMITS, boundedText, capMessage, cappedArray } from './limits';
import { ConditionStabilitySchema, DownfloodingPointSchema } from './stability';
import { FloodingSettingsSchema, InternalOpeningSchema, OpeningFaceSchema, OpeningSizeSchema, PumpsRunningSchema, TankContentsSchema } from './flooding';
import { MarksSchema } from './marks';
import { DirectionalRatingSchema, PlatingSchema, ShoreDesignSchema } from './structure';
import { SURVEY_SCHEMA_VERSION, upgradeSurvey } from './upgrade';

export { SURVEY_SCHEMA_VERSION };

const Id = z.uuid();
const Length = z.number();
const PositiveLength = z.number().positive();
const NonNegative = z.number().nonnegative();

/** A point or vector in ship axes, metres. */
export const Point3Schema = z.object({ x: z.number(), y: z.number(), z: z.number() });
export type Point3 = z.infer<typeof Point3Schema>;

export const VesselSchema = z.object({
  name: boundedText(TEXT_LIMITS.name).trim().min(1),
  imo: z.string().regex(/^\d{7}$/, 'IMO number must be 7 digits').optional(),
  /** The ship's clock: minutes ahead of UTC (negative west), for times said in ship's time. */
  shipTimeOffsetMin: z.number().int().min(-14 * 60).max(14 * 60).optional(),
  lbpM: PositiveLength,
  breadthM: PositiveLength,
  depthM: PositiveLength,
  /** Longitudinal positions (x, m from the aft perpendicular) of the draught marks read. */
  draughtMarks: z.object({
    forwardXM: Length,
    aftXM: Length,
    /** Position of the midship marks read on each side for heel, if any. */
    midshipXM: Length.optional(),
  }),
  /** Openings that would let more water in once under water (the ship's response reports their freeboard). */
  downfloodingPoints: cappedArray(DownfloodingPointSchema, L.breaches, 'downflooding points').optional(),
});
export type Vessel = z.infer<typeof VesselSchema>;

/** Where a sounding pipe stands: x, y of the pipe (m) and the height of its bottom (striking plate) above baseline. */
export const SoundingPipeSchema = z.object({ x: z.number(), y: z.number(), bottomZM: z.number() });

/**
 * How a liquid surface was found. A sounding pipe is taken as straight along the ship's z axis
 * (pipes are fixed to the structure and heel with it); the tape reading is measured along the pipe,
 * so the level plane passes through (x, y, bottomZM + soundingM). An ullage is measured down the
 * same way from its reference point: the plane passes through (x, y, z − ullageM). An interface
 * sounding (water-finding paste under oil) gives the top of a lower layer. "openToSea" puts the
 * level on the outside waterline; "point" gives any ship point the surface passes through.
 */
export const LevelSourceSchema = z.discriminatedUnion('kind', [
  // a reading absent until taken: the engine shows no loads that rest on it (shared/engine/readings.ts)
  z.object({ kind: z.literal('sounding'), pipe: SoundingPipeSchema, soundingM: NonNegative.optional() }),
  z.object({ kind: z.literal('interfaceSounding'), pipe: SoundingPipeSchema, soundingM: NonNegative.optional() }),
  z.object({
    kind: z.literal('ullage'),
    reference: Point3Schema,
    ullageM: NonNegative.optional(),
    /** How the tape ran: along the pipe (ship's z axis, the default) or hanging plumb (earth-vertical). */
    tape: z.enum(['along-pipe', 'plumb']).optional(),
  }),
  z.object({ kind: z.literal('openToSea') }),
  z.object({ kind: z.literal('point'), point: Point3Schema }),
]);
export type LevelSource = z.infer<typeof LevelSourceSchema>;

export const LayerSchema = z.object({
  id: Id,
  /** Catalogue id (see shared/fluids/catalogue) or the id of a survey fluid override. */
  fluidId: boundedText(TEXT_LIMITS.key).min(1),
  /** Measured density for this layer, overriding the fluid's density. */
  densityKgM3: z.number().positive().max(2000).optional(),
  /** The top surface of this layer. */
  level: LevelSourceSchema,
  marks: MarksSchema.optional(),
});
export type Layer = z.infer<typeof LayerSchema>;

/** The gas space over the liquid: vented to atmosphere, or held at a gauge pressure (negative for suction). */
export const GasSpaceSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('vented') }),
  z.object({ kind: z.literal('pressurised'), gaugePressurePa: z.number().min(-101325) }),
]);
export type GasSpace = z.infer<typeof GasSpaceSchema>;

/** What one compartment holds in one condition: layers from the bottom up, and the gas space. */
export const ContentsSchema = z.object({
  compartmentId: Id,
  layers: cappedArray(LayerSchema, L.layers, 'layers in one compartment'),
  gas: GasSpaceSchema.optional(),
});
export type Contents = z.infer<typeof ContentsSchema>;

export const ConditionSchema = z.object({
  id: Id,
  name: boundedText(TEXT_LIMITS.name).optional(),
  time: z.iso.datetime({ offset: true }),
  /**
   * Drafts at the marks, m above baseline. Forward and aft are centreline (mean of both sides) values,
   * absent until read (no loads are shown without them).
   */
  drafts: z.object({
    forwardM: z.number().optional(),
    aftM: z.number().optional(),
    midPortM: z.number().optional(),
    midStarboardM: z.number().optional(),
  }),
  /** Inclinometer heel, degrees, positive with starboard down. If absent, taken from the midship drafts; with neither, no loads. */
  heelDeg: z.number().gt(-60).lt(60).optional(),
  /** Sea water density, kg/m³ (default 1025). */
  seaDensityKgM3: z.number().min(990).max(1050).optional(),
  /** Acceleration of gravity, m/s² (default standard gravity 9.80665). */
  gravityMS2: z.number().min(9.7).max(9.9).optional(),
  contents: cappedArray(ContentsSchema, L.compartments, 'compartments with contents'),
  /** Hydrostatic particulars for the ship's response (./stability.ts). */
  stability: ConditionStabilitySchema.optional(),
  /** Forecast settings and the pumping plan (shared/schemas/flooding.ts). */
  flooding: FloodingSettingsSchema.optional(),
  marks: MarksSchema.optional(),
});
export type Condition = z.infer<typeof ConditionSchema>;

export const BreachSchema = z.object({
  id: Id,
  /** Centre of the opening, ship axes. */
  position: Point3Schema,
  areaM2: z.number().positive(),
  /** Discharge coefficient (default 0.6, sharp-edged orifice). */
  dischargeCoefficient: z.number().gt(0).max(1).optional(),
  face: OpeningFaceSchema.optional(),
  size: OpeningSizeSchema.optional(),
});

export const PumpSchema = z.object({
  id: Id,
  name: boundedText(TEXT_LIMITS.name),
  capacityM3S: z.number().nonnegative(),
  /** Height of the suction above the space's lowest point, m (default 0: the bottom). */
  suctionHeightM: NonNegative.optional(),
  /** Whether the pump is running now (default true). */
  running: z.boolean().optional(),
});

export const SoundingLogSchema = z.object({
  pipe: SoundingPipeSchema,
  /**
   * `pumpIds`: the pumps that ran between the reading before and this one. One reading is kept as
   * soon as it is taken (its level and time stand alone); a rate of inflow needs two.
   */
  readings: cappedArray(
    z.object({ time: z.iso.datetime({ offset: true }), soundingM: NonNegative, pumpIds: PumpsRunningSchema.optional() }),
    L.soundingReadings,
    'readings in one sounding log',
  ).min(1),
});

export const CompartmentGeometrySchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('box'), min: Point3Schema, max: Point3Schema }),
  /** A section polygon in the y–z plane (any order, not self-intersecting) extruded between two x positions. */
  z.object({
    kind: z.literal('prism'),
    xAftM: z.number(),
    xForeM: z.number(),
    section: cappedArray(z.object({ y: z.number(), z: z.number() }), L.sectionPoints, 'points in one section').min(3),
  }),
]);
export type CompartmentGeometry = z.infer<typeof CompartmentGeometrySchema>;

export const CompartmentSchema = z.object({
  id: Id,
  name: boundedText(TEXT_LIMITS.name).trim().min(1),
  spaceType: SpaceTypeSchema,
  geometry: CompartmentGeometrySchema,
  /** Overrides the default permeability of the space type. */
  permeability: z.number().min(0).max(1).optional(),
  /** Cargo spaces: how loaded the space is, which sets its default permeability. */
  cargoState: CargoStateSchema.optional(),
  /** Tanks: their own liquid before the casualty, told apart from flood water (./flooding.ts). */
  tankContents: TankContentsSchema.optional(),
  /** Open to the sea through a breach: unless the condition gives contents, it floods to the outside waterline. */
  openToSea: z.boolean().optional(),
  breaches: cappedArray(BreachSchema, L.breaches, 'breaches in one compartment').optional(),
  pumps: cappedArray(PumpSchema, L.pumps, 'pumps in one compartment').optional(),
  soundingLog: SoundingLogSchema.optional(),
  marks: MarksSchema.optional(),
  /** Openings into other compartments (shared/schemas/flooding.ts). */
  openings: cappedArray(InternalOpeningSchema, L.breaches, 'openings from one compartment').optional(),
  /** Air-tight, not vented: air trapped above the liquid is compressed as it rises (Boyle's law). */
  airTight: z.boolean().optional(),
});
export type Compartment = z.infer<typeof CompartmentSchema>;

export const BoundarySideSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('compartment'), compartmentId: Id }),
  z.object({ kind: z.literal('sea') }),
  z.object({ kind: z.literal('air') }),
]);
export type BoundarySide = z.infer<typeof BoundarySideSchema>;

const PolygonVertices = cappedArray(Point3Schema, L.polygonVertices, 'vertices per polygon').min(3);

/**
 * Plate geometry. The vertex order fixes the plate normal by the right-hand rule; the normal points
 * from side A into side B, so positive net pressure (A − B) pushes the plate towards side B.
 * Rectangle: a corner and its two edge vectors (normal = edgeU × edgeV). Circle: centre, normal
 * (towards side B) and radius. Faceted: a curved surface as flat facets, each oriented the same way.
 */
export const BoundaryGeometrySchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('polygon'), vertices: PolygonVertices }),
  z.object({ kind: z.literal('rectangle'), origin: Point3Schema, edgeU: Point3Schema, edgeV: Point3Schema }),
  z.object({ kind: z.literal('circle'), centre: Point3Schema, normal: Point3Schema, radiusM: PositiveLength }),
  z.object({ kind: z.literal('faceted'), facets: cappedArray(z.object({ vertices: PolygonVertices }), L.facets, 'facets in one boundary').min(1) }),
]);
export type BoundaryGeometry = z.infer<typeof BoundaryGeometrySchema>;

/**
 * Stiffeners on a flat plate: parallel lines along `direction` (ship axes, projected into the
 * plate), `spacingM` apart, the first `firstOffsetM` (default one spacing) from the plate's edge.
 * Each spans the plate's chord along its line unless `spanM` is given (then measured from the
 * chord's start, the lower end along `direction`).
 */
export const StiffeningSchema = z.object({
  direction: Point3Schema,
  spacingM: PositiveLength,
  firstOffsetM: NonNegative.optional(),
  spanM: PositiveLength.optional(),
  endFixity: z.enum(['simply-supported', 'fixed']),
  sectionModulusM3: z.number().positive(),
  allowableStressPa: z.number().positive(),
});
export type Stiffening = z.infer<typeof StiffeningSchema>;

export const ShoreSectionSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('rectangular'), widthM: PositiveLength, depthM: PositiveLength }),
  z.object({ kind: z.literal('tube'), outerDiameterM: PositiveLength, wallThicknessM: PositiveLength }),
  z.object({ kind: z.literal('generic'), areaM2: z.number().positive(), leastSecondMomentM4: z.number().positive(), leastDimensionM: PositiveLength }),
]);
export type ShoreSection = z.infer<typeof ShoreSectionSchema>;

export const SHORE_END_CONDITIONS = ['pinned-pinned', 'fixed-fixed', 'fixed-pinned', 'fixed-free'] as const;

export const ShoreSchema = z.object({
  id: Id,
  /** Where the shore's head bears on the plate (ship axes; projected onto the plate). */
  position: Point3Schema,
  lengthM: PositiveLength,
  section: ShoreSectionSchema,
  elasticModulusPa: z.number().positive(),
  allowableStressPa: z.number().positive(),
  endCondition: z.enum(SHORE_END_CONDITIONS),
  /** The side of the plate the shore stands on: it is loaded when the net pressure pushes the plate towards it. */
  side: z.enum(['A', 'B']),
  /** Angle between the shore's axis and the plate normal, degrees (default 0). */
  angleFromNormalDeg: z.number().min(0).max(75).optional(),
  /** The column design check (AISC 360 steel, NDS timber, or a design factor); see structure.ts. */
  design: ShoreDesignSchema.optional(),
});
export type Shore = z.infer<typeof ShoreSchema>;

export const RatedCapacitySchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('pressure'), pressurePa: z.number().positive() }),
  z.object({ kind: z.literal('force'), forceN: z.number().positive() }),
]);

export const BOUNDARY_KINDS = ['bulkhead', 'deck', 'tank-top', 'hatch-cover', 'door', 'manhole', 'shell', 'patch'] as const;

export const BoundarySchema = z.object({
  id: Id,
  name: boundedText(TEXT_LIMITS.name).trim().min(1),
  kind: z.enum(BOUNDARY_KINDS),
  geometry: BoundaryGeometrySchema,
  sideA: BoundarySideSchema,
  sideB: BoundarySideSchema,
  /**
   * A door, hatch or manhole set in another boundary. The child is loaded as its own plate; the
   * parent's loads exclude the child's opening when the child lies in the parent's plane and inside
   * its outline (otherwise the parent is computed over its full outline and a warning says so).
   */
  parentBoundaryId: Id.optional(),
  stiffening: StiffeningSchema.optional(),
  shores: cappedArray(ShoreSchema, L.shores, 'shores on one boundary').optional(),
  /** A rating that holds whichever way the net pressure pushes (see directionalCapacity for one per direction). */
  ratedCapacity: RatedCapacitySchema.optional(),
  directionalCapacity: DirectionalRatingSchema.optional(),
  plating: PlatingSchema.optional(),
  notes: boundedText(TEXT_LIMITS.notes).optional(),
  marks: MarksSchema.optional(),
});
export type Boundary = z.infer<typeof BoundarySchema>;

/** A survey-level fluid: overrides a catalogue entry with the same id, or adds a new one. */
export const FluidOverrideSchema = z
  .object({
    id: boundedText(TEXT_LIMITS.key).min(1),
    name: boundedText(TEXT_LIMITS.name).min(1),
    category: z.enum(['water', 'oil', 'other']),
    densityKgM3: z.number().positive().max(2000).optional(),
    /** For crude oils: density follows from API gravity. */
    apiGravity: z.number().min(-10).max(100).optional(),
    source: boundedText(TEXT_LIMITS.caption).optional(),
  })
  .refine((f) => (f.densityKgM3 === undefined) !== (f.apiGravity === undefined), {
    message: 'give exactly one of densityKgM3 or apiGravity',
  });
export type FluidOverride = z.infer<typeof FluidOverrideSchema>;

export const PhotoRefSchema = z.object({
  id: Id,
  entity: z.object({ kind: z.enum(['survey', 'condition', 'compartment', 'boundary']), id: Id }),
  caption: boundedText(TEXT_LIMITS.caption),
  contentType: z.string().max(TEXT_LIMITS.key).regex(/^image\/[a-z0-9.+-]+$/),
  key: boundedText(TEXT_LIMITS.key).optional(),
});
export type PhotoRef = z.infer<typeof PhotoRefSchema>;

/**
 * The survey's collections of entities, element schema and least length. The survey schema is built
 * from this table and `isValidEdit` checks against it, so the two cannot drift apart.
 */
const COLLECTIONS = {
  conditions: { element: ConditionSchema, min: 1, max: L.conditions, what: 'conditions' },
  fluids: { element: FluidOverrideSchema, min: 0, max: L.fluids, what: 'fluids' },
  compartments: { element: CompartmentSchema, min: 0, max: L.compartments, what: 'compartments' },
  boundaries: { element: BoundarySchema, min: 0, max: L.boundaries, what: 'boundaries' },
  photos: { element: PhotoRefSchema, min: 0, max: L.photos, what: 'photos' },
} as const;
type CollectionKey = keyof typeof COLLECTIONS;

function arrayOf<K extends CollectionKey>(key: K) {
  const { element, min, max, what } = COLLECTIONS[key];
  const array = z.array(element as (typeof COLLECTIONS)[K]['element']).max(max, capMessage(max, what));
  return min > 0 ? array.min(min) : array;
}

const SurveyObjectSchema = z.object({
  schemaVersion: z.literal(SURVEY_SCHEMA_VERSION, {
    error: `this app reads survey format version ${SURVEY_SCHEMA_VERSION} and older; a newer version needs an updated app`,
  }),
  id: Id,
  vesselId: Id.optional(),
  title: boundedText(TEXT_LIMITS.name).trim().min(1),
  casualtyDescription: boundedText(TEXT_LIMITS.narrative),
  vessel: VesselSchema,
  conditions: arrayOf('conditions'),
  activeConditionId: Id,
  fluids: arrayOf('fluids'),
  compartments: arrayOf('compartments'),
  boundaries: arrayOf('boundaries'),
  photos: arrayOf('photos').optional(),
});
type SurveyObject = z.infer<typeof SurveyObjectSchema>;

/** Cross-references: every id that is pointed at must exist, and ids must be unique. */
function referenceIssues(s: SurveyObject, add: (issue: { path: (string | number)[]; message: string }) => void): void {
  const seen = new Map<string, string>();
  const unique = (id: string, path: (string | number)[]) => {
    const first = seen.get(id);
    if (first !== undefined) add({ path, message: `duplicate id ${id} (first used at ${first})` });
    else seen.set(id, path.join('.'));
  };
  s.conditions.forEach((c, i) => unique(c.id, ['conditions', i, 'id']));
  s.compartments.forEach((c, i) => unique(c.id, ['compartments', i, 'id']));
  s.boundaries.forEach((b, i) => unique(b.id, ['boundaries', i, 'id']));

  const compartmentIds = new Set(s.compartments.map((c) => c.id));
  const boundaryIds = new Set(s.boundaries.map((b) => b.id));
  const fluidIds = new Set(s.fluids.map((f) => f.id));
  s.compartments.forEach((c, i) => {
    const own = c.tankContents?.fluidId;
    if (own !== undefined && !fluidIds.has(own) && !catalogueFluid(own)) add({ path: ['compartments', i, 'tankContents', 'fluidId'], message: `unknown fluid "${own}"` });
  });
  if (!s.conditions.some((c) => c.id === s.activeConditionId)) {
    add({ path: ['activeConditionId'], message: 'no condition has this id' });
  }
  s.conditions.forEach((c, i) => {
    const inCondition = new Set<string>();
    c.contents.forEach((k, j) => {
      if (!compartmentIds.has(k.compartmentId)) {
        add({ path: ['conditions', i, 'contents', j, 'compartmentId'], message: 'no compartment has this id' });
      }
      if (inCondition.has(k.compartmentId)) {
        add({ path: ['conditions', i, 'contents', j, 'compartmentId'], message: 'compartment already has contents in this condition' });
      }
      inCondition.add(k.compartmentId);
      k.layers.forEach((l, m) => {
        if (!fluidIds.has(l.fluidId) && !catalogueFluid(l.fluidId)) {
          add({ path: ['conditions', i, 'contents', j, 'layers', m, 'fluidId'], message: `unknown fluid "${l.fluidId}"` });
        }
      });
    });
  });
  s.boundaries.forEach((b, i) => {
    for (const side of ['sideA', 'sideB'] as const) {
      const sd = b[side];
      if (sd.kind === 'compartment' && !compartmentIds.has(sd.compartmentId)) {
        add({ path: ['boundaries', i, side, 'compartmentId'], message: 'no compartment has this id' });
      }
    }
    if (b.parentBoundaryId !== undefined && (!boundaryIds.has(b.parentBoundaryId) || b.parentBoundaryId === b.id)) {
      add({ path: ['boundaries', i, 'parentBoundaryId'], message: 'no other boundary has this id' });
    }
  });
}

/** Geometry points of one boundary's or compartment's shape, as SURVEY_LIMITS.geometryPoints counts them. */
function geometryPoints(g: Boundary['geometry'] | Compartment['geometry']): number {
  switch (g.kind) {
    case 'polygon':
      return g.vertices.length;
    case 'faceted':
      return g.facets.reduce((n, f) => n + f.vertices.length, 0);
    case 'prism':
      return g.section.length;
    case 'circle':
      return 1;
    default:
      return 4;
  }
}

/** The whole survey's geometry within SURVEY_LIMITS.geometryPoints (each shape is capped by its own schema). */
function sizeIssues(s: SurveyObject, add: (issue: { path: (string | number)[]; message: string }) => void): void {
  let points = 0;
  for (const b of s.boundaries) points += geometryPoints(b.geometry);
  for (const c of s.compartments) points += geometryPoints(c.geometry);
  if (points > L.geometryPoints) {
    add({
      path: ['boundaries'],
      message: `The survey's geometry has ${points.toLocaleString('en-GB')} points; at most ${L.geometryPoints.toLocaleString('en-GB')} allowed.`,
    });
  }
}

export const SurveySchema = SurveyObjectSchema.superRefine((s, ctx) => {
  const add = (issue: { path: (string | number)[]; message: string }) => ctx.addIssue({ code: 'custom', ...issue });
  referenceIssues(s, add);
  sizeIssues(s, add);
});
export type Survey = z.infer<typeof SurveySchema>;

/**
 * SurveySchema for a document that may be of an older format version (a file, a push from a device
 * running older code, a stored copy): upgraded first (./upgrade.ts), then validated.
 */
export const UpgradingSurveySchema = z.preprocess(upgradeSurvey, SurveySchema);

/**
 * Whether SurveySchema accepts `next`, given that it accepts `prev` and that `next` was made from
 * `prev` without changing any object in place (as shared/sync/apply.ts does: it copies what it
 * changes and shares the rest). Only what is not the very same object as in `prev` is checked against
 * its schema — a changed field, a new or edited entity, a collection's length — and then the
 * cross-references over the whole survey. A push to a large survey so checks the one entity it
 * changed instead of every boundary. Exact, not a heuristic: false means SurveySchema refuses `next`.
 */
export function isValidEdit(prev: Survey, next: Survey): boolean {
  const shape = SurveyObjectSchema.shape;
  for (const key of Object.keys(shape) as (keyof typeof shape)[]) {
    const before: unknown = prev[key];
    const after: unknown = next[key];
    if (before === after) continue;
    if (key in COLLECTIONS && Array.isArray(before) && Array.isArray(after)) {
      const { element, min, max } = COLLECTIONS[key as CollectionKey];
      if (after.length < min || after.length > max) return false;
      const unchanged = new Set<unknown>(before);
      for (const entity of after) if (!unchanged.has(entity) && !element.safeParse(entity).success) return false;
      continue;
    }
    if (!shape[key].safeParse(after).success) return false;
  }
  let clean = true;
  const fail = () => {
    clean = false;
  };
  referenceIssues(next as SurveyObject, fail);
  sizeIssues(next as SurveyObject, fail);
  return clean;
}
