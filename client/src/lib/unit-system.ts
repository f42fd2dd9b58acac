/**
 * The user's unit system (SI or US customary). The signed-in profile may set it through
 * `setProfileUnitSystem`; until then, and on a device with no session, a preference kept in
 * localStorage applies. Values in the model stay SI; these helpers only convert for display and entry.
 */
import { useSyncExternalStore } from 'react';
import { DISPLAY_UNITS, UNITS, formatNumber, fromSi, toSi, type Dimension, type UnitId, type UnitSystem } from '@shared/units/units';

const KEY = 'brineline.unitSystem';
const listeners = new Set<() => void>();
let profileSystem: UnitSystem | null = null;

function read(): UnitSystem {
  if (profileSystem) return profileSystem;
  try {
    return localStorage.getItem(KEY) === 'us' ? 'us' : 'si';
  } catch {
    return 'si';
  }
}

function notify() {
  for (const l of listeners) l();
}

/** Chooses the unit system on this device (and for this session). */
export function setUnitSystem(system: UnitSystem): void {
  try {
    localStorage.setItem(KEY, system);
  } catch {
    /* private mode: keep it for this page only */
  }
  profileSystem = system;
  notify();
}

/** Called by the session code when the signed-in profile carries a unit system. */
export function setProfileUnitSystem(system: UnitSystem | null): void {
  profileSystem = system;
  notify();
}

export function useUnitSystem(): UnitSystem {
  return useSyncExternalStore(
    (l) => {
      listeners.add(l);
      return () => listeners.delete(l);
    },
    read,
    () => 'si',
  );
}

export function unitOf(dimension: Dimension, system: UnitSystem): UnitId {
  return DISPLAY_UNITS[system][dimension];
}

export function unitLabel(dimension: Dimension, system: UnitSystem): string {
  return UNITS[unitOf(dimension, system)].label;
}

/** SI value → display number in the user's unit. */
export function display(valueSi: number, dimension: Dimension, system: UnitSystem): number {
  return fromSi(valueSi, unitOf(dimension, system));
}

/** Display number in the user's unit → SI value. */
export function fromDisplay(value: number, dimension: Dimension, system: UnitSystem): number {
  return toSi(value, unitOf(dimension, system));
}

/** "123.4 kN" in the user's units; "—" for a missing value. */
export function fmt(valueSi: number | null | undefined, dimension: Dimension, system: UnitSystem, digits = 4): string {
  if (valueSi === null || valueSi === undefined || !Number.isFinite(valueSi)) return '—';
  return `${formatNumber(display(valueSi, dimension, system), digits)} ${unitLabel(dimension, system)}`;
}

/** Number only, for table cells whose header names the unit. */
export function num(valueSi: number | null | undefined, dimension: Dimension, system: UnitSystem, digits = 4): string {
  if (valueSi === null || valueSi === undefined || !Number.isFinite(valueSi)) return '—';
  return formatNumber(display(valueSi, dimension, system), digits);
}

export const percent = (fraction: number | null | undefined, digits = 0): string =>
  fraction === null || fraction === undefined || !Number.isFinite(fraction) ? '—' : `${(fraction * 100).toFixed(digits)} %`;
