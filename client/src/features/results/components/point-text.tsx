/**
 * A ship-axes point in words ("62.0 m fwd of AP, 0.86 m to stbd, 2.68 m above base") that wraps only
 * between its parts, never inside one: a narrow column must not split "0.86" from "m to stbd".
 */
import { Fragment } from 'react';
import type { UnitSystem } from '@shared/units/units';
import { pointParts } from '@shared/units/point-words';

export function PointText({ point, system }: { point: { x: number; y: number; z: number } | null; system: UnitSystem }) {
  if (!point) return <>—</>;
  const parts = pointParts(point, system);
  return (
    <span data-wrap-parts="">
      {parts.map((part, i) => (
        // the comma and space stay outside the unbreakable part: that space is where a line may break
        <Fragment key={i}>
          <span className="whitespace-nowrap">{part}</span>
          {i < parts.length - 1 ? ', ' : ''}
        </Fragment>
      ))}
    </span>
  );
}
