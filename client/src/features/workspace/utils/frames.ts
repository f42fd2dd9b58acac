/**
 * Frame numbers. Surveyors read positions off the frame numbers painted in the ship; a frame table
 * (frame 0 at the aft perpendicular, then runs of frames at a given spacing) turns "Fr 45" into x in
 * metres. The table is kept on this device per survey; positions are stored in the survey as x (m).
 */
import { useSyncExternalStore } from 'react';

export interface FrameRun {
  /** First frame of the run. */
  fromFrame: number;
  spacingM: number;
}

export interface FrameTable {
  /** Frame number at the aft perpendicular (x = 0). */
  zeroFrame: number;
  runs: FrameRun[];
}

export const DEFAULT_FRAME_TABLE: FrameTable = { zeroFrame: 0, runs: [{ fromFrame: 0, spacingM: 0.8 }] };

/** x (m from the aft perpendicular) of a frame number; fractional frames interpolate. */
export function frameToX(frame: number, table: FrameTable): number {
  const runs = [...table.runs].sort((a, b) => a.fromFrame - b.fromFrame);
  if (runs.length === 0) return Number.NaN;
  const pos = (f: number): number => {
    let x = 0;
    for (let i = 0; i < runs.length; i++) {
      const start = runs[i].fromFrame;
      const end = i + 1 < runs.length ? runs[i + 1].fromFrame : Infinity;
      if (i === 0 && f < start) return (f - start) * runs[0].spacingM;
      if (f <= start) break;
      x += (Math.min(end, f) - start) * runs[i].spacingM;
    }
    return x;
  };
  return pos(frame) - pos(table.zeroFrame);
}

/** "Fr 45", "fr45", "F 45.5", "#45" → 45; anything else → null. */
export function parseFrameText(text: string): number | null {
  const m = /^\s*(?:fr\.?|f|#)\s*(-?\d+(?:[.,]\d+)?)\s*$/i.exec(text);
  return m ? Number(m[1].replace(',', '.')) : null;
}

const key = (surveyId: string) => `brineline.frames.${surveyId}`;
const listeners = new Set<() => void>();
const cache = new Map<string, FrameTable>();

export function readFrameTable(surveyId: string): FrameTable {
  const hit = cache.get(surveyId);
  if (hit) return hit;
  let table = DEFAULT_FRAME_TABLE;
  try {
    const raw = localStorage.getItem(key(surveyId));
    if (raw) table = JSON.parse(raw) as FrameTable;
  } catch {
    /* unreadable: default */
  }
  cache.set(surveyId, table);
  return table;
}

export function saveFrameTable(surveyId: string, table: FrameTable): void {
  cache.set(surveyId, table);
  try {
    localStorage.setItem(key(surveyId), JSON.stringify(table));
  } catch {
    /* storage full or private: kept for this page */
  }
  for (const l of listeners) l();
}

export function useFrameTable(surveyId: string): FrameTable {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    () => readFrameTable(surveyId),
  );
}
