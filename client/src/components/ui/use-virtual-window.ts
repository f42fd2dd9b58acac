/**
 * Long lists render only the items in view (TanStack Virtual): a ship of thousands of boundaries stays
 * a few hundred elements on a phone. Below `from` items everything is rendered as usual. The caller
 * renders `indices` inside the `scroller` box (which scrolls on its own, its height capped) and keeps
 * the list's full height with `padTop` / `padBottom` (spacer rows in a table, padding on a list), so
 * the scroll bar and keyboard scrolling behave as if every item were there. Items of differing height
 * pass `measure` as their ref (each carrying `data-index`).
 */
import { useCallback, useRef, type RefObject } from 'react';
import { useVirtualizer } from '@tanstack/react-virtual';

export interface VirtualWindow<E extends HTMLElement> {
  scroller: RefObject<HTMLDivElement | null>;
  virtual: boolean;
  indices: number[];
  padTop: number;
  padBottom: number;
  measure: ((el: E | null) => void) | undefined;
  /** Brings item i into view (a no-op when everything is rendered). */
  scrollToIndex: (i: number) => void;
}

export function useVirtualWindow<E extends HTMLElement = HTMLElement>({ count, estimatePx, from = 60, overscan = 8 }: { count: number; estimatePx: number; from?: number; overscan?: number }): VirtualWindow<E> {
  const scroller = useRef<HTMLDivElement>(null);
  const virtual = count > from;
  const v = useVirtualizer<HTMLDivElement, E>({ count: virtual ? count : 0, getScrollElement: () => scroller.current, estimateSize: () => estimatePx, overscan });
  // stable for the list's life, so an effect that scrolls to an item runs only when that item changes
  const scrollToIndex = useCallback((i: number) => (virtual ? v.scrollToIndex(i, { align: 'auto' }) : undefined), [v, virtual]);
  if (!virtual) return { scroller, virtual, indices: Array.from({ length: count }, (_, i) => i), padTop: 0, padBottom: 0, measure: undefined, scrollToIndex };
  const items = v.getVirtualItems();
  const last = items[items.length - 1];
  return {
    scroller,
    virtual,
    indices: items.map((i) => i.index),
    padTop: items.length > 0 ? items[0].start : 0,
    padBottom: last ? v.getTotalSize() - last.end : 0,
    measure: v.measureElement,
    scrollToIndex,
  };
}
