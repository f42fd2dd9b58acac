/** The liquids a survey can name: the catalogue's, then the survey's own. */
import { FLUID_CATALOGUE, catalogueFluid } from '@shared/fluids/catalogue';
import type { Survey } from '@shared/schemas/survey';

export function fluidOptions(fluids: Survey['fluids']): { value: string; label: string }[] {
  const own = fluids.filter((f) => !catalogueFluid(f.id)).map((f) => ({ value: f.id, label: `${f.name} (survey)` }));
  return [...FLUID_CATALOGUE.map((f) => ({ value: f.id, label: f.name })), ...own];
}
