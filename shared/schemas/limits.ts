/**
 * Caps on the survey format and the API's text. Without them one member could stall the server (a
 * 90,000-vertex polygon kept the engine busy for 16 s; a 1 MB title was accepted). Each is generous
 * for a real ship: the engine bench's 4,000-boundary vessel uses a small part of every one. Text may
 * not hold U+0000, which PostgreSQL text cannot store. The messages name the limit; zod's issue path
 * names the field.
 */
import { z } from 'zod';

/** Caps, in characters. Generous for the trade: a long vessel name is ~50, a casualty narrative a few pages. */
export const TEXT_LIMITS = {
  /** Names of vessels, compartments, boundaries, pumps, conditions, fluids; survey titles. */
  name: 200,
  /** Photo captions, fluid sources. */
  caption: 1_000,
  /** Notes on a boundary. */
  notes: 10_000,
  /** The casualty's description. */
  narrative: 50_000,
  /** Ids, catalogue keys, content types, storage keys. */
  key: 200,
} as const;


/** A string of at most `max` characters with no NUL character. */
export const boundedText = (max: number) =>
  z
    .string()
    .max(max, `Use at most ${max.toLocaleString('en-GB')} characters.`)
    .refine((text) => !text.includes('\u0000'), 'must not contain the NUL character (U+0000)');

/** Counts, per survey unless said otherwise. */
export const SURVEY_LIMITS = {
  /** Corners of one flat polygon (a plate outline or one facet). */
  polygonVertices: 1_000,
  /** Facets of one curved boundary. */
  facets: 2_000,
  /** Corners of one compartment's section polygon. */
  sectionPoints: 1_000,
  /** Geometry points in the whole survey: polygon and facet corners, section points, 4 per rectangle, 1 per circle. */
  geometryPoints: 100_000,
  boundaries: 10_000,
  compartments: 2_000,
  conditions: 500,
  fluids: 500,
  photos: 5_000,
  /** Layers in one compartment's contents. */
  layers: 20,
  /** Shores on one boundary. */
  shores: 500,
  /** Breaches or pumps of one compartment. */
  breaches: 100,
  pumps: 100,
  /** Steps of one condition's pumping plan. */
  planSteps: 1_000,
  /** Readings in one sounding log. */
  soundingReadings: 10_000,
  /** Assumed/estimated marks on one entity (a boundary with 500 shores marks a few fields of each). */
  marks: 5_000,
} as const;

const plural = (n: number, what: string) => `${n.toLocaleString('en-GB')} ${what}`;

/** The message of a count cap: names the limit and what it counts (zod's path names the field). */
export const capMessage = (max: number, what: string) => `At most ${plural(max, what)} allowed.`;

/** An array of at most `max` elements. */
export const cappedArray = <T extends z.ZodType>(element: T, max: number, what: string) => z.array(element).max(max, capMessage(max, what));
