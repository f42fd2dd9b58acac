import type { UnitSystem } from '@shared/units/units';
import { parseField } from './form-units';
import { frameToX, parseFrameText, type FrameTable } from './frames';

/** An x position typed as a number in the user's unit or as a frame number ("Fr 45"). */
export function parseX(text: string, system: UnitSystem, frames: FrameTable): number | undefined {
  const f = parseFrameText(text ?? '');
  return f === null ? parseField(text, 'length', system) : frameToX(f, frames);
}
