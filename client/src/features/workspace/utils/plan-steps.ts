/**
 * A stored pumping-plan step checked against the survey as it is now. A pump or space can be
 * deleted after a step names it; the step is then kept (nothing typed is lost) and its field says
 * what to do, while the forecast leaves it out and says so.
 */
import type { PlanStep } from '@shared/schemas/flooding';
import type { Survey } from '@shared/schemas/survey';

export type PlanStepErrors = Partial<Record<'pump' | 'space' | 'stop', string>>;

export function planStepErrors(survey: Survey, step: PlanStep): PlanStepErrors {
  const e: PlanStepErrors = {};
  const pumps = survey.compartments.flatMap((c) => c.pumps ?? []);
  if (!pumps.some((p) => p.id === step.pumpId))
    e.pump = pumps.length === 0
      ? 'The pump of this step was deleted, and the survey has no pump now: add a pump, or remove the step. The forecast leaves the step out.'
      : 'The pump of this step was deleted: choose another pump, or remove the step. The forecast leaves the step out.';
  if (!survey.compartments.some((c) => c.id === step.compartmentId)) e.space = 'The space of this step was deleted: choose another space, or remove the step. The forecast leaves the step out.';
  if (step.stopH !== undefined && step.stopH <= step.startH) e.stop = 'Stops before it starts. The forecast leaves the step out.';
  return e;
}
