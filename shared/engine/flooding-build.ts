/**
 * Builds the flooding model (flooding-model.ts) from a survey's condition and the engine's results
 * for it: the liquids, levels and gas pressures the loads were computed with become the starting
 * state, so the forecast starts exactly where the loads stand.
 */
import type { Compartment, Survey } from '../schemas/survey';
import type { OpeningFace, OpeningSize } from '../schemas/flooding';
import { levelTable } from './flooding-levels';
import {
  DEFAULT_DISCHARGE_COEFFICIENT,
  STANDARD_ATMOSPHERE_PA,
  stateSize,
  type FloodFluid,
  type FloodFrame,
  type FloodModel,
  type FloodOpening,
  type FloodSpace,
  type GasModel,
} from './flooding-model';
import type { SurveyResults } from './results';
import { dot, fromPoint, type V3 } from './vec';

export interface BuiltModel {
  model: FloodModel;
  y0: Float64Array;
  /** Space index by compartment id. */
  index: Map<string, number>;
  warnings: { code: string; entityId: string | null; message: string }[];
}

/** The vertical extent and shape of an opening from its face and size. */
export function openingShape(face: OpeningFace | undefined, size: OpeningSize | undefined, up: V3): { shape: FloodOpening['shape']; halfHeightM: number } {
  if (!size || face === 'bottom' || face === 'top') return { shape: 'point', halfHeightM: 0 };
  // a side or end opening's height runs along ship z; its vertical extent is that times up_z
  const h = size.kind === 'round' ? size.diameterM : size.heightM;
  return { shape: size.kind, halfHeightM: 0.5 * h * Math.abs(up[2]) };
}

export function buildFloodModel(survey: Survey, results: Pick<SurveyResults, 'compartments'>, frame: FloodFrame): BuiltModel {
  const warnings: BuiltModel['warnings'] = [];
  const up = frame.up;
  const compResults = new Map(results.compartments.map((c) => [c.id, c]));
  // one slot per distinct liquid (fluid id and density), sea water always present
  const fluidByKey = new Map<string, FloodFluid>();
  const keyOf = (fluidId: string, rho: number) => `${fluidId}@${rho}`;
  const seaKey = keyOf('sea-water', frame.seaDensityKgM3);
  fluidByKey.set(seaKey, { key: seaKey, fluidId: 'sea-water', name: 'Sea water', category: 'water', densityKgM3: frame.seaDensityKgM3 });
  for (const c of results.compartments) {
    for (const l of c.layers) {
      const k = keyOf(l.fluidId, l.densityKgM3);
      if (!fluidByKey.has(k)) fluidByKey.set(k, { key: k, fluidId: l.fluidId, name: l.fluidName, category: l.category, densityKgM3: l.densityKgM3 });
    }
  }
  const fluids = [...fluidByKey.values()].sort((a, b) => b.densityKgM3 - a.densityKgM3 || a.key.localeCompare(b.key));
  const slot = new Map(fluids.map((f, i) => [f.key, i]));
  const nF = fluids.length;

  const index = new Map<string, number>();
  survey.compartments.forEach((c, i) => index.set(c.id, i));
  const spaces: FloodSpace[] = [];
  const vol = new Float64Array(survey.compartments.length * nF);
  survey.compartments.forEach((comp, s) => {
    const r = compResults.get(comp.id);
    const permeability = r ? r.permeability : 1;
    const table = levelTable(comp.geometry, up);
    let liquid = 0;
    for (const l of r?.layers ?? []) {
      vol[s * nF + slot.get(keyOf(l.fluidId, l.densityKgM3))!] += l.volumeM3;
      liquid += l.volumeM3;
    }
    const p0 = r ? r.gasGaugePressurePa : 0;
    let gas: GasModel = p0 !== 0 ? { kind: 'held', gaugePa: p0 } : { kind: 'vented' };
    if (comp.airTight) {
      const vGas = permeability * table.total - liquid;
      if (vGas > 1e-9 * table.total) gas = { kind: 'trapped', pvPaM3: (p0 + STANDARD_ATMOSPHERE_PA) * vGas };
      else warnings.push({ code: 'flooding-no-air', entityId: comp.id, message: `${comp.name}: air-tight but full of liquid; no air to compress` });
    }
    const held = !!comp.openToSea && (comp.breaches ?? []).length === 0;
    if (held) warnings.push({ code: 'flooding-held', entityId: comp.id, message: `${comp.name}: open to the sea with no breach entered; held in balance with the sea (enter the breach to forecast its flow)` });
    spaces.push({ id: comp.id, name: comp.name, permeability: permeability > 0 ? permeability : 1, table, gas, held });
  });

  const openings: FloodOpening[] = [];
  const add = (comp: Compartment, s: number) => {
    (comp.breaches ?? []).forEach((b, i) => {
      openings.push({
        id: b.id,
        name: `${comp.name}: breach ${i + 1}`,
        inside: s,
        outside: -1,
        elevationM: dot(up, fromPoint(b.position)),
        ...openingShape(b.face, b.size, up),
        areaM2: b.areaM2,
        cd: b.dischargeCoefficient ?? DEFAULT_DISCHARGE_COEFFICIENT,
      });
    });
    for (const o of comp.openings ?? []) {
      const other = index.get(o.toCompartmentId);
      if (other === undefined || other === s) {
        warnings.push({ code: 'flooding-opening-nowhere', entityId: o.id, message: `${comp.name}: an opening leads to no other compartment of the survey; left out` });
        continue;
      }
      openings.push({
        id: o.id,
        name: o.name ?? `${comp.name} → ${survey.compartments[other].name}`,
        inside: s,
        outside: other,
        elevationM: dot(up, fromPoint(o.position)),
        ...openingShape(o.face, o.size, up),
        areaM2: o.areaM2,
        cd: o.dischargeCoefficient ?? DEFAULT_DISCHARGE_COEFFICIENT,
      });
    }
  };
  survey.compartments.forEach((c, s) => add(c, s));

  const model: FloodModel = { frame, fluids, seaSlot: slot.get(seaKey)!, spaces, openings, pumps: [] };
  const y0 = new Float64Array(stateSize(model));
  y0.set(vol);
  return { model, y0, index, warnings };
}
