/**
 * The mark beside a figure: "assumed" (a default nobody has confirmed) with a Confirm button, or
 * "estimated" (judged, not measured), which the surveyor can set on any figure and take off again.
 */
import type { FigureMark } from '@shared/schemas/marks';

const chip = 'rounded px-1.5 py-0.5 text-xs font-bold uppercase tracking-wide';
// hull, not sea: the chip also sits on the pale blue of a layer's card, where sea blue falls below 4.5:1
// a full 44 px tap target: tapped on deck, often in gloves
const link = 'inline-flex min-h-touch items-center px-2 text-sm font-bold text-hull underline';

export function MarkChip({
  mark,
  onChange,
  onConfirm,
  assumedValue,
  canEstimate = true,
}: {
  mark: FigureMark | undefined;
  onChange: (mark: FigureMark | undefined) => void;
  /** Confirming an assumed default may need to write it into the field (an empty field is the default). */
  onConfirm?: () => void;
  /** What the assumed default is, in words. */
  assumedValue?: string;
  /** False while the field is empty: there is nothing to call estimated. */
  canEstimate?: boolean;
}) {
  if (mark === 'assumed') {
    return (
      <p className="mt-0.5 flex flex-wrap items-center gap-1" data-mark="assumed">
        <span className={`${chip} bg-caution-soft text-ink`}>assumed</span>
        {assumedValue && <span className="text-xs text-ink-soft">{assumedValue}</span>}
        <button type="button" className={link} onClick={() => (onConfirm ? onConfirm() : onChange(undefined))}>
          Confirm
        </button>
      </p>
    );
  }
  if (mark === 'estimated') {
    return (
      <p className="mt-0.5 flex flex-wrap items-center gap-1" data-mark="estimated">
        <span className={`${chip} bg-sea-soft text-ink`}>estimated</span>
        <button type="button" className={link} onClick={() => onChange(undefined)}>
          Measured, not estimated
        </button>
      </p>
    );
  }
  if (!canEstimate) return null;
  return (
    <p className="mt-0.5">
      <button type="button" className={link} onClick={() => onChange('estimated')}>
        Mark estimated
      </button>
    </p>
  );
}
