/**
 * A tank's own liquid and its flood water in words, the same on the device, at the desk, in the
 * report, the brief and the command-line table: "own Marine distillate DMA 95.0 m³ · flood water
 * 203 m³ of the 285 m³ room its own liquid leaves (0.71 of the tank)".
 */
import type { TankResult } from '../engine';
import { formatQuantity, type UnitSystem } from '../units/units';

export function tankWords(t: TankResult, system: UnitSystem): string {
  const v = (m3: number) => formatQuantity(m3, 'volume', system, 3).text;
  const room = `${v(t.floodRoomM3)} room${t.state === 'empty' || t.state === 'not-stated' ? '' : ' its own liquid leaves'} (${t.floodPermeability.toFixed(2)} of the tank)`;
  const flood = `flood water ${v(t.floodVolumeM3)} of the ${room}`;
  if (t.state === 'not-stated') return `own liquid not stated, taken as empty · ${flood}`;
  if (t.state === 'empty') return `empty of its own liquid · ${flood}`;
  const own = `own ${t.ownFluidName ?? 'liquid'} ${v(t.ownVolumeM3)}${t.state === 'full' ? ' (full)' : ''}`;
  const missing = t.ownMissingM3 > 0 ? ` · ${v(t.ownMissingM3)} of it not found` : '';
  return `${own}${missing} · ${flood}`;
}
