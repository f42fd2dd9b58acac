/**
 * Limits the crew can measure. An engineer sets a limit as a level above the baseline or a net
 * pressure on a boundary; on deck the crew reads a tape in a sounding pipe or from an ullage point.
 * This says the same limit as the reading at the space's own pipe: a sounding is measured up from the
 * pipe's bottom, so sounding = level − pipe bottom; an ullage down from its reference point, so
 * ullage = reference − level (the definitions of sounding and ullage). A pressure limit on a plate
 * with liquid on one side only becomes the level at which the liquid's head at the plate's lowest
 * point reaches it: level = z_low + p / (ρ g) (hydrostatics, Pascal's law). Heel and trim are taken
 * as the readings' own: the level is meant at the pipe.
 */
import type { LimitRule } from '../api/review';
import { catalogueFluid } from '../fluids/catalogue';
import type { Boundary, Compartment, LevelSource, Survey } from '../schemas/survey';
import { formatQuantity, STANDARD_GRAVITY_M_S2, type UnitSystem } from '../units/units';
import { pointParts } from '../units/point-words';

type Gauge = { kind: 'sounding'; x: number; y: number; bottomZM: number } | { kind: 'ullage'; x: number; y: number; referenceZM: number };

function gaugeOf(level: LevelSource): Gauge | null {
  if (level.kind === 'sounding' || level.kind === 'interfaceSounding') return { kind: 'sounding', x: level.pipe.x, y: level.pipe.y, bottomZM: level.pipe.bottomZM };
  if (level.kind === 'ullage') return { kind: 'ullage', x: level.reference.x, y: level.reference.y, referenceZM: level.reference.z };
  return null;
}

/** The pipe or ullage point of the top layer of a space in the readings in use, with its liquid's density. */
function spaceGauge(doc: Survey, compartmentId: string): { gauge: Gauge; densityKgM3: number } | null {
  const condition = doc.conditions.find((c) => c.id === doc.activeConditionId);
  const layers = condition?.contents.find((k) => k.compartmentId === compartmentId)?.layers ?? [];
  for (let i = layers.length - 1; i >= 0; i--) {
    const l = layers[i]!;
    const gauge = gaugeOf(l.level);
    if (!gauge) continue;
    const fluid = doc.fluids.find((f) => f.id === l.fluidId);
    const density = l.densityKgM3 ?? (l.fluidId === 'sea-water' ? (condition?.seaDensityKgM3 ?? 1025) : (fluid?.densityKgM3 ?? catalogueFluid(l.fluidId)?.densityKgM3 ?? 1025));
    return { gauge, densityKgM3: density };
  }
  return null;
}

/** Lowest ship z of a flat plate, m. */
function lowestZ(b: Boundary): number {
  const g = b.geometry;
  switch (g.kind) {
    case 'polygon':
      return Math.min(...g.vertices.map((p) => p.z));
    case 'rectangle':
      return Math.min(g.origin.z, g.origin.z + g.edgeU.z, g.origin.z + g.edgeV.z, g.origin.z + g.edgeU.z + g.edgeV.z);
    case 'circle': {
      const n = Math.hypot(g.normal.x, g.normal.y, g.normal.z) || 1;
      // the lowest point of a circle lies r·√(1 − n_z²) below its centre
      return g.centre.z - g.radiusM * Math.sqrt(Math.max(0, 1 - (g.normal.z / n) ** 2));
    }
    case 'faceted':
      return Math.min(...g.facets.flatMap((f) => f.vertices.map((p) => p.z)));
  }
}

function gaugeSentence(name: string, gauge: Gauge, levelM: number, keep: 'above' | 'below', units: UnitSystem): string {
  const L = (v: number) => formatQuantity(v, 'length', units, 3).text;
  // along and across in words (the height is the reading itself)
  const [along, across] = pointParts({ x: gauge.x, y: gauge.y, z: 0 }, units);
  const where = `${along}, ${across}`;
  if (gauge.kind === 'sounding') {
    return `On deck: keep the sounding in ${name} (pipe at ${where}) ${keep} ${L(levelM - gauge.bottomZM)}.`;
  }
  // an ullage falls as the level rises
  return `On deck: keep the ullage in ${name} (from the point at ${where}) ${keep === 'above' ? 'below' : 'above'} ${L(gauge.referenceZM - levelM)}.`;
}

/** The limit as a reading the crew can take, or null when the survey has no pipe to say it at. */
export function measurableLimit(rule: LimitRule, doc: Survey, units: UnitSystem): string | null {
  const space = (id: string): Compartment | undefined => doc.compartments.find((c) => c.id === id);
  if (rule.kind === 'keep_level_above' || rule.kind === 'keep_level_below') {
    const c = space(rule.compartmentId);
    const g = c && spaceGauge(doc, c.id);
    return c && g ? gaugeSentence(c.name, g.gauge, rule.levelM, rule.kind === 'keep_level_above' ? 'above' : 'below', units) : null;
  }
  if (rule.kind === 'max_net_pressure') {
    const b = doc.boundaries.find((x) => x.id === rule.boundaryId);
    if (!b) return null;
    const wet = [b.sideA, b.sideB].flatMap((s) => (s.kind === 'compartment' && spaceGauge(doc, s.compartmentId) ? [s.compartmentId] : []));
    const dry = [b.sideA, b.sideB].filter((s) => s.kind === 'air' || (s.kind === 'compartment' && !spaceGauge(doc, s.compartmentId))).length;
    // only with liquid on one side and nothing pressing back is the pressure one level
    if (wet.length !== 1 || dry !== 1) return null;
    const c = space(wet[0]!)!;
    const g = spaceGauge(doc, c.id)!;
    const level = lowestZ(b) + rule.pressurePa / (g.densityKgM3 * STANDARD_GRAVITY_M_S2);
    return gaugeSentence(c.name, g.gauge, level, 'below', units);
  }
  return null;
}
