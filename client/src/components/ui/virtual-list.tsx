/**
 * A list that renders only the items in view once it is long (`useVirtualWindow`): below `from` items
 * it is a plain list laid out by `className`; above, a column in its own scrolling box, as tall as
 * 60 % of the screen. The item `active` (say, the one selected elsewhere) is scrolled into view.
 * Virtual items are spaced by their own padding (margins would not be measured).
 */
import { useEffect, type ReactNode } from 'react';
import { useVirtualWindow } from './use-virtual-window';

/** Lists longer than this render only what is in view. */
export const LONG_LIST = 60;

export function VirtualList<T>({
  items,
  itemKey,
  render,
  label,
  className,
  itemClassName,
  estimatePx = 52,
  from = LONG_LIST,
  active = -1,
  testId,
}: {
  items: readonly T[];
  itemKey: (item: T) => string;
  render: (item: T) => ReactNode;
  /** The list's accessible name. */
  label: string;
  className?: string;
  itemClassName?: string;
  estimatePx?: number;
  from?: number;
  active?: number;
  testId?: string;
}) {
  const w = useVirtualWindow<HTMLLIElement>({ count: items.length, estimatePx, from });
  const { scrollToIndex, virtual } = w;
  useEffect(() => {
    if (virtual && active >= 0) scrollToIndex(active);
  }, [virtual, active, scrollToIndex]);
  const list = (
    <ul className={virtual ? undefined : className} aria-label={label} data-testid={testId} style={virtual ? { paddingTop: w.padTop, paddingBottom: w.padBottom } : undefined}>
      {w.indices.map((i) => (
        <li key={itemKey(items[i])} ref={w.measure} data-index={i} className={virtual ? `py-0.5 ${itemClassName ?? ''}` : itemClassName}>
          {render(items[i])}
        </li>
      ))}
    </ul>
  );
  if (!virtual) return list;
  return (
    <div ref={w.scroller} className="max-h-[60vh] overflow-y-auto rounded-md border border-line p-1" tabIndex={0} role="region" aria-label={`${label}: ${items.length}, scroll for more`}>
      {list}
    </div>
  );
}
