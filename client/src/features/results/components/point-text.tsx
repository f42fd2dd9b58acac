/**
 * A ship-axes point in words ("62.0 m fwd of AP, 0.86 m to stbd, 2.68 m above base") that wraps only
 * between its parts, never inside one: a narrow column must not split "0.86" from "m to stbd".
 */
import type { UnitSystem } from '@shared/units/units';
import { pointParts } from '@shared/units/point-words';

export function PointText({ point, system }: { point: { x: number; y: number; z: number } | null; system: UnitSystem }) {
  if (!point) return <>—</>;
  const parts = pointParts(point, system);
  return (
    <>
      {parts.map((part, i) => (
        <span key={i} className="whitespace-nowrap">
          {part}
          {i < parts.length - 1 ? ', ' : ''}
        </span>
      ))}
    </>
  );
}
