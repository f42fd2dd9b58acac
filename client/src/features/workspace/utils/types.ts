import type { DeleteOp, SetOp, UpsertOp } from '@shared/schemas/sync';
import type { Survey } from '@shared/schemas/survey';
import type { SurveyResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';

/** An edit the workspace makes; every one goes through the device store (works offline). */
export type EditOp = SetOp | UpsertOp | DeleteOp;
export type Apply = (op: EditOp) => Promise<void>;

export interface SectionProps {
  survey: Survey;
  results: SurveyResults | null;
  apply: Apply;
  system: UnitSystem;
  /** Item to open (from the list, the model or a results row). */
  selectedId: string | null;
  select: (id: string | null) => void;
}
