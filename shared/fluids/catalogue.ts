/**
 * Fluid catalogue: typical densities with where each number comes from. A survey may override any
 * entry or add its own (survey.fluids); a layer may also carry its own measured density.
 */

export type FluidCategory = 'water' | 'oil' | 'other';

export interface FluidEntry {
  id: string;
  name: string;
  category: FluidCategory;
  /** Density at the reference temperature, kg/m³. */
  densityKgM3: number;
  source: string;
}

/** Density of pure water at 60 °F, kg/m³ (API MPMS Ch. 11.1 reference value). */
export const WATER_DENSITY_60F_KG_M3 = 999.016;

/**
 * Density of a crude oil from its API gravity, kg/m³:
 * SG(60/60 °F) = 141.5 / (131.5 + °API) (API definition), times the density of water at 60 °F.
 */
export function crudeDensityFromApi(apiGravity: number): number {
  return (141.5 / (131.5 + apiGravity)) * WATER_DENSITY_60F_KG_M3;
}

export const FLUID_CATALOGUE: readonly FluidEntry[] = [
  { id: 'sea-water', name: 'Sea water', category: 'water', densityKgM3: 1025, source: 'Naval architecture practice (typical open-ocean value)' },
  { id: 'fresh-water', name: 'Fresh water', category: 'water', densityKgM3: 1000, source: 'Naval architecture practice' },
  { id: 'dma', name: 'Marine distillate DMA', category: 'oil', densityKgM3: 890, source: 'ISO 8217, Table 1: DMA maximum density at 15 °C' },
  { id: 'dmb', name: 'Marine distillate DMB', category: 'oil', densityKgM3: 900, source: 'ISO 8217, Table 1: DMB maximum density at 15 °C' },
  { id: 'rmg', name: 'Residual fuel RMG', category: 'oil', densityKgM3: 991, source: 'ISO 8217, Table 2: RMG maximum density at 15 °C' },
  { id: 'rmk', name: 'Residual fuel RMK', category: 'oil', densityKgM3: 1010, source: 'ISO 8217, Table 2: RMK maximum density at 15 °C' },
  { id: 'lube-oil', name: 'Lubricating oil', category: 'oil', densityKgM3: 900, source: 'Typical value for mineral lubricating oils' },
  { id: 'diesel', name: 'Diesel / gas oil', category: 'oil', densityKgM3: 840, source: 'Typical value for automotive diesel at 15 °C' },
  { id: 'petrol', name: 'Petrol (gasoline)', category: 'oil', densityKgM3: 740, source: 'Typical value for motor gasoline at 15 °C' },
  { id: 'slops', name: 'Slops (oily water)', category: 'other', densityKgM3: 1000, source: 'Assumed; measure where possible' },
  { id: 'crude-api-30', name: 'Crude oil, 30 °API', category: 'oil', densityKgM3: crudeDensityFromApi(30), source: 'API gravity: 141.5/(131.5+API) × 999.016 kg/m³' },
];

const BY_ID = new Map(FLUID_CATALOGUE.map((f) => [f.id, f]));

/** Catalogue entry by id, or undefined. */
export function catalogueFluid(id: string): FluidEntry | undefined {
  return BY_ID.get(id);
}
