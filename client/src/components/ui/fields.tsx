/**
 * Form fields sized for a gloved thumb: a label, the unit beside every number, the error in plain words
 * tied to its input (aria-describedby). The input kit of the workspace and the review desk alike; plain
 * forms without react-hook-form use `TextField` (./form-field.tsx).
 */
import type { ReactNode } from 'react';
import type { FieldError, FieldValues, Path, UseFormRegister } from 'react-hook-form';
import { useCallback, useEffect, useId, useRef, useState } from 'react';
import { buttonClass } from './button';

/** The look of every text input, select and textarea in a form. */
export const inputCls =
  'min-h-touch w-full min-w-0 rounded-md border-2 border-line bg-card px-2 text-base text-ink aria-[invalid=true]:border-danger';
/** Class names of the kit's buttons (./button.tsx), for a `<button>` or a link that looks like one. */
export const primaryBtn = buttonClass('primary');
export const secondaryBtn = buttonClass('secondary');
export const dangerBtn = buttonClass('danger-outline');

/** The ids an input names in aria-describedby: its hint and its error, when shown. */
export const describedBy = (id: string, hint: unknown, error: unknown): string | undefined =>
  [hint && !error ? `${id}-hint` : '', error ? `${id}-error` : ''].filter(Boolean).join(' ') || undefined;

/** Finds an error by dotted path in RHF's nested error object. */
export function errorAt(errors: unknown, path: string): FieldError | undefined {
  let cur: unknown = errors;
  for (const k of path.split('.')) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[k];
  }
  return cur && typeof cur === 'object' && 'message' in cur ? (cur as FieldError) : undefined;
}

export function Field({
  label,
  unit,
  error,
  hint,
  children,
  id,
  extra,
  wide = false,
}: {
  label: string;
  unit?: string;
  error?: string;
  hint?: ReactNode;
  children: ReactNode;
  id: string;
  /** Shown under the field whatever its state (the figure's "assumed" / "estimated" mark). */
  extra?: ReactNode;
  /**
   * Takes a whole row of a grid on a phone: a select cannot wrap its option, so half a 390 px row
   * would cut "No. 3 double-bottom fuel tank (P)" short.
   */
  wide?: boolean;
}) {
  return (
    <div className={`min-w-0 ${wide ? 'max-sm:col-span-full' : ''}`}>
      <label htmlFor={id} className="block text-sm font-bold">
        {label}
        {unit ? <span className="font-normal text-ink-soft"> ({unit})</span> : null}
      </label>
      <div className="mt-0.5 flex items-center gap-1">{children}</div>
      {hint && !error && (
        <p className="mt-0.5 text-xs text-ink-soft" id={`${id}-hint`}>
          {hint}
        </p>
      )}
      {error && (
        <p className="mt-0.5 text-sm font-bold text-danger" id={`${id}-error`} role="alert">
          <span aria-hidden="true">▲ </span>
          {error}
        </p>
      )}
      {extra}
    </div>
  );
}

export function NumberInput<T extends FieldValues>({
  register,
  name,
  label,
  unit,
  errors,
  hint,
  placeholder,
  allowFrames = false,
  extra,
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  unit: string;
  errors: unknown;
  hint?: ReactNode;
  placeholder?: string;
  /** Accepts "Fr 45" as well as a number (x positions). */
  allowFrames?: boolean;
  extra?: ReactNode;
}) {
  const id = useId();
  const err = errorAt(errors, name)?.message;
  return (
    <Field label={label} unit={unit} error={err} hint={hint} id={id} extra={extra}>
      <input
        id={id}
        className={inputCls}
        inputMode={allowFrames ? 'text' : 'decimal'}
        autoComplete="off"
        placeholder={placeholder}
        aria-invalid={err ? true : undefined}
        aria-describedby={describedBy(id, hint, err)}
        {...register(name)}
      />
      <span className="min-w-8 text-sm text-ink-soft" aria-hidden="true">
        {unit}
      </span>
    </Field>
  );
}

