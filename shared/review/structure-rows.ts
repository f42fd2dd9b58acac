/**
 * A boundary's structural checks as rows of words (what is checked, the load on it, what it may
 * carry, the utilisation), each figure with its unit and each rating with its direction, so the
 * master's brief and the calculation report say the same thing as the results screens.
 */
import type { Boundary } from '../schemas/survey';
import type { BoundaryResult } from '../engine';
import { ratingWayWords } from './rating-words';
import { formatNumber, formatQuantity, formatStress, fromSi, type Dimension, type UnitSystem } from '../units/units';

export interface CheckRow {
  /** What is checked, e.g. "Shore 2 in compression (ANSI/AWC NDS-2018 §3.7.1 …), on a stiffener". */
  check: string;
  /** The load on it, with its unit and direction. */
  load: string;
  /** What it may carry, with its unit. */
  capacity: string;
  /** Load over capacity, or null when the check could not be made. */
  utilisation: number | null;
  /** A secondary figure or a reason (the Euler load, "not checked: …"). */
  note: string | null;
  kind: 'rating' | 'stiffener' | 'plating' | 'shore';
  /** Ratings: which way the rating holds. */
  direction?: 'either' | 'towards-A' | 'towards-B';
}

const BEARS_ON: Record<BoundaryResult['shores'][number]['bearsOn'], string> = {
  plate: 'on the plate',
  stiffener: 'on a stiffener',
  panel: 'on the plating between stiffeners',
  edge: 'at a held edge',
};

const SHORT_METHOD: Record<BoundaryResult['shores'][number]['designMethod'], string> = {
  'aisc-360-e3': 'steel, AISC 360 §E3',
  'nds-3.7.1': 'timber, NDS §3.7.1',
  generic: 'by a design factor',
  legacy: 'no design method: Euler ÷ 2',
};

/**
 * The checks of one boundary. `sides` names the spaces on side A and side B; `input` is the
 * boundary as surveyed (for the stiffeners' section modulus), when at hand. `compact` (the
 * master's brief) gives only the most used shore, with the count, and leaves the sources to the
 * report.
 */
export function structureCheckRows(b: BoundaryResult, units: UnitSystem, sides: { A: string; B: string }, input?: Boundary, opts: { compact?: boolean } = {}): CheckRow[] {
  const q = (v: number, dim: Dimension, digits = 3) => formatQuantity(v, dim, units, digits).text;
  const rows: CheckRow[] = [];
  for (const c of b.capacities) {
    const dim: Dimension = c.kind === 'pressure' ? 'pressure' : 'force';
    const way = ratingWayWords(c.direction, sides);
    rows.push({
      kind: 'rating',
      direction: c.direction,
      check: `Rated ${c.kind} ${way}`,
      load: c.direction === 'either' ? `${q(c.actual, dim)} (greatest, either way)` : `${q(c.actual, dim)} pushing that way`,
      capacity: q(c.rated, dim),
      utilisation: c.utilisation,
      note: null,
    });
  }
  const st = b.stiffeners;
  if (st && st.status !== 'ok') {
    rows.push({ kind: 'stiffener', check: 'Stiffeners', load: '—', capacity: '—', utilisation: null, note: `not checked: ${st.note ?? 'no stiffener inside the plate'}` });
  } else if (st && st.governingIndex !== null) {
    const s = st.items[st.governingIndex];
    const given = input?.stiffening?.sectionModulusM3 ?? s.requiredModulusM3 / s.utilisation;
    rows.push({
      kind: 'stiffener',
      check: `Stiffener ${st.governingIndex + 1} of ${st.items.length} in bending${s.shoreForcesN > 0 ? ', with the shores on it as supports' : ''}`,
      load: `bending moment ${q(Math.abs(s.maxMomentNm), 'moment')}, needs ${q(s.requiredModulusM3, 'sectionModulus')}`,
      capacity: `${q(given, 'sectionModulus')} section modulus`,
      utilisation: s.utilisation,
      note: null,
    });
  }
  const pl = b.plating;
  if (pl && pl.governingIndex !== null) {
    const p = pl.panels[pl.governingIndex];
    rows.push({
      kind: 'plating',
      check: `Plating panel ${pl.governingIndex + 1} of ${pl.panels.length} in bending${opts.compact ? `, ${formatThickness(pl.netThicknessM, units)} net` : ''}`,
      load: `${formatStress(p.stressPa, units, 3)} under ${q(Math.abs(p.pressureMaxPa), 'pressure')} towards side ${p.pressureMaxPa >= 0 ? 'B' : 'A'}`,
      capacity: `${formatStress(pl.allowableStressPa, units, 3)} allowable`,
      utilisation: p.utilisation,
      note: opts.compact ? null : `${formatThickness(pl.netThicknessM, units)} net of corrosion allowance; ${pl.source}`,
    });
  } else if (pl) {
    rows.push({ kind: 'plating', check: 'Plating', load: '—', capacity: '—', utilisation: null, note: `not checked: ${pl.notes.join('; ') || 'no panel inside the plate'}` });
  }
  let shores = b.shores.map((s, i) => ({ s, i }));
  if (opts.compact && shores.length > 1) shores = [shores.reduce((m, x) => (x.s.utilisation > m.s.utilisation ? x : m))];
  for (const { s, i } of shores) {
    if (opts.compact) {
      rows.push({
        kind: 'shore',
        check: `Shore ${i + 1}${b.shores.length > 1 ? ` (the most used of ${b.shores.length})` : ''} in compression, ${BEARS_ON[s.bearsOn]}; ${SHORT_METHOD[s.designMethod]}`,
        load: s.loaded ? q(s.axialLoadN, 'force') : 'not loaded',
        capacity: `${q(s.designCapacityN, 'force')} design capacity`,
        utilisation: s.utilisation,
        note: `Euler (elastic) buckling load ${q(s.eulerLoadN, 'force')}: not the capacity`,
      });
      continue;
    }
    rows.push({
      kind: 'shore',
      check: `Shore ${i + 1} in compression, ${BEARS_ON[s.bearsOn]} (${s.designMethodLabel})`,
      load: s.loaded ? q(s.axialLoadN, 'force') : 'not loaded',
      capacity: `${q(s.designCapacityN, 'force')} design capacity`,
      utilisation: s.utilisation,
      note: `Euler (elastic) buckling load ${q(s.eulerLoadN, 'force')}, a secondary figure, not the capacity`,
    });
  }
  return rows;
}

function formatThickness(m: number, units: UnitSystem): string {
  return units === 'us' ? `${formatNumber(fromSi(m, 'in'), 3)} in` : `${formatNumber(fromSi(m, 'mm'), 3)} mm`;
}
