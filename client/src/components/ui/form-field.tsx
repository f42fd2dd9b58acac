/** A labelled input with its hint and its error in plain words, sized for a gloved thumb. */
import { useId, type InputHTMLAttributes, type ReactNode, type Ref } from 'react';

export interface TextFieldProps extends InputHTMLAttributes<HTMLInputElement> {
  label: string;
  error?: string;
  hint?: string;
  ref?: Ref<HTMLInputElement>;
}

export function TextField({ label, error, hint, id, className, ref, ...input }: TextFieldProps) {
  const auto = useId();
  const inputId = id ?? auto;
  const hintId = `${inputId}-hint`;
  const errorId = `${inputId}-error`;
  return (
    <div className={className}>
      <label htmlFor={inputId} className="block font-bold">
        {label}
      </label>
      {hint && (
        <p id={hintId} className="text-sm text-ink-soft">
          {hint}
        </p>
      )}
      <input
        id={inputId}
        ref={ref}
        aria-invalid={error ? true : undefined}
        aria-describedby={[hint ? hintId : '', error ? errorId : ''].filter(Boolean).join(' ') || undefined}
        className={`mt-1 block min-h-touch w-full rounded-lg border-2 bg-card px-3 text-lg ${error ? 'border-danger' : 'border-line'}`}
        {...input}
      />
      {error && (
        <p id={errorId} className="mt-1 text-sm font-bold text-danger" role="alert">
          {error}
        </p>
      )}
    </div>
  );
}

/** A message across the top of a form: what went wrong, in words. */
export function FormAlert({ tone = 'danger', children }: { tone?: 'danger' | 'ok' | 'info'; children: ReactNode }) {
  const tones = {
    danger: 'border-danger bg-danger-soft',
    ok: 'border-ok bg-ok-soft',
    info: 'border-sea bg-sea-soft',
  };
  return (
    <div role={tone === 'danger' ? 'alert' : 'status'} className={`rounded-lg border-2 p-3 ${tones[tone]}`}>
      {children}
    </div>
  );
}