export function TextInput<T extends FieldValues>({
  register,
  name,
  label,
  errors,
  hint,
  placeholder,
  multiline = false,
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  errors: unknown;
  hint?: ReactNode;
  placeholder?: string;
  multiline?: boolean;
}) {
  const id = useId();
  const err = errorAt(errors, name)?.message;
  return (
    <Field label={label} error={err} hint={hint} id={id}>
      {multiline ? (
        <textarea
          id={id}
          className={`${inputCls} py-2`}
          rows={3}
          placeholder={placeholder}
          aria-invalid={err ? true : undefined}
          aria-describedby={describedBy(id, hint, err)}
          {...register(name)}
        />
      ) : (
        <input id={id} className={inputCls} placeholder={placeholder} aria-invalid={err ? true : undefined} aria-describedby={describedBy(id, hint, err)} {...register(name)} />
      )}
    </Field>
  );
}

export function SelectInput<T extends FieldValues>({
  register,
  name,
  label,
  errors,
  options,
  hint,
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  errors: unknown;
  options: readonly { value: string; label: string }[];
  hint?: ReactNode;
}) {
  const id = useId();
  const err = errorAt(errors, name)?.message;
  const { ref, onChange, ...field } = register(name);
  const { box, cut, check } = useCutChoice();
  const labels = options.map((o) => o.label).join('\n');
  // a renamed or added option may change what the chosen one says
  useEffect(check, [check, labels]);
  return (
    <Field label={label} error={err} hint={hint} id={id} wide extra={cut ? <p className="mt-0.5 text-sm break-words" id={`${id}-chosen`} data-testid="select-chosen">Chosen: {cut}</p> : undefined}>
      <select
        id={id}
        className={inputCls}
        aria-invalid={err ? true : undefined}
        aria-describedby={describedBy(id, hint, err)}
        data-chosen-shown={cut ? `${id}-chosen` : undefined}
        {...field}
        ref={(el) => {
          ref(el);
          box.current = el;
        }}
        onChange={(e) => {
          void onChange(e);
          check();
        }}
      >
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Field>
  );
}

let measureCtx: CanvasRenderingContext2D | null | undefined;

/**
 * A closed select shows its chosen option on one line and cuts a long one short ("HFO bunkers
 * (from the delivery n…" on a phone), and no style makes it wrap. So when the chosen text is wider
 * than the box (measured in the select's own font, less its padding and the drop-down arrow), the
 * full name is written under it. Rechecked on change and when the box is resized.
 */
function useCutChoice() {
  const box = useRef<HTMLSelectElement | null>(null);
  const [cut, setCut] = useState('');
  const check = useCallback(() => {
    const s = box.current;
    if (!s) return;
    const text = s.selectedOptions[0]?.text ?? '';
    if (measureCtx === undefined) measureCtx = typeof document === 'undefined' ? null : document.createElement('canvas').getContext('2d');
    const cs = getComputedStyle(s);
    const width = s.getBoundingClientRect().width;
    if (!measureCtx || width === 0) return setCut('');
    measureCtx.font = `${cs.fontWeight} ${cs.fontSize} ${cs.fontFamily}`;
    const room = width - parseFloat(cs.paddingLeft) - parseFloat(cs.paddingRight) - parseFloat(cs.borderLeftWidth) - parseFloat(cs.borderRightWidth) - 24;
    setCut(measureCtx.measureText(text).width > room ? text : '');
  }, []);
  useEffect(() => {
    check();
    const s = box.current;
    if (!s || typeof ResizeObserver === 'undefined') return;
    const ro = new ResizeObserver(check);
    ro.observe(s);
    return () => ro.disconnect();
  }, [check]);
  return { box, cut, check };
}

export function FormError({ errors }: { errors: Record<string, unknown> }) {
  const n = Object.keys(errors).length;
  if (n === 0) return null;
  return (
    <p className="rounded-md border-2 border-danger bg-danger-soft p-2 text-sm font-bold text-ink" role="status">
      <span aria-hidden="true">▲ </span>Not saved yet: correct the marked {n === 1 ? 'field' : 'fields'}. What you typed is kept.
    </p>
  );
}
