/**
 * The ship's hydrostatic particulars (per condition) and her downflooding points (per vessel), for
 * the ship's response (shared/engine/stability.ts). SI and ship axes like the rest of the survey,
 * except where the trade's own units are the ones printed in every stability booklet: tonnes,
 * TPC in t/cm and MCT 1 cm in t·m/cm. Optional everywhere: a survey without them works as before.
 *
 * The particulars describe the ship with every space modelled in the survey EMPTY: the liquids the
 * survey models (flood water, oil, ballast) are added to them as weights, or, for a space open to
 * the sea, as lost buoyancy. Each figure carries a free-text note of where it was read.
 */
import { z } from 'zod';

/** Where a figure was read ("stability booklet p. 34, hydrostatic table at 6.20 m"). */
const From = z.string().trim().max(300).optional();

const figure = (value: z.ZodNumber) => z.object({ value, from: From });
/** A figure from the ship's stability information, with where it was read. */
export const FigureSchema = figure(z.number());
export type Figure = z.infer<typeof FigureSchema>;

const positive = (what: string) => figure(z.number().positive(`${what} must be more than zero`));
const anyLength = figure(z.number().gt(-1000).lt(1000));

/**
 * Particulars read from the ship's approved stability information: the intact condition
 * (displacement, KG or GM, LCG, optionally TCG and LCB) and the hydrostatics at its draft (TPC or
 * waterplane area, LCF, MCT 1 cm, KM). LCG, LCB and LCF in metres forward of the aft perpendicular.
 */
export const BookletParticularsSchema = z.object({
  kind: z.literal('booklet'),
  /** Displacement of the intact condition, t. */
  displacementT: positive('Displacement'),
  /** Mean draft (moulded, at amidships) at which the hydrostatics below were read, m. */
  meanDraftM: positive('Mean draft'),
  /** Height of the centre of gravity above the baseline, m. Give KG or GM. */
  kgM: figure(z.number().gt(-100).lt(200)).optional(),
  /** Metacentric height (solid), m: KG = KM − GM. Give KG or GM. */
  gmM: figure(z.number().gt(-50).lt(100)).optional(),
  lcgM: anyLength,
  /** Off-centre G of the intact condition, m to port (default 0, upright). */
  tcgM: figure(z.number().gt(-100).lt(100)).optional(),
  /** Longitudinal centre of buoyancy at this draft; without it the intact ship floats on an even keel. */
  lcbM: anyLength.optional(),
  /** Tonnes per centimetre immersion. Give TPC or the waterplane area. */
  tpcT: positive('TPC').optional(),
  waterplaneAreaM2: positive('Waterplane area').optional(),
  lcfM: anyLength,
  /** Moment to change trim one centimetre, t·m/cm. */
  mct1cmTM: positive('MCT 1 cm'),
  /** Height of the transverse metacentre above the baseline, m. */
  kmM: positive('KM'),
});
export type BookletParticulars = z.infer<typeof BookletParticularsSchema>;

/**
 * A box-shaped vessel (a barge, a pontoon): every hydrostatic particular follows exactly from the
 * length, breadth and draft of the box. KG of the intact condition must still be given; LCG
 * defaults to half the length (even keel), TCG to the centreline.
 */
export const BoxParticularsSchema = z.object({
  kind: z.literal('box'),
  lengthM: positive('Length'),
  breadthM: positive('Breadth'),
  /** Draft of the intact box, m. */
  draftM: positive('Draft'),
  /** Depth to the deck edge, m (for the deck-edge warning and freeboard). */
  depthM: positive('Depth').optional(),
  kgM: figure(z.number().gt(-100).lt(200)),
  lcgM: anyLength.optional(),
  tcgM: figure(z.number().gt(-100).lt(100)).optional(),
});
export type BoxParticulars = z.infer<typeof BoxParticularsSchema>;

export const ParticularsSchema = z
  .discriminatedUnion('kind', [BookletParticularsSchema, BoxParticularsSchema])
  .superRefine((p, ctx) => {
    if (p.kind !== 'booklet') return;
    if ((p.kgM === undefined) === (p.gmM === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['kgM'], message: 'give either KG or GM (one of them)' });
    }
    if ((p.tpcT === undefined) === (p.waterplaneAreaM2 === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['tpcT'], message: 'give either TPC or the waterplane area (one of them)' });
    }
  });
export type Particulars = z.infer<typeof ParticularsSchema>;

/** How spaces open to the sea are treated: as lost buoyancy (the usual choice) or as added weight. */
export const OPEN_SPACE_METHODS = ['lost-buoyancy', 'added-weight'] as const;

/**
 * The ship is aground, bearing on the ground at one point of her bottom (ship axes: x m forward of
 * the AP, y m to port, 0 on the keel line). The ground holds her draft there as read; the reaction
 * follows from the displacement she has lost (shared/engine/grounding.ts). The tide is taken as
 * constant.
 */
export const GroundingSchema = z.object({
  position: z.object({
    x: z.number().gt(-1000, 'x must be within 1,000 m').lt(1000, 'x must be within 1,000 m'),
    y: z.number().gt(-100, 'y must be within 100 m').lt(100, 'y must be within 100 m').optional(),
  }),
  /** How the position was found ("diver's survey: set-in plating under No. 1 hold, frames 152–160"). */
  from: From,
});
export type Grounding = z.infer<typeof GroundingSchema>;

/** The stability data of one condition. */
export const ConditionStabilitySchema = z.object({
  particulars: ParticularsSchema,
  openSpaceMethod: z.enum(OPEN_SPACE_METHODS).optional(),
  /** Aground at a point (absent: afloat). */
  aground: GroundingSchema.optional(),
});
export type ConditionStability = z.infer<typeof ConditionStabilitySchema>;

export const DOWNFLOODING_KINDS = ['air-pipe', 'vent', 'door', 'hatch-coaming', 'other'] as const;

/** An opening through which water would get in once it goes under: its lowest point, ship axes. */
export const DownfloodingPointSchema = z.object({
  id: z.uuid(),
  name: z.string().trim().min(1, 'give the opening a name'),
  kind: z.enum(DOWNFLOODING_KINDS),
  position: z.object({ x: z.number(), y: z.number(), z: z.number() }),
});
export type DownfloodingPoint = z.infer<typeof DownfloodingPointSchema>;
