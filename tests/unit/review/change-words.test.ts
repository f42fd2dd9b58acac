import { describe, expect, it } from 'vitest';
import type { FieldChange, RevisionEntry } from '@shared/api/review';
import { changeLineText, changeWords, groupSittings, netChanges, type ChangeContext } from '@shared/review/change-words';
import { formatUtcSpan } from '@shared/review/time-words';
import { formatNumber, formatStress } from '@shared/units/units';

const HOLD = '11111111-1111-4111-8111-111111111111';
const BHD = '22222222-2222-4222-8222-222222222222';
const COND = '33333333-3333-4333-8333-333333333333';
const LAYER = '44444444-4444-4444-8444-444444444444';
const SHORE = '55555555-5555-4555-8555-555555555555';

const ctx: ChangeContext = {
  system: 'si',
  names: new Map([
    [HOLD, 'No. 2 hold'],
    [BHD, 'Aft bulkhead of No. 2 hold'],
    [COND, 'Arrival'],
  ]),
  shipTimeOffsetMin: 180,
};

const pipe = { x: 40, y: 2, bottomZM: 1.2 };
const contents = (soundingM: number | undefined) => [{ compartmentId: HOLD, layers: [{ id: LAYER, fluidId: 'sea-water', level: { kind: 'sounding', pipe, soundingM } }] }];
const words = (c: FieldChange, c2 = ctx) => changeWords(c, c2).map(changeLineText);

/** Any raw field name, id, JSON or floating-point noise in a line fails the check. */
function noRawText(lines: string[]) {
  for (const l of lines) {
    expect(l).not.toMatch(/[{}[\]]|[a-z][A-Z]|\d{6,}|e[-+]\d|[0-9a-f]{8}-/);
  }
}

describe('history in plain words', () => {
  it('says a sounding change as the surveyor would say it', () => {
    const lines = words({ entity: 'condition', entityId: COND, field: 'contents', old: contents(5.4), new: contents(6.4) });
    expect(lines).toEqual(['Sounding in No. 2 hold: 5.40 m → 6.40 m']);
  });

  it('says a reading first taken, in feet for a US reader (1 ft = 0.3048 m exactly, the international foot)', () => {
    const lines = words({ entity: 'condition', entityId: COND, field: 'contents', old: contents(undefined), new: contents(0.3048 * 10) }, { ...ctx, system: 'us' });
    expect(lines).toEqual(['Sounding in No. 2 hold: not set → 10.00 ft']);
  });

  it('says drafts, heel and the ship in words with units, never field names', () => {
    const lines = [
      ...words({ entity: 'condition', entityId: COND, field: 'drafts', old: { forwardM: 5 }, new: { forwardM: 5.2, aftM: 6.1 } }),
      ...words({ entity: 'condition', entityId: COND, field: 'heelDeg', old: null, new: 2.5 }),
      ...words({ entity: 'vessel', entityId: null, field: 'vessel', old: { name: 'X', breadthM: 18, draughtMarks: { forwardXM: 1, aftXM: 0 } }, new: { name: 'X', breadthM: 18.4, draughtMarks: { forwardXM: 2, aftXM: 0 } } }),
    ];
    expect(lines).toEqual([
      'Forward draft in the condition “Arrival”: 5.00 m → 5.20 m',
      'Aft draft in the condition “Arrival”: not set → 6.10 m',
      'Heel in the condition “Arrival”: not set → 2.5°',
      'Breadth of the ship: 18.00 m → 18.40 m',
      'Draught marks of the ship: changed',
    ]);
    noRawText(lines);
  });

  it('names sides, kinds and shores of a boundary as words', () => {
    const shore = { id: SHORE, position: { x: 40, y: 0, z: 3 }, lengthM: 2.4, section: { kind: 'rectangular', widthM: 0.2, depthM: 0.2 }, elasticModulusPa: 1.1e10, allowableStressPa: 8e6, endCondition: 'pinned-pinned', side: 'B' };
    const lines = [
      ...words({ entity: 'boundary', entityId: BHD, field: 'sideB', old: { kind: 'sea' }, new: { kind: 'compartment', compartmentId: HOLD } }),
      ...words({ entity: 'boundary', entityId: BHD, field: 'kind', old: 'bulkhead', new: 'hatch-cover' }),
      ...words({ entity: 'boundary', entityId: BHD, field: 'shores', old: [shore], new: [{ ...shore, lengthM: 2.6, endCondition: 'fixed-pinned' }] }),
      ...words({ entity: 'boundary', entityId: BHD, field: 'stiffening', old: { spacingM: 0.7, allowableStressPa: 160e6 }, new: { spacingM: 0.6, allowableStressPa: 160e6 } }),
    ];
    expect(lines).toEqual([
      'Side B of boundary “Aft bulkhead of No. 2 hold”: the sea → No. 2 hold',
      'Kind of boundary “Aft bulkhead of No. 2 hold”: bulkhead → hatch cover',
      'Length of shore 1 of boundary “Aft bulkhead of No. 2 hold”: 2.40 m → 2.60 m',
      'End condition of shore 1 of boundary “Aft bulkhead of No. 2 hold”: pinned both ends → fixed one end, pinned other',
      'Stiffener spacing of boundary “Aft bulkhead of No. 2 hold”: 0.70 m → 0.60 m',
    ]);
    noRawText(lines);
  });

  it('says an item added or removed by its name, and a reshaped plate in one line', () => {
    expect(words({ entity: 'compartment', entityId: 'x', field: null, old: null, new: { id: 'x', name: 'Fore peak' } })).toEqual(['Space “Fore peak” added']);
    expect(words({ entity: 'boundary', entityId: BHD, field: null, old: { id: BHD, name: 'Aft bulkhead of No. 2 hold' }, new: null })).toEqual(['Boundary “Aft bulkhead of No. 2 hold” removed']);
    const geo = (x: number) => ({ kind: 'rectangle', origin: { x, y: -9, z: 1 }, edgeU: { x: 0, y: 18, z: 0 }, edgeV: { x: 0, y: 0, z: 8 } });
    expect(words({ entity: 'boundary', entityId: BHD, field: 'geometry', old: geo(40), new: geo(41) })).toEqual(['Shape or position of boundary “Aft bulkhead of No. 2 hold”: changed']);
  });

  it('says the first revision as the survey started', () => {
    expect(words({ entity: 'survey', entityId: null, field: null, old: null, new: 'created' })).toEqual(['Survey started']);
  });

  it('shows no floating-point noise: 0.1 + 0.2 is said as 0.30 m', () => {
    const lines = words({ entity: 'condition', entityId: COND, field: 'contents', old: contents(4.7), new: contents(0.1 + 0.2) });
    expect(lines).toEqual(['Sounding in No. 2 hold: 4.70 m → 0.30 m']);
  });
});

