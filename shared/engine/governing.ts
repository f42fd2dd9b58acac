/** Which check governs a boundary's utilisation, in words, so a percentage never stands alone. */
import type { BoundaryResult, CapacityResult } from './results';

export interface GoverningCheck {
  utilisation: number;
  /** e.g. "shore 3, of its design capacity (ANSI/AWC NDS-2018 §3.7.1 …)", "rating towards side B". */
  what: string;
  /** When a rating governs, that rating (so the words can give its value, unit and side). */
  rating: CapacityResult | null;
}

export function governingCheck(b: BoundaryResult): GoverningCheck | null {
  const cands: GoverningCheck[] = [];
  for (const c of b.capacities) {
    cands.push({ utilisation: c.utilisation, what: `its rated ${c.kind} ${c.direction === 'either' ? '(either way)' : c.direction === 'towards-B' ? 'towards side B' : 'towards side A'}`, rating: c });
  }
  const st = b.stiffeners;
  if (st && st.governingIndex !== null && st.maxUtilisation !== null) cands.push({ utilisation: st.maxUtilisation, what: `stiffener ${st.governingIndex + 1} in bending`, rating: null });
  const pl = b.plating;
  if (pl && pl.governingIndex !== null && pl.maxUtilisation !== null) cands.push({ utilisation: pl.maxUtilisation, what: `plating panel ${pl.governingIndex + 1} in bending (${pl.source})`, rating: null });
  b.shores.forEach((s, i) => cands.push({ utilisation: s.utilisation, what: `shore ${i + 1}, of its design capacity (${s.designMethodLabel})`, rating: null }));
  let best: GoverningCheck | null = null;
  for (const c of cands) if (Number.isFinite(c.utilisation) && (best === null || c.utilisation > best.utilisation)) best = c;
  return best;
}
