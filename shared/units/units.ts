/**
 * Units. The stored model and the engine are SI (m, m², m³, kg, N, Pa, s); these helpers convert
 * for display. Every factor is an exact definition from NIST Special Publication 811 (2008),
 * Appendix B (1 ft = 0.3048 m, 1 in = 0.0254 m, 1 lb = 0.45359237 kg, standard gravity
 * 9.80665 m/s², 1 US gallon = 231 in³, 1 petroleum barrel = 42 US gallons).
 */

/** Standard acceleration of gravity, m/s² (3rd CGPM, 1901). */
export const STANDARD_GRAVITY_M_S2 = 9.80665;

export const FOOT_M = 0.3048;
export const INCH_M = 0.0254;
export const POUND_KG = 0.45359237;
export const POUND_FORCE_N = POUND_KG * STANDARD_GRAVITY_M_S2;
export const KIP_N = 1000 * POUND_FORCE_N;
export const PSI_PA = POUND_FORCE_N / (INCH_M * INCH_M);
export const LONG_TON_KG = 2240 * POUND_KG;
export const SHORT_TON_KG = 2000 * POUND_KG;
/** Long ton-force (2240 lbf), used for forces when the user prefers tons. */
export const LONG_TON_FORCE_N = 2240 * POUND_FORCE_N;
export const CUBIC_FOOT_M3 = FOOT_M * FOOT_M * FOOT_M;
export const US_GALLON_M3 = 231 * INCH_M * INCH_M * INCH_M;
export const BARREL_M3 = 42 * US_GALLON_M3;

/** Every unit the app displays, with its size in the SI unit of its dimension. */
export const UNITS = {
  m: { dimension: 'length', toSi: 1, label: 'm' },
  mm: { dimension: 'length', toSi: 0.001, label: 'mm' },
  ft: { dimension: 'length', toSi: FOOT_M, label: 'ft' },
  in: { dimension: 'length', toSi: INCH_M, label: 'in' },
  m2: { dimension: 'area', toSi: 1, label: 'm²' },
  cm2: { dimension: 'area', toSi: 1e-4, label: 'cm²' },
  ft2: { dimension: 'area', toSi: FOOT_M * FOOT_M, label: 'ft²' },
  in2: { dimension: 'area', toSi: INCH_M * INCH_M, label: 'in²' },
  m3: { dimension: 'volume', toSi: 1, label: 'm³' },
  ft3: { dimension: 'volume', toSi: CUBIC_FOOT_M3, label: 'ft³' },
  usgal: { dimension: 'volume', toSi: US_GALLON_M3, label: 'US gal' },
  bbl: { dimension: 'volume', toSi: BARREL_M3, label: 'bbl' },
  kg: { dimension: 'mass', toSi: 1, label: 'kg' },
  t: { dimension: 'mass', toSi: 1000, label: 't' },
  lb: { dimension: 'mass', toSi: POUND_KG, label: 'lb' },
  LT: { dimension: 'mass', toSi: LONG_TON_KG, label: 'LT' },
  ST: { dimension: 'mass', toSi: SHORT_TON_KG, label: 'ST' },
  N: { dimension: 'force', toSi: 1, label: 'N' },
  kN: { dimension: 'force', toSi: 1000, label: 'kN' },
  lbf: { dimension: 'force', toSi: POUND_FORCE_N, label: 'lbf' },
  kip: { dimension: 'force', toSi: KIP_N, label: 'kip' },
  LTf: { dimension: 'force', toSi: LONG_TON_FORCE_N, label: 'LTf' },
  Pa: { dimension: 'pressure', toSi: 1, label: 'Pa' },
  kPa: { dimension: 'pressure', toSi: 1000, label: 'kPa' },
  MPa: { dimension: 'pressure', toSi: 1e6, label: 'MPa' },
  psi: { dimension: 'pressure', toSi: PSI_PA, label: 'psi' },
  ksi: { dimension: 'pressure', toSi: 1000 * PSI_PA, label: 'ksi' },
  kgm3: { dimension: 'density', toSi: 1, label: 'kg/m³' },
  lbft3: { dimension: 'density', toSi: POUND_KG / CUBIC_FOOT_M3, label: 'lb/ft³' },
  m3s: { dimension: 'flow', toSi: 1, label: 'm³/s' },
  m3h: { dimension: 'flow', toSi: 1 / 3600, label: 'm³/h' },
  usgpm: { dimension: 'flow', toSi: US_GALLON_M3 / 60, label: 'US gal/min' },
  bblh: { dimension: 'flow', toSi: BARREL_M3 / 3600, label: 'bbl/h' },
  Nm: { dimension: 'moment', toSi: 1, label: 'N·m' },
  kNm: { dimension: 'moment', toSi: 1000, label: 'kN·m' },
  kipft: { dimension: 'moment', toSi: KIP_N * FOOT_M, label: 'kip·ft' },
  m3mod: { dimension: 'sectionModulus', toSi: 1, label: 'm³' },
  cm3: { dimension: 'sectionModulus', toSi: 1e-6, label: 'cm³' },
  in3: { dimension: 'sectionModulus', toSi: INCH_M ** 3, label: 'in³' },
  s: { dimension: 'time', toSi: 1, label: 's' },
  h: { dimension: 'time', toSi: 3600, label: 'h' },
  deg: { dimension: 'angle', toSi: Math.PI / 180, label: '°' },
  // Immersion (mass per draft, kg/m): tonnes per centimetre, long tons per inch.
  tpc: { dimension: 'immersion', toSi: 1000 / 0.01, label: 't/cm' },
  tpi: { dimension: 'immersion', toSi: LONG_TON_KG / INCH_M, label: 'LT/in' },
  // Moment to change trim (kg·m per m of trim): t·m per cm, foot-long-tons per inch.
  mct1cm: { dimension: 'trimMoment', toSi: (1000 * 1) / 0.01, label: 't·m/cm' },
  mt1in: { dimension: 'trimMoment', toSi: (LONG_TON_KG * FOOT_M) / INCH_M, label: 'ft·LT/in' },
  rad: { dimension: 'angle', toSi: 1, label: 'rad' },
} as const;