describe('autosaves from one sitting are one entry', () => {
  const rev = (revision: number, minute: number, author: string, changes: FieldChange[]): RevisionEntry => ({
    revision,
    authorName: author,
    at: new Date(Date.UTC(2026, 2, 14, 7, minute)).toISOString(),
    changes,
    engineVersion: null,
    worstUtilisation: null,
  });
  const sounding = (a: number | undefined, b: number): FieldChange => ({ entity: 'condition', entityId: COND, field: 'contents', old: contents(a), new: contents(b) });

  it('groups one person’s revisions minutes apart and keeps each field’s first old and last new value', () => {
    const sittings = groupSittings([
      rev(1, 0, 'Ana', [sounding(undefined, 5)]),
      rev(2, 1, 'Ana', [sounding(5, 5.4)]),
      rev(3, 2, 'Ana', [sounding(5.4, 6.4)]),
      rev(4, 50, 'Ana', [sounding(6.4, 6.5)]), // after a pause: a new sitting
      rev(5, 51, 'Ben', [sounding(6.5, 6.6)]), // someone else: a new sitting
    ]);
    expect(sittings.map((s) => [s.firstRevision, s.lastRevision, s.revisionCount])).toEqual([
      [1, 3, 3],
      [4, 4, 1],
      [5, 5, 1],
    ]);
    expect(sittings[0]!.changes.flatMap((c) => changeWords(c, ctx)).map(changeLineText)).toEqual(['Sounding in No. 2 hold: not set → 6.40 m']);
  });

  it('drops an edit undone in the same sitting', () => {
    expect(netChanges([sounding(5, 6), sounding(6, 5)])).toEqual([]);
  });
});

describe('numbers and dates in one style', () => {
  it('says a span within a day once, 24-hour clock, day month year', () => {
    expect(formatUtcSpan('2026-03-14T07:30:00Z', '2026-03-14T17:52:00Z')).toBe('14 Mar 2026 07:30 – 17:52 UTC');
    expect(formatUtcSpan('2026-03-14T23:30:00Z', '2026-03-15T00:10:00Z')).toBe('14 Mar 2026 23:30 UTC – 15 Mar 2026 00:10 UTC');
  });

  it('shows round-off of a zero as 0, never "1.53e-16"', () => {
    expect(formatNumber(1.53e-16)).toBe('0');
    expect(formatNumber(4.699999999999999, 4)).toBe('4.700');
  });

  it('gives stresses in MPa or ksi, as the forms take them (1 ksi = 6.894757 MPa, NIST SP 811 Appendix B)', () => {
    expect(formatStress(160e6, 'si')).toBe('160.0 MPa');
    expect(formatStress(6.894757e6 * 36, 'us')).toBe('36.00 ksi');
  });
});
