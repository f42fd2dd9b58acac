/**
 * The flooding-over-time parts of the survey format (issue 16): the size and face of a breach,
 * openings between spaces, pump suctions, which pumps ran at each sounding, whether a space is
 * air-tight, and the condition's forecast settings and pumping plan. Every field is optional, so
 * any document written before them still parses. SI throughout (m, m², m³/s, s).
 */
import { z } from 'zod';
import { boundedText, cappedArray, SURVEY_LIMITS, TEXT_LIMITS } from './limits';

const Point3 = z.object({ x: z.number(), y: z.number(), z: z.number() });

/** The face of a compartment an opening is in: a side, an end, the bottom or the top. */
export const OPENING_FACES = ['bottom', 'top', 'port', 'starboard', 'fore', 'aft'] as const;
export const OpeningFaceSchema = z.enum(OPENING_FACES);
export type OpeningFace = z.infer<typeof OpeningFaceSchema>;

/**
 * How big an opening is: round (diameter) or rectangular (width × height). The height is what
 * lets an opening that straddles a liquid surface be integrated over its height; an opening in the
 * bottom or top is taken as level (no height).
 */
export const OpeningSizeSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('round'), diameterM: z.number().positive() }),
  z.object({ kind: z.literal('rectangular'), widthM: z.number().positive(), heightM: z.number().positive() }),
]);
export type OpeningSize = z.infer<typeof OpeningSizeSchema>;

/** An opening from this compartment into another one: a holed bulkhead, a door left open. */
export const InternalOpeningSchema = z.object({
  id: z.uuid(),
  toCompartmentId: z.uuid(),
  /** Centre of the opening, ship axes. */
  position: Point3,
  areaM2: z.number().positive(),
  face: OpeningFaceSchema.optional(),
  size: OpeningSizeSchema.optional(),
  /** Discharge coefficient (default 0.6, sharp-edged orifice). */
  dischargeCoefficient: z.number().gt(0).max(1).optional(),
  name: boundedText(TEXT_LIMITS.name).optional(),
});
export type InternalOpening = z.infer<typeof InternalOpeningSchema>;

/** One step of a pumping plan: a pump on a space from a start time until a stop time or a level. */
export const PlanStepSchema = z.object({
  id: z.uuid(),
  pumpId: z.uuid(),
  compartmentId: z.uuid(),
  /** Hours after the condition's time. */
  startH: z.number().nonnegative(),
  /** Hours after the condition's time; absent: runs to the end of the forecast (or until the level). */
  stopH: z.number().nonnegative().optional(),
  /** Stop when the level falls to this height above the space's lowest point, m. */
  untilLevelM: z.number().nonnegative().optional(),
});
export type PlanStep = z.infer<typeof PlanStepSchema>;

/** The forecast settings and pumping plan of a condition. */
export const FloodingSettingsSchema = z.object({
  /** How far ahead the forecast runs, hours (default 24). */
  horizonH: z.number().positive().max(240).optional(),
  /** Measured and orifice inflow disagree when one is more than this many times the other (default 2). */
  disagreementFactor: z.number().gt(1).max(100).optional(),
  plan: cappedArray(PlanStepSchema, SURVEY_LIMITS.planSteps, 'steps in one pumping plan').optional(),
});
export type FloodingSettings = z.infer<typeof FloodingSettingsSchema>;

/** Pump ids listed on a sounding: the pumps that ran since the reading before. */
export const PumpsRunningSchema = cappedArray(z.uuid(), SURVEY_LIMITS.pumps, 'pumps running');

/** How much of its own liquid a tank held before the casualty. */
export const TANK_STATES = ['empty', 'part-full', 'full'] as const;
export const TankStateSchema = z.enum(TANK_STATES);
export type TankState = z.infer<typeof TankStateSchema>;

/**
 * A tank's own liquid (its fuel, ballast or fresh water, from the sounding book, the loading
 * condition or the tank tables), so the engine can tell it from flood water: flood water can take
 * only the room the tank's own liquid leaves (SOLAS II-1/7-3's "0 or 0.95" for spaces intended for
 * liquids: 0 for a full tank, 0.95 for an empty one). The liquid is required unless the tank was
 * empty, the volume when part full (m³, as the tank tables give it: permeability applied).
 */
export const TankContentsSchema = z
  .object({
    state: TankStateSchema,
    fluidId: boundedText(TEXT_LIMITS.key).min(1).optional(),
    volumeM3: z.number().nonnegative().optional(),
  })
  .superRefine((t, ctx) => {
    if (t.state !== 'empty' && t.fluidId === undefined) ctx.addIssue({ code: 'custom', path: ['fluidId'], message: 'Say which liquid the tank held' });
    if (t.state === 'part-full' && t.volumeM3 === undefined) ctx.addIssue({ code: 'custom', path: ['volumeM3'], message: 'Give the volume of its own liquid (from the tank tables)' });
  });
export type TankContents = z.infer<typeof TankContentsSchema>;
