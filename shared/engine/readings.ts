/**
 * Which readings a load rests on, and which of them are not entered yet. Drafts fix the outside
 * waterline and the trim; the heel (inclinometer, or both midship drafts) tilts every level plane;
 * a sounding or ullage fixes one layer's surface. A load or a liquid mass that rests on a missing
 * reading is not shown: the engine lists it as withheld, with the readings still to enter, in words.
 */
import type { Compartment, Condition, LevelSource, Survey } from '../schemas/survey';

/** Plain words for a reading not yet entered in the ship's condition. */
export function missingShipReadings(condition: Condition): string[] {
  const d = condition.drafts;
  const missing: string[] = [];
  if (d.aftM === undefined) missing.push('draft aft');
  if (d.forwardM === undefined) missing.push('draft forward');
  if (condition.heelDeg === undefined && (d.midPortM === undefined || d.midStarboardM === undefined)) {
    missing.push('heel (inclinometer, or both midship drafts)');
  }
  return missing;
}

/** Whether a level source still lacks its reading. */
export function levelReadingMissing(level: LevelSource): boolean {
  return (level.kind === 'sounding' || level.kind === 'interfaceSounding') ? level.soundingM === undefined : level.kind === 'ullage' ? level.ullageM === undefined : false;
}

function levelWord(level: LevelSource): string {
  return level.kind === 'ullage' ? 'ullage' : level.kind === 'interfaceSounding' ? 'interface sounding' : 'sounding';
}

/**
 * Readings each compartment's liquid rests on that are missing, by compartment id (compartments with
 * no liquid, or with every reading entered, are left out). Every liquid surface is a level plane, so
 * any liquid rests on the ship's heel and trim as well as on its own sounding.
 */
export function missingCompartmentReadings(survey: Survey, condition: Condition): Map<string, string[]> {
  const ship = missingShipReadings(condition);
  const contents = new Map(condition.contents.map((c) => [c.compartmentId, c]));
  const out = new Map<string, string[]>();
  for (const comp of survey.compartments) {
    const k = contents.get(comp.id);
    // an open-to-sea space's level is the sea's: no reading of its own
    if (!k) {
      if (comp.openToSea && ship.length > 0) out.set(comp.id, [...ship]);
      continue;
    }
    let missing: string[] | null = null;
    for (const l of k.layers) {
      if (!levelReadingMissing(l.level)) continue;
      missing ??= [...ship];
      missing.push(`${levelWord(l.level)} in ${comp.name}`);
    }
    if (missing) out.set(comp.id, missing);
    else if (ship.length > 0 && k.layers.length > 0) out.set(comp.id, [...ship]);
  }
  return out;
}

export interface Withheld {
  /** Boundary or compartment id. */
  entityId: string;
  kind: 'boundary' | 'compartment';
  name: string;
  /** The readings still to enter, in plain words ("draft forward", "sounding in No. 2 hold"). */
  missing: string[];
}

/** Sentence for a withheld item, the same on the device, the desk, the report and the brief. */
export function withheldSentence(w: Withheld): string {
  const what = w.kind === 'boundary' ? `Loads on ${w.name}` : `Liquid in ${w.name}`;
  return `${what} not shown: enter the ${joinWords(w.missing)}.`;
}

export function joinWords(words: readonly string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

/**
 * What computeSurvey must withhold: compartments whose liquid rests on a missing reading, and
 * boundaries with such a compartment, or the sea (drafts, heel), on either side.
 */
export function withheldItems(survey: Survey, condition: Condition): { compartments: Map<string, Withheld>; boundaries: Map<string, Withheld> } {
  const ship = missingShipReadings(condition);
  const byComp = missingCompartmentReadings(survey, condition);
  const names = new Map<string, Compartment>(survey.compartments.map((c) => [c.id, c]));
  const compartments = new Map<string, Withheld>();
  for (const [id, missing] of byComp) compartments.set(id, { entityId: id, kind: 'compartment', name: names.get(id)?.name ?? id, missing });
  const boundaries = new Map<string, Withheld>();
  if (ship.length === 0 && byComp.size === 0) return { compartments, boundaries };
  for (const b of survey.boundaries) {
    const a = sideMissing(b.sideA, ship, byComp), c = sideMissing(b.sideB, ship, byComp);
    if (!a && !c) continue;
    const missing = new Set<string>(a);
    if (c) for (const m of c) missing.add(m);
    boundaries.set(b.id, { entityId: b.id, kind: 'boundary', name: b.name, missing: [...missing] });
  }
  return { compartments, boundaries };
}

/** The readings a boundary side rests on that are missing, or null (the sea rests on the ship's readings). */
function sideMissing(side: Survey['boundaries'][number]['sideA'], ship: readonly string[], byComp: ReadonlyMap<string, string[]>): readonly string[] | null {
  if (side.kind === 'sea') return ship.length > 0 ? ship : null;
  if (side.kind === 'compartment') return byComp.get(side.compartmentId) ?? null;
  return null;
}
