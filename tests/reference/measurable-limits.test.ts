import { describe, expect, it } from 'vitest';
import { measurableLimit } from '@shared/review/measurable-limits';
import { baseSurvey, boxCompartment, polygonBoundary, tid } from '../unit/engine/fixtures';

function tankWithPipe(level: { kind: 'sounding' } | { kind: 'ullage' }) {
  const s = baseSurvey({ aft: 3, fwd: 3 });
  const tank = { ...boxCompartment([0, -5, 2], [10, 5, 12]), name: 'No. 4 tank' };
  s.compartments.push(tank);
  s.conditions[0].contents.push({
    compartmentId: tank.id,
    layers: [
      {
        id: tid(),
        fluidId: 'fresh-water',
        level: level.kind === 'sounding' ? { kind: 'sounding', pipe: { x: 5, y: 2, bottomZM: 2.5 }, soundingM: 4 } : { kind: 'ullage', reference: { x: 5, y: 2, z: 13 }, ullageM: 4 },
      },
    ],
  });
  const wall = polygonBoundary(
    [
      [10, -5, 2],
      [10, 5, 2],
      [10, 5, 12],
      [10, -5, 12],
    ],
    { kind: 'compartment', compartmentId: tank.id },
    { kind: 'air' },
  );
  s.boundaries.push(wall);
  return { s, tank, wall };
}

describe('limits said as readings the crew can take', () => {
  it('a level above the baseline becomes a sounding at the pipe: sounding = level − pipe bottom (definition of a sounding)', () => {
    const { s, tank } = tankWithPipe({ kind: 'sounding' });
    expect(measurableLimit({ kind: 'keep_level_below', compartmentId: tank.id, levelM: 7.3 }, s, 'si')).toBe(
      'On deck: keep the sounding in No. 4 tank (pipe at 5.0 m fwd of AP, 2.00 m to port) below 4.80 m.',
    );
  });

  it('in US units the pipe position and the sounding are in feet, the pipe said by ship direction', () => {
    const { s, tank } = tankWithPipe({ kind: 'sounding' });
    // NIST SP 811 (Appendix B): 1 ft = 0.3048 m exactly; 5 m = 16.404 ft, 2 m = 6.562 ft, 4.80 m = 15.748 ft
    const text = measurableLimit({ kind: 'keep_level_below', compartmentId: tank.id, levelM: 7.3 }, s, 'us')!;
    expect(text).toContain('pipe at 16.4 ft fwd of AP, 6.56 ft to port');
    expect(text).toMatch(/below 15\.7\d? ft\.$/);
    expect(text).not.toMatch(/\bx \d|\by \d| m\b/);
  });

  it('at an ullage point the words turn over: keeping the level above means keeping the ullage below', () => {
    const { s, tank } = tankWithPipe({ kind: 'ullage' });
    expect(measurableLimit({ kind: 'keep_level_above', compartmentId: tank.id, levelM: 7.3 }, s, 'si')).toBe(
      'On deck: keep the ullage in No. 4 tank (from the point at 5.0 m fwd of AP, 2.00 m to port) below 5.70 m.',
    );
  });

  it('a net pressure limit becomes the level whose head reaches it at the plate’s lowest point', () => {
    // one technical atmosphere, 98.0665 kPa, is by definition the pressure of 10 m of water at
    // 1000 kg/m³ under standard gravity; fresh water in the catalogue is 1000 kg/m³
    const { s, wall } = tankWithPipe({ kind: 'sounding' });
    // lowest point z 2 + 10 m head = level 12 m; the pipe's bottom is at 2.5 m: sounding 9.5 m
    expect(measurableLimit({ kind: 'max_net_pressure', boundaryId: wall.id, pressurePa: 98066.5 }, s, 'si')).toBe(
      'On deck: keep the sounding in No. 4 tank (pipe at 5.0 m fwd of AP, 2.00 m to port) below 9.50 m.',
    );
  });

  it('says nothing when there is no pipe or liquid presses on both sides', () => {
    const { s, wall, tank } = tankWithPipe({ kind: 'sounding' });
    s.conditions[0].contents = [];
    expect(measurableLimit({ kind: 'keep_level_above', compartmentId: tank.id, levelM: 5 }, s, 'si')).toBeNull();
    expect(measurableLimit({ kind: 'max_net_pressure', boundaryId: wall.id, pressurePa: 5e4 }, s, 'si')).toBeNull();
  });
});
