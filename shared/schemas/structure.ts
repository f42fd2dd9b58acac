/**
 * Structural design inputs added to the survey format in schema version 1 as OPTIONAL fields, so
 * every earlier document still parses: the design method of a shore (a named column design check
 * instead of a bare Euler load), the plating between stiffeners, and ratings with a direction.
 * SI throughout (m, Pa, N).
 */
import { z } from 'zod';

/**
 * How a shore is checked as a column.
 * - `aisc-360-e3`: steel, flexural buckling per ANSI/AISC 360-16 §E3, allowable strength (ASD,
 *   Ωc = 1.67): the loads here are unfactored hydrostatic loads, so ASD is the consistent basis.
 *   E is the shore's `elasticModulusPa`.
 * - `nds-3.7.1`: sawn timber, column stability factor Cp per ANSI/AWC NDS-2018 §3.7.1.
 *   `adjustedCompressionPa` is Fc* (the reference compression design value parallel to grain times
 *   every adjustment factor except Cp); `adjustedEMinPa` is E'min; `c` is 0.8 for sawn lumber
 *   (0.85 round timber poles, 0.9 structural glued laminated timber).
 * - `generic`: any other section: design capacity = min(Euler load, area × failure stress) divided
 *   by the user's design factor.
 */
export const ShoreDesignSchema = z.discriminatedUnion('method', [
  z.object({ method: z.literal('aisc-360-e3'), yieldStressPa: z.number().positive() }),
  z.object({
    method: z.literal('nds-3.7.1'),
    adjustedCompressionPa: z.number().positive(),
    adjustedEMinPa: z.number().positive(),
    c: z.number().gt(0).max(1).optional(),
  }),
  z.object({ method: z.literal('generic'), failureStressPa: z.number().positive(), designFactor: z.number().min(1).max(10) }),
]);
export type ShoreDesign = z.infer<typeof ShoreDesignSchema>;

/**
 * The plating between stiffeners (or the whole plate when it has none). Bending of each panel is
 * checked with rectangular-plate coefficients (Roark's Formulas for Stress and Strain, Table 11.4).
 * `edges`: how the panel is held at the stiffeners and the plate's edges ('fixed' for plating that
 * runs continuously over its stiffeners, 'simply-supported' otherwise).
 */
export const PlatingSchema = z.object({
  thicknessM: z.number().positive().max(0.2),
  /** Wastage and corrosion allowance taken off the thickness before the check, m. */
  corrosionAllowanceM: z.number().nonnegative().max(0.1).optional(),
  yieldStressPa: z.number().positive(),
  /** Allowable bending stress, Pa. */
  allowableStressPa: z.number().positive(),
  edges: z.enum(['simply-supported', 'fixed']),
});
export type Plating = z.infer<typeof PlatingSchema>;

/**
 * A rating with a direction: what the boundary may carry when the net pressure pushes it towards
 * side B (from A) and towards side A (from B). A hatch cover held down by cleats, for example, is
 * rated differently upwards and downwards. Either may be omitted (no rating that way).
 */
export const DirectionalRatingSchema = z
  .object({
    kind: z.enum(['pressure', 'force']),
    /** Pa or N, when the net pressure pushes the boundary towards side B. */
    towardsB: z.number().positive().optional(),
    /** Pa or N, when the net pressure pushes the boundary towards side A. */
    towardsA: z.number().positive().optional(),
  })
  .refine((r) => r.towardsA !== undefined || r.towardsB !== undefined, { message: 'give a rating towards side A, side B or both' });
export type DirectionalRating = z.infer<typeof DirectionalRatingSchema>;
