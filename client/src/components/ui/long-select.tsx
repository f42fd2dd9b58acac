/**
 * A native select over a long list (a space or a boundary of a big ship): beyond `LONG_LIST` choices
 * its options are put in only while it is in use (from the first touch, click or focus until it loses
 * focus), so a screen with a 2,000-boundary picker holds one option element, not 2,000. The phone's
 * own picker, the keyboard and screen readers behave as with any select: focus comes before any of
 * them can open it, and React puts the options in before the event's default action runs. The
 * option chosen is always there, so the closed select shows it.
 */
import { useState, type AriaAttributes } from 'react';
import { LONG_LIST } from './virtual-list';

export interface Choice {
  value: string;
  label: string;
}

export function LongSelect({
  id,
  className,
  options,
  value,
  onChange,
  placeholder,
  from = LONG_LIST,
  ...aria
}: {
  id: string;
  className: string;
  options: readonly Choice[];
  value: string;
  onChange: (value: string) => void;
  /** A first option with the value "" (none chosen yet), shown as this text. */
  placeholder?: string;
  from?: number;
} & Pick<AriaAttributes, 'aria-invalid' | 'aria-describedby'>) {
  const [inUse, setInUse] = useState(false);
  const all = options.length <= from || inUse;
  const shown = all ? options : options.filter((o) => o.value === value);
  const use = () => {
    if (!inUse) setInUse(true);
  };
  return (
    <select
      id={id}
      className={className}
      value={value}
      onChange={(e) => onChange(e.target.value)}
      onFocus={use}
      onPointerDown={use}
      onMouseDown={use}
      onTouchStart={use}
      onKeyDown={use}
      onBlur={() => setInUse(false)}
      data-options={options.length}
      {...aria}
    >
      {placeholder !== undefined && <option value="">{placeholder}</option>}
      {shown.map((o) => (
        <option key={o.value} value={o.value}>
          {o.label}
        </option>
      ))}
    </select>
  );
}
