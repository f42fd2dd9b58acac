import type { DeleteOp, SetOp, UpsertOp } from '@shared/schemas/sync';
import type { Survey } from '@shared/schemas/survey';
import type { BoundarySummary, SurveySummary } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';

/** An edit the workspace makes; every one goes through the device store (works offline). */
export type EditOp = SetOp | UpsertOp | DeleteOp;
/**
 * Makes an edit. A form passes `base`, the same edit built from what the form started with (or last
 * saved): only what changed since is written over the device's copy (`applyLocalChanges`).
 */
export type Apply = (op: EditOp, base?: EditOp) => Promise<void>;

export interface SectionProps {
  survey: Survey;
  /** The lean per-edit results (computeSurveySummary) and its boundary rows; a boundary's detail is computed when opened. */
  results: SurveySummary | null;
  rows: readonly BoundarySummary[];
  apply: Apply;
  system: UnitSystem;
  /** Item to open (from the list, the model or a results row). */
  selectedId: string | null;
  select: (id: string | null) => void;
}