export type UnitId = keyof typeof UNITS;
export type Dimension = (typeof UNITS)[UnitId]['dimension'];
export type UnitSystem = 'si' | 'us';

/** Converts a value in SI base units to `unit`. */
export function fromSi(valueSi: number, unit: UnitId): number {
  return valueSi / UNITS[unit].toSi;
}

/** Converts a value in `unit` to SI base units. */
export function toSi(value: number, unit: UnitId): number {
  return value * UNITS[unit].toSi;
}

/** Display unit for each dimension in each system: SI (m, kPa, kN, t) or US customary (ft, psi, kip, LT). */
export const DISPLAY_UNITS: Record<UnitSystem, Record<Dimension, UnitId>> = {
  si: {
    length: 'm', area: 'm2', volume: 'm3', mass: 't', force: 'kN', pressure: 'kPa', density: 'kgm3',
    flow: 'm3h', moment: 'kNm', sectionModulus: 'cm3', time: 'h', angle: 'deg', immersion: 'tpc', trimMoment: 'mct1cm',
  },
  us: {
    length: 'ft', area: 'ft2', volume: 'ft3', mass: 'LT', force: 'kip', pressure: 'psi', density: 'lbft3',
    flow: 'usgpm', moment: 'kipft', sectionModulus: 'in3', time: 'h', angle: 'deg', immersion: 'tpi', trimMoment: 'mt1in',
  },
};

export interface FormattedQuantity {
  value: number;
  unit: UnitId;
  label: string;
  text: string;
}

/**
 * Formats an SI value of the given dimension in the user's unit system, with `digits`
 * significant figures (default 4).
 */
export function formatQuantity(valueSi: number, dimension: Dimension, system: UnitSystem, digits = 4): FormattedQuantity {
  const unit = DISPLAY_UNITS[system][dimension];
  const value = fromSi(valueSi, unit);
  const label = UNITS[unit].label;
  const text = `${formatNumber(value, digits)} ${label}`;
  return { value, unit, label, text };
}

/** Significant-figure formatting without exponent notation for everyday magnitudes. */
export function formatNumber(value: number, digits = 4): string {
  if (!Number.isFinite(value)) return String(value);
  // Below 1e-9 of any unit we show is round-off of a zero (a centroid on the centreline comes out
  // as 1.5e-16), never a figure: say 0, not "1.53e-16".
  if (Math.abs(value) < 1e-9) return '0';
  const magnitude = Math.floor(Math.log10(Math.abs(value)));
  if (magnitude >= 9 || magnitude < -4) return value.toExponential(digits - 1);
  const decimals = Math.max(0, digits - 1 - magnitude);
  return value.toFixed(decimals);
}

/**
 * The area of a hole (a breach, an opening between spaces, a shore's section) as a surveyor measures
 * it: sides to the centimetre (the inch), so a small hole in whole cm² (in²) and a larger one in m²
 * (ft²) to two decimals ("40 cm²", "0.35 m²"; "6 in²", "3.77 ft²"), never "0.004000 m²".
 */
export function formatOpeningArea(areaM2: number, system: UnitSystem): string {
  const [small, large] = system === 'us' ? (['in2', 'ft2'] as const) : (['cm2', 'm2'] as const);
  // below 0.1 m² (1 ft²) the large unit would say it in one or two significant figures
  const inLarge = fromSi(areaM2, large);
  if (inLarge >= (system === 'us' ? 1 : 0.1)) return `${inLarge.toFixed(2)} ${UNITS[large].label}`;
  const inSmall = fromSi(areaM2, small);
  // a pin-hole smaller than 10 cm² (10 in²) keeps one decimal, so it never reads as 0
  return `${inSmall >= 10 ? Math.round(inSmall) : formatNumber(inSmall, 2)} ${UNITS[small].label}`;
}

/**
 * A volume balance (in − out − stored, the round-off left by a run) as a plain figure: to the
 * litre in m³ (0.01 ft³ in US customary), and "< 0.001 m³" when it rounds to nothing, never with
 * an exponent ("1.2e-13 m³" reads as a figure nobody can judge).
 */
export function formatVolumeBalance(m3: number, system: UnitSystem): string {
  const unit = DISPLAY_UNITS[system].volume;
  const step = system === 'us' ? 0.01 : 0.001;
  const v = fromSi(m3, unit);
  const label = UNITS[unit].label;
  if (!Number.isFinite(v)) return `${v} ${label}`;
  if (Math.abs(v) < step / 2) return `< ${step} ${label}`;
  const decimals = system === 'us' ? 2 : 3;
  return `${v.toLocaleString('en-GB', { minimumFractionDigits: decimals, maximumFractionDigits: decimals })} ${label}`;
}

/** A stress in the unit the plate and shore forms take it in: MPa, or ksi in US customary ("160 MPa"). */
export function formatStress(valuePa: number, system: UnitSystem, digits = 4, withUnit = true): string {
  const n = formatNumber(system === 'us' ? valuePa / (1000 * PSI_PA) : valuePa / 1e6, digits);
  return withUnit ? `${n} ${STRESS_UNIT[system]}` : n;
}

/** The label of the stress unit of each system. */
export const STRESS_UNIT: Record<UnitSystem, string> = { si: 'MPa', us: 'ksi' };
