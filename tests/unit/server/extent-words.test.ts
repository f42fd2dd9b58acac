/** The report's compartment extents say from where each coordinate runs and which side, in both unit systems. */
import { describe, expect, it } from 'vitest';
import { extentWords } from '../../../server/report/render-report';
import { formatQuantity, type Dimension } from '@shared/units/units';

const q = (system: 'si' | 'us') => (v: number, d: Dimension) => formatQuantity(v, d, system).text;
const box = { id: 'a', name: 'Fore peak tank', spaceType: 'tank' as const, geometry: { kind: 'box' as const, min: { x: 108, y: -6, z: 0 }, max: { x: 118, y: 6, z: 11 } } };

describe('extentWords', () => {
  it('a box: along from the aft perpendicular, across to port and starboard, up from the base', () => {
    expect(extentWords(box, q('si'))).toBe('box from 108.0 m to 118.0 m fwd of AP, from 6.000 m to stbd to 6.000 m to port, 0 m to 11.00 m above base');
    // 1 ft = 0.3048 m exactly (international foot, 1959): 6 m = 19.69 ft, 118 m = 387.1 ft
    expect(extentWords(box, q('us'))).toBe('box from 354.3 ft to 387.1 ft fwd of AP, from 19.69 ft to stbd to 19.69 ft to port, 0 ft to 36.09 ft above base');
  });
  it('a space abaft the aft perpendicular and one from the centreline', () => {
    const aft = { ...box, geometry: { kind: 'box' as const, min: { x: -4, y: 0, z: 2 }, max: { x: 2, y: 5, z: 8 } } };
    expect(extentWords(aft, q('si'))).toBe('box from 4.000 m aft of AP to 2.000 m fwd of AP, from the centreline to 5.000 m to port, 2.000 m to 8.000 m above base');
  });
});
