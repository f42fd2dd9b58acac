/**
 * Unit-aware forms. Form values hold what the user typed (strings in the user's units); the
 * resolver converts them to SI and validates with the survey format's own zod schema, so a field's
 * error path is the schema's path. Messages are turned into plain words in the user's units.
 */
import { z } from 'zod';
import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldValues, Resolver } from 'react-hook-form';
import { formatNumber, fromSi, toSi, UNITS, type UnitId, type UnitSystem } from '@shared/units/units';
import { unitOf } from '@client/lib/unit-system';
import type { Dimension } from '@shared/units/units';

/**
 * What a number field measures; 'stress' is a pressure shown in MPa / ksi, 'thickness' a length
 * shown in mm / in (plate thickness, corrosion allowance), 'ratio' has no unit.
 */
export type Measure = Dimension | 'stress' | 'thickness' | 'ratio';

export function measureUnit(measure: Measure, system: UnitSystem): UnitId | null {
  if (measure === 'ratio') return null;
  if (measure === 'stress') return system === 'us' ? 'ksi' : 'MPa';
  if (measure === 'thickness') return system === 'us' ? 'in' : 'mm';
  return unitOf(measure, system);
}

export function measureLabel(measure: Measure, system: UnitSystem): string {
  const u = measureUnit(measure, system);
  return u ? UNITS[u].label : '';
}

/** A typed string → SI number; '' → undefined (so the schema says it is required); junk → NaN. */
export function parseField(text: string | undefined, measure: Measure, system: UnitSystem): number | undefined {
  if (text === undefined) return undefined;
  // a typographic minus (U+2212, as phones and pasted figures give it) is a minus
  const t = String(text).trim().replace(',', '.').replace(/\u2212/g, '-');
  if (t === '') return undefined;
  const v = Number(t);
  if (!Number.isFinite(v)) return Number.NaN;
  const u = measureUnit(measure, system);
  return u ? toSi(v, u) : v;
}

/** An SI number → the text shown in a field. */
export function showField(valueSi: number | undefined | null, measure: Measure, system: UnitSystem): string {
  if (valueSi === undefined || valueSi === null || !Number.isFinite(valueSi)) return '';
  const u = measureUnit(measure, system);
  const v = u ? fromSi(valueSi, u) : valueSi;
  return String(Number(v.toPrecision(10)));
}

/** Measures of numeric fields by the last key of their schema path, to word bound errors in the user's units. */
export type MeasureLookup = (path: readonly PropertyKey[]) => Measure | undefined;

function plainError(system: UnitSystem, measureOf: MeasureLookup) {
  return (iss: z.core.$ZodRawIssue): string | undefined => {
    const input = (iss as { input?: unknown }).input;
    const m = measureOf((iss.path ?? []) as PropertyKey[]);
    const bound = (v: number | bigint) => {
      const n = Number(v);
      const u = m ? measureUnit(m, system) : null;
      return u ? `${formatNumber(fromSi(n, u), 4)} ${UNITS[u].label}` : formatNumber(n, 4);
    };
    switch (iss.code) {
      case 'invalid_type':
        if (input === undefined || input === '') return 'Required: enter a value.';
        if (typeof input === 'number' && Number.isNaN(input)) return 'Enter a number, for example 12.5.';
        return 'This value is not valid here.';
      case 'too_small':
        if (iss.origin === 'string') return 'Required: enter some text.';
        if (iss.origin === 'array') return `Needs at least ${String(iss.minimum)} entries.`;
        return iss.inclusive ? `Must be at least ${bound(iss.minimum as number)}.` : `Must be more than ${bound(iss.minimum as number)}.`;
      case 'too_big':
        return iss.inclusive ? `Must be at most ${bound(iss.maximum as number)}.` : `Must be less than ${bound(iss.maximum as number)}.`;
      case 'invalid_format':
        // a time typed in the fields' one style (utils/ship-time-entry.ts)
        if ((iss as { format?: string }).format === 'datetime') return 'Enter the date and time as YYYY-MM-DD HH:MM (24 h), for example 2026-03-14 09:45.';
        return 'This is not in the expected format.';
      default:
        return undefined;
    }
  };
}

/**
 * react-hook-form resolver: form values (display units) → `toModel` (SI) → the shared schema.
 * The resolved values are the schema's output, ready for applyLocalChange.
 */
export function unitResolver<FV extends FieldValues, Out>(
  schema: z.ZodType<Out>,
  toModel: (values: FV) => unknown,
  system: UnitSystem,
  measureOf: MeasureLookup = () => undefined,
): Resolver<FV, unknown, Out> {
  const wrapped = z.preprocess((v) => toModel(v as FV), schema) as unknown as z.ZodType<Out, FV>;
  return zodResolver(wrapped, { error: plainError(system, measureOf) }) as unknown as Resolver<FV, unknown, Out>;
}

/** Lookup by the last string key of the path. */
export const byKey =
  (table: Record<string, Measure>): MeasureLookup =>
  (path) => {
    for (let i = path.length - 1; i >= 0; i--) {
      const k = path[i];
      if (typeof k === 'string' && k in table) return table[k];
    }
    return undefined;
  };
