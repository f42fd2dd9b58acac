/**
 * A pumping-plan step whose pump was deleted afterwards: the plan form gives the step a field error
 * (and keeps it), the forecast keeps the step, leaves it out of the run with a warning, and never
 * fails; the brief says it was left out.
 */
import { describe, expect, it } from 'vitest';
import { forecastFlooding } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { planStepErrors } from '@client/features/workspace/utils/plan-steps';
import { nearestLimitWords } from '../../../server/brief/render-brief';
import { baseSurvey, boxCompartment, tid } from '../engine/fixtures';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)

describe('a plan step whose pump was deleted', () => {
  // an empty 10 m × 10 m box filling from the sea (draft 6 m) through a 0.02 m² bottom opening, with a pump planned
  const a = 0.02, A = 100, H = 6, cd = 0.6;
  const pumpId = tid(), stepId = tid();
  const comp = boxCompartment([10, -5, 0], [20, 5, 10], {
    permeability: 1,
    breaches: [{ id: tid(), position: { x: 15, y: 0, z: 0 }, areaM2: a, face: 'bottom' }],
    pumps: [{ id: pumpId, name: 'Portable pump', capacityM3S: 0.05 }],
  });
  const planned = (): Survey => {
    const s = baseSurvey({ aft: H, fwd: H });
    s.compartments.push(structuredClone(comp));
    s.conditions[0].flooding = { plan: [{ id: stepId, pumpId, compartmentId: comp.id, startH: 0.1, stopH: 0.5 }] };
    return s;
  };
  const deleted = (): Survey => {
    const s = planned();
    s.compartments[0].pumps = [];
    return s;
  };

  it('the stored step gets a field error on its pump, and nothing else is wrong with it', () => {
    expect(planStepErrors(planned(), planned().conditions[0].flooding!.plan![0])).toEqual({});
    const s = deleted();
    const e = planStepErrors(s, s.conditions[0].flooding!.plan![0]);
    expect(e.pump).toMatch(/pump of this step was deleted/);
    expect(e.pump).toMatch(/add a pump, or remove the step/);
    expect(e.space).toBeUndefined();
    // with another pump in the survey, the error says to choose it
    s.compartments[0].pumps = [{ id: tid(), name: 'Spare', capacityM3S: 0.01, running: false }];
    expect(planStepErrors(s, s.conditions[0].flooding!.plan![0]).pump).toMatch(/choose another pump, or remove the step/);
  });

  it('the forecast keeps the step, leaves it out of the run and warns; the level follows the unpumped closed form', () => {
    const s = deleted();
    const k = ((cd * a) / A) * Math.sqrt(G / 2);
    const f = forecastFlooding(s, { horizonH: 1, outputSteps: 8, rtol: 1e-11, atol: 1e-9 });
    expect(f.plan).toHaveLength(1);
    expect(f.plan[0].stepId).toBe(stepId);
    expect(f.plan[0].problems).toEqual(['its pump is no longer in the survey (deleted?)']);
    expect(f.plan[0].atStart).toBeNull();
    const w = f.warnings.filter((x) => x.code === 'plan-step');
    expect(w).toHaveLength(1);
    expect(w[0]).toMatchObject({ severity: 'warning', entityId: stepId });
    expect(w[0].message).toBe(`Pumping plan, step 1 (${comp.name}): its pump is no longer in the survey (deleted?). The forecast leaves it out.`);
    // no pump ran: h(t) = H − (√H − (C_d a/A)√(g/2)·t)², from integrating dh/dt = (C_d a/A)√(2g(H − h)) (Torricelli)
    f.times.forEach((t, i) => expect(Math.abs(f.spaces[0].levelM[i] - (H - (Math.sqrt(H) - k * t) ** 2))).toBeLessThan(1e-6 * H));
    // the document is not changed: the step is still there
    expect(s.conditions[0].flooding!.plan).toHaveLength(1);
  });

  it('the brief says the step was left out', () => {
    const words = nearestLimitWords(deleted())!;
    expect(words.assumptions).toContain('Pumping plan, step 1');
    expect(words.assumptions).toContain('The forecast leaves it out.');
    expect(nearestLimitWords(planned())!.assumptions).not.toContain('Pumping plan, step');
  });
});
