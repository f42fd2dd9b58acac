/**
 * Figures that are assumed (a default nobody has confirmed) or estimated (judged, not measured), in
 * plain words. A default permeability or density is assumed while its field is empty; a section
 * modulus or a shore size the app filled in is assumed while its mark says so (shared/schemas/marks.ts).
 * The workspace, the send-for-review screen, the desk, the report and the brief all list these.
 */
import { catalogueFluid } from '../fluids/catalogue';
import { defaultPermeability } from '../schemas/space-types';
import type { Marks } from '../schemas/marks';
import type { Boundary, Condition, Survey } from '../schemas/survey';

export interface FigureNote {
  /** Entity the figure belongs to (condition, compartment, layer or boundary). */
  entityId: string;
  /** Field path inside the entity, as in its marks. */
  field: string;
  mark: 'assumed' | 'estimated';
  /** What the figure is, in words: "Permeability of No. 2 hold". */
  what: string;
  /** The value taken, in words with its unit, where the app knows it (SI). */
  value: string | null;
}

const DEFAULT_SEA = 1025;
const num = (v: number, digits: number) => String(Number(v.toFixed(digits)));

function conditionFieldWords(field: string): string {
  const words: Record<string, string> = {
    'drafts.aftM': 'Draft aft',
    'drafts.forwardM': 'Draft forward',
    'drafts.midPortM': 'Midship draft, port',
    'drafts.midStarboardM': 'Midship draft, starboard',
    heelDeg: 'Heel',
    seaDensityKgM3: 'Sea water density',
  };
  return words[field] ?? field;
}

function boundaryFieldWords(b: Boundary, field: string): string {
  if (field === 'stiffening.sectionModulusM3') return `Stiffener section modulus on ${b.name}`;
  if (field === 'stiffening.allowableStressPa') return `Stiffener allowable stress on ${b.name}`;
  if (field === 'ratedCapacity') return `Rated capacity of ${b.name}`;
  const shore = /^shores\.([^.]+)\.section$/.exec(field);
  if (shore) {
    const i = (b.shores ?? []).findIndex((s) => s.id === shore[1]);
    return `Size and timber values of shore ${i + 1} on ${b.name}`;
  }
  return `${field} of ${b.name}`;
}

function marked(marks: Marks | undefined, each: (field: string, mark: 'assumed' | 'estimated') => void): void {
  for (const [field, mark] of Object.entries(marks ?? {})) each(field, mark);
}

function conditionNotes(survey: Survey, condition: Condition, out: FigureNote[]): void {
  if (condition.seaDensityKgM3 === undefined) {
    out.push({ entityId: condition.id, field: 'seaDensityKgM3', mark: 'assumed', what: 'Sea water density', value: `${DEFAULT_SEA} kg/m³ (typical open sea)` });
  }
  marked(condition.marks, (field, mark) => out.push({ entityId: condition.id, field, mark, what: conditionFieldWords(field), value: null }));
  const names = new Map(survey.compartments.map((c) => [c.id, c.name]));
  for (const k of condition.contents) {
    const where = names.get(k.compartmentId) ?? 'a space';
    for (const l of k.layers) {
      const overridden = survey.fluids.find((f) => f.id === l.fluidId);
      const fluid = catalogueFluid(l.fluidId);
      const fluidName = overridden?.name ?? fluid?.name ?? l.fluidId;
      if (l.densityKgM3 === undefined && !overridden && l.fluidId !== 'sea-water' && fluid) {
        out.push({ entityId: l.id, field: 'densityKgM3', mark: 'assumed', what: `Density of ${fluidName.toLowerCase()} in ${where}`, value: `${num(fluid.densityKgM3, 1)} kg/m³ (${fluid.source})` });
      }
      marked(l.marks, (field, mark) =>
        out.push({ entityId: l.id, field, mark, what: field === 'level' ? `Level of ${fluidName.toLowerCase()} in ${where}` : `Density of ${fluidName.toLowerCase()} in ${where}`, value: null }),
      );
    }
  }
}

/** Every assumed and estimated figure of the survey's condition (the active one unless given), assumed first. */
export function figureNotes(survey: Survey, conditionId = survey.activeConditionId): FigureNote[] {
  const out: FigureNote[] = [];
  const condition = survey.conditions.find((c) => c.id === conditionId);
  if (condition) conditionNotes(survey, condition, out);
  for (const c of survey.compartments) {
    if (c.permeability === undefined) {
      // a cargo space's default follows how loaded it is (space-types.ts)
      out.push({ entityId: c.id, field: 'permeability', mark: 'assumed', what: `Permeability of ${c.name}`, value: `${defaultPermeability(c.spaceType, c.cargoState).value.toFixed(2)} (usual for a ${c.spaceType.replace('-', ' ')} space${c.cargoState ? `, ${c.cargoState}` : ''})` });
    }
    if (c.spaceType === 'tank' && !c.tankContents && (c.openToSea || (c.breaches ?? []).length > 0)) {
      out.push({ entityId: c.id, field: 'tankContents', mark: 'assumed', what: `Own liquid of ${c.name}`, value: 'not stated, taken as empty (flood water may fill it)' });
    }
    marked(c.marks, (field, mark) => out.push({ entityId: c.id, field, mark, what: field === 'permeability' ? `Permeability of ${c.name}` : `${field} of ${c.name}`, value: null }));
  }
  for (const b of survey.boundaries) marked(b.marks, (field, mark) => out.push({ entityId: b.id, field, mark, what: boundaryFieldWords(b, field), value: null }));
  return [...out.filter((n) => n.mark === 'assumed'), ...out.filter((n) => n.mark === 'estimated')];
}

/** The one line each note is shown as. */
export function figureNoteSentence(n: FigureNote): string {
  return `${n.what}${n.value ? `: ${n.value}` : ''}, ${n.mark}`;
}
