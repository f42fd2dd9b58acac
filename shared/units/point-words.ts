/**
 * Points and offsets in words, so nobody has to remember which way the ship's axes run
 * (x forward from the aft perpendicular, y to port, z up from the baseline):
 * "62.0 m fwd of AP, 0.86 m to stbd, 2.68 m above base".
 */
import { fromSi, DISPLAY_UNITS, UNITS, type UnitSystem } from './units';

function len(valueM: number, system: UnitSystem, decimals: number): string {
  const unit = DISPLAY_UNITS[system].length;
  return `${Math.abs(fromSi(valueM, unit)).toFixed(decimals)} ${UNITS[unit].label}`;
}

/** A ship-axes point in words, in the unit system's length unit. */
export function pointWords(p: { x: number; y: number; z: number } | null, system: UnitSystem): string {
  return p ? pointParts(p, system).join(', ') : '—';
}

/** The three parts of `pointWords` (along, across, up), for a view that keeps each on one line. */
export function pointParts(p: { x: number; y: number; z: number }, system: UnitSystem): [string, string, string] {
  const x = p.x >= 0 ? `${len(p.x, system, 1)} fwd of AP` : `${len(p.x, system, 1)} aft of AP`;
  const y = Math.abs(p.y) < 0.005 ? 'on the centreline' : `${len(p.y, system, 2)} to ${p.y > 0 ? 'port' : 'stbd'}`;
  const z = p.z >= 0 ? `${len(p.z, system, 2)} above base` : `${len(p.z, system, 2)} below base`;
  return [x, y, z];
}

/** Trim in words: positive trim (by the stern, the ship's convention) and negative (by the head). */
export function trimWords(trimM: number, system: UnitSystem): string {
  if (Math.abs(trimM) < 0.005) return 'even keel';
  return `${len(trimM, system, 2)} by the ${trimM > 0 ? 'stern' : 'head'}`;
}

/** The plate edge a distance across the stiffeners starts from, named by the ship direction it faces. */
export function edgeWords(across: { x: number; y: number; z: number }): string {
  // offsets grow along `across`, so they start at the edge facing the other way
  const ax = Math.abs(across.x), ay = Math.abs(across.y), az = Math.abs(across.z);
  if (az >= ax && az >= ay) return across.z > 0 ? 'lower edge' : 'upper edge';
  if (ay >= ax) return across.y > 0 ? 'starboard edge' : 'port edge';
  return across.x > 0 ? 'after edge' : 'forward edge';
}

/**
 * A horizontal direction in ship axes in words ("forward", "to port", "aft and to stbd"), naming a
 * component only when it is at least a quarter of the other (about 14° off the axis).
 */
export function horizontalWords(d: { x: number; y: number } | null): string {
  if (!d || (d.x === 0 && d.y === 0)) return '';
  const ax = Math.abs(d.x), ay = Math.abs(d.y);
  const fore = d.x > 0 ? 'forward' : 'aft';
  const side = d.y > 0 ? 'to port' : 'to stbd';
  if (ay < 0.25 * ax) return fore;
  if (ax < 0.25 * ay) return side;
  return `${fore} and ${side}`;
}
