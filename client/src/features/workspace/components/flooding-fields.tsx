/**
 * The small form kit of the Flooding section and its parts (openings, pumps, the sounding log, the
 * plan, the "what if"): a text input and a select with their field errors, a number read in the
 * user's units with the reason it is refused, and a space's vertical extent.
 */
import { useMemo, type ReactNode } from 'react';
import { LongSelect } from '@client/components/ui/long-select';
import type { Compartment } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { describedBy, Field, inputCls } from '@client/components/ui/fields';
import { parseField } from '../utils/form-units';

export type Errors = Record<string, string>;

export function Input({ id, label, unit, value, onChange, error, type = 'text', inputMode = 'decimal' }: { id: string; label: string; unit?: string; value: string; onChange: (v: string) => void; error?: string; type?: string; inputMode?: 'decimal' | 'text' }) {
  return (
    <Field id={id} label={label} unit={unit} error={error}>
      <input id={id} type={type} inputMode={type === 'text' ? inputMode : undefined} className={inputCls} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={!!error} aria-describedby={describedBy(id, undefined, error)} />
    </Field>
  );
}

export function Select({ id, label, value, onChange, children, error }: { id: string; label: string; value: string; onChange: (v: string) => void; children: ReactNode; error?: string }) {
  return (
    <Field id={id} label={label} error={error} wide>
      <select id={id} className={inputCls} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={!!error} aria-describedby={describedBy(id, undefined, error)}>
        {children}
      </select>
    </Field>
  );
}

/** A number typed in the user's units, in SI; errors say what is wrong in words. */
export function need(errors: Errors, key: string, text: string, measure: Parameters<typeof parseField>[1], system: UnitSystem, opts: { positive?: boolean; optional?: boolean; min?: number } = {}): number | undefined {
  if (text.trim() === '') {
    if (!opts.optional) errors[key] = 'Enter a number.';
    return undefined;
  }
  const v = parseField(text, measure, system);
  if (v === undefined || !Number.isFinite(v)) errors[key] = 'Not a number.';
  else if (opts.positive && v <= 0) errors[key] = 'Must be more than 0.';
  else if (opts.min !== undefined && v < opts.min) errors[key] = 'Must not be negative.';
  return v;
}

export function heightOf(c: Compartment): { bottom: number; top: number; centre: { x: number; y: number } } {
  const g = c.geometry;
  if (g.kind === 'box') return { bottom: g.min.z, top: g.max.z, centre: { x: (g.min.x + g.max.x) / 2, y: (g.min.y + g.max.y) / 2 } };
  const zs = g.section.map((p) => p.z), ys = g.section.map((p) => p.y);
  return { bottom: Math.min(...zs), top: Math.max(...zs), centre: { x: (g.xAftM + g.xForeM) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2 } };
}


/**
 * A `datetime-local` value read as ship's time (the ship's clock, `offsetMin` minutes ahead of UTC;
 * UTC when the offset is not set), as an ISO instant; null when it is not a time.
 */
export function shipLocalToIso(local: string, offsetMin: number | undefined): string | null {
  if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2})?$/.test(local.trim())) return null;
  const utc = Date.parse(`${local.trim()}Z`);
  if (Number.isNaN(utc)) return null;
  return new Date(utc - (offsetMin ?? 0) * 60_000).toISOString();
}

/** An ISO instant as the `datetime-local` value of the ship's clock. */
export function isoToShipLocal(iso: string, offsetMin: number | undefined): string {
  const d = new Date(Date.parse(iso) + (offsetMin ?? 0) * 60_000);
  return d.toISOString().slice(0, 16);
}

/**
 * A choice of one of the survey's spaces ("—" first, for none yet, unless `placeholder` is null). A big
 * ship's 200 spaces are put in as options only while the select is in use (`LongSelect`).
 */
export function SpaceSelect({ id, label = 'Space', compartments, value, onChange, error, placeholder = '—' }: { id: string; label?: string; compartments: readonly Compartment[]; value: string; onChange: (v: string) => void; error?: string; placeholder?: string | null }) {
  const options = useMemo(() => compartments.map((c) => ({ value: c.id, label: c.name })), [compartments]);
  return (
    <Field id={id} label={label} error={error} wide>
      <LongSelect id={id} className={inputCls} options={options} value={value} onChange={onChange} placeholder={placeholder ?? undefined} aria-invalid={!!error} aria-describedby={describedBy(id, undefined, error)} />
    </Field>
  );
}
