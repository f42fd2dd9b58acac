/**
 * The ship's response to the liquids the survey models: new drafts, trim and heel, GM solid and
 * fluid, from her intact hydrostatic particulars (./hydrostatics.ts), by the two textbook methods
 * (Barrass & Derrett, "Ship Stability for Masters and Mates", chapters on bilging and on free
 * surface; Rawson & Tupper, "Basic Ship Theory", ch. 5 "Flooding and damaged stability"):
 *
 * - ADDED WEIGHT: the liquid in each space is a weight at its centroid; the ship sinks by w/TPC,
 *   trims by w·(LCF − x)/MCT, G moves to the combined centre, and every slack surface takes
 *   ρ·i/Δ off GM (free-surface correction).
 * - LOST BUOYANCY: a space open to the sea stops providing buoyancy and waterplane; displacement
 *   and G stay, the ship sinks until the remaining waterplane makes up the lost volume, and KM
 *   changes with the lost waterplane's second moment.
 *
 * Both find the same final waterline; GM differs between them (Δ differs) while the righting
 * moment Δ·GM agrees. Small-angle theory throughout: heel tan φ = Σ w·y / (Δ · GM_fluid); beyond
 * its range the response says so. Pure and fast: it is called at every step of a forecast.
 */
import type { Condition, Survey } from '../schemas/survey';
import { DEFAULT_PERMEABILITY } from '../schemas/space-types';
import { levelOfVolume, levelTable, type LevelTable } from './flooding-levels';
import { intactShip } from './hydrostatics';
import { planeSection } from './mesh';
import { compartmentSolid, volumeBelow, type Polyhedron } from './polyhedron';
import type { Severity, SurveyResults } from './results';
import { sectionMoments } from './section-moments';

/**
 * The liquid of one space as a weight. `freeSurfaceMomentKgM2` is ρ·i_T of the liquid's free
 * surface(s) with permeability applied (in kg·m: kg/m³ × m⁴; the name is the agreed one).
 * `openToSea`: the space is in free communication with the sea, its level the sea's: it is taken
 * by lost buoyancy (or added weight up to the final waterline) from its geometry, and its
 * massKg, centroid and free-surface moment are not used.
 */
export interface FloodWeight {
  spaceId: string;
  massKg: number;
  x: number;
  y: number;
  z: number;
  freeSurfaceMomentKgM2: number;
  openToSea: boolean;
  /**
   * A space open to the sea holding a liquid of its own that floats on the sea water inside (a holed
   * fuel tank's oil): that liquid stays part of the ship (sea water replaced only what flowed out),
   * so it is a weight riding on the sea water, and only the sea water below it is lost buoyancy.
   * `massKg` kg and `volumeM3` m³ (permeability applied) of that liquid; `interfaceDepthM`, how far
   * its underside (the interface with the sea water) lies below the outside waterline, m: held as the
   * ship sinks or rises, as the oil column's weight is carried by the sea water's pressure there.
   */
  kept?: { massKg: number; volumeM3: number; interfaceDepthM: number };
}

/**
 * Heel in degrees (positive starboard down), trim over the LBP in m (T_AP − T_FP, positive by the
 * stern), drafts at the vessel's draught marks (as a condition records them, so a condition at this
 * attitude reads them back) and the mean draft amidships, m.
 */
export interface ShipAttitude {
  heelDeg: number;
  trimM: number;
  draftAftM: number;
  draftForeM: number;
  meanDraftM: number;
}

export interface StabilityWarning {
  code: string;
  severity: Severity;
  message: string;
}

export interface ShipResponse {
  attitude: ShipAttitude;
  /** Drafts at the perpendiculars, m. */
  draftAftPerpM: number;
  draftForePerpM: number;
  displacementKg: number;
  kgM: number;
  kmM: number;
  gmSolidM: number;
  /** GM after the free-surface correction, m. */
  gmFluidM: number;
  freeSurfaceCorrectionM: number;
  /** Each slack space's free-surface moment, kg·m. */
  freeSurfaces: { spaceId: string; momentKgM: number }[];
  /** Which spaces each method took; `ownLiquidKept`: spaces open to the sea whose own liquid (oil) stays aboard as a weight. */
  methods: { addedWeight: string[]; lostBuoyancy: string[]; ownLiquidKept: string[] };
  /** 'small-angle' (tan φ = Σw·y/(Δ·GM)) or 'loll' (GM fluid ≤ 0: wall-sided formula, a rough figure). */
  heelBy: 'small-angle' | 'loll';
  /** Least height of the deck edge above the water at this attitude, m. */
  deckEdgeFreeboardM: number;
  /** Remaining waterplane area, m² (less than intact when a space is open to the sea). */
  waterplaneAreaM2: number;
  /** Longitudinal centre of flotation about which the ship trims, m from the AP. */
  lcfM: number;
  /** Moment to change trim one metre, kg·m/m. */
  mctKgM: number;
  warnings: StabilityWarning[];
  /** When the condition has her aground: the reaction, and her free-floating response (./grounding.ts). */
  ground?: GroundState;
}

/** A ship aground at a point (./grounding.ts): where, the reaction, and how she would float without it. */
export interface GroundState {
  /** Where she bears on the ground, ship axes, m (on the baseline). */
  xM: number;
  yM: number;
  /** The ground reaction as a mass, kg (0: afloat). */
  reactionKg: number;
  /** Draft the ground holds at the point, m (null when she was afloat at the readings). */
  groundDraftM: number | null;
  afloat: boolean;
  /** Her response with no reaction: the attitude and GM she would have if she came off. */
  free: ShipResponse;
}

/** Heel beyond which small-angle results are flagged, degrees (the common limit of the texts). */
export const SMALL_ANGLE_LIMIT_DEG = 10;
/** Trim beyond which the hydrostatics of an even-keel table are flagged, as a fraction of LBP (common practice, no source). */
export const LARGE_TRIM_FRACTION = 0.01;

const UP: [number, number, number] = [0, 0, 1];
const solids = new WeakMap<object, Polyhedron>();
function solidOf(geometry: object & Parameters<typeof compartmentSolid>[0]): Polyhedron {
  let s = solids.get(geometry);
  if (!s) solids.set(geometry, (s = compartmentSolid(geometry)));
  return s;
}

interface OpenSpace {
  spaceId: string;
  solid: Polyhedron;
  geometry: Parameters<typeof compartmentSolid>[0] & object;
  permeability: number;
  kept?: FloodWeight['kept'];
}

/**
 * Volume, centroid and waterplane of the open spaces' permeable part below the sea water's surface
 * inside them with the ship at the level z = T: the waterline itself, or the interface under a
 * liquid of their own kept aboard, its depth below the waterline held.
 */
function openSpacesAt(spaces: readonly OpenSpace[], T: number) {
  return spaces.map((s) => {
    const z = T - (s.kept?.interfaceDepthM ?? 0);
    const v = volumeBelow(s.solid, UP, z);
    const sec = sectionMoments(planeSection(s.solid, UP, z), UP);
    const mu = s.permeability;
    return {
      spaceId: s.spaceId,
      volumeM3: mu * v.volume,
      centroid: v.volume > 1e-12 ? [v.mx / v.volume, v.my / v.volume, v.mz / v.volume] : [0, 0, z],
      areaM2: mu * sec.areaM2,
      areaCentroid: sec.centroid ?? [0, 0, z],
      iAlongM4: mu * sec.iAlongM4,
      iAcrossM4: mu * sec.iAcrossM4,
    };
  });
}

/**
 * The response of the ship of `condition` (its hydrostatic particulars) to `weights`, or null when
 * the condition has no particulars. Weights are the liquids of the spaces the survey models (the
 * particulars are for the ship with those spaces empty). Spaces open to the sea go by lost
 * buoyancy unless the condition chooses added weight. Units: kg, m, degrees.
 */
/**
 * A ground reaction (the ship aground at a point of her bottom): an upward force of `massKg` × g at
 * (x, y) on the baseline, taken as a weight removed at the keel (the texts' "virtual rise of G"
 * method for a ship aground or taking the blocks: KG rises by R·KG/(Δ − R) and the ship floats at
 * the displacement Δ − R; Barrass & Derrett, "Ship Stability for Masters and Mates", ch. "Drydocking
 * and grounding"; from memory). See ./grounding.ts.
 */
export interface GroundForce {
  massKg: number;
  x: number;
  y: number;
}

export function responseFromWeights(survey: Survey, condition: Condition, weights: readonly FloodWeight[], ground?: GroundForce): ShipResponse | null {
  const ship = intactShip(survey, condition);
  if (!ship) return null;
  const warnings: StabilityWarning[] = [];
  const warn = (code: string, severity: Severity, message: string) => warnings.push({ code, severity, message });
  const rho = ship.seaDensityKgM3;
  const L = ship.lengthM;
  const openMethod = condition.stability?.openSpaceMethod ?? 'lost-buoyancy';

  const compartments = new Map(survey.compartments.map((c) => [c.id, c]));
  const open: OpenSpace[] = [];
  let W = 0, Mx = 0, My = 0, Mz = 0, fsmAdded = 0;
  const added: string[] = [];
  const freeSurfaces: { spaceId: string; momentKgM: number }[] = [];
  for (const w of weights) {
    const comp = w.openToSea ? compartments.get(w.spaceId) : undefined;
    if (comp) {
      const kept = w.kept && w.kept.massKg > 0 && w.kept.volumeM3 > 0 ? w.kept : undefined;
      open.push({ spaceId: w.spaceId, solid: solidOf(comp.geometry), geometry: comp.geometry, permeability: comp.permeability ?? DEFAULT_PERMEABILITY[comp.spaceType], kept });
      // the liquid kept aboard weighs on the ship wherever it rides (its place once the waterline is found)
      if (kept) W += kept.massKg;
      continue;
    }
    if (w.openToSea) warn('open-space-unknown', 'warning', `Space ${w.spaceId} is open to the sea but not in the survey; taken as an added weight.`);
    if (!(w.massKg > 0)) continue;
    W += w.massKg;
    Mx += w.massKg * w.x;
    My += w.massKg * w.y;
    Mz += w.massKg * w.z;
    added.push(w.spaceId);
    if (w.freeSurfaceMomentKgM2 > 0) {
      fsmAdded += w.freeSurfaceMomentKgM2;
      freeSurfaces.push({ spaceId: w.spaceId, momentKgM: w.freeSurfaceMomentKgM2 });
    }
  }

  if (ground && ground.massKg > 0) {
    // the reaction at the keel (z = 0): a weight removed there
    W -= ground.massKg;
    Mx -= ground.massKg * ground.x;
    My -= ground.massKg * ground.y;
  }

  const d0 = ship.displacementKg;
  const h0 = ship.at(ship.draftM);
  if (h0.kmM < ship.kgM) {
    warn('km-below-kg', 'warning', `KM ${h0.kmM.toFixed(2)} m is below KG ${ship.kgM.toFixed(2)} m in the particulars: the intact ship would have no stability. Check the figures against the stability information.`);
  }

  // Added weights: parallel sinkage at the centre of flotation (box: exact draft of the box).
  const d1 = d0 + W;
  const T1 = ship.kind === 'box' ? d1 / (rho * L * ship.breadthM) : ship.draftM + W / (rho * h0.waterplaneAreaM2);
  const h1 = ship.at(T1);
  const Aw = h1.waterplaneAreaM2;
  const V1 = d1 / rho;

  // Spaces open to the sea: the draft at which the hull displaces V1 plus what they take in.
  let Tf = T1;
  let sinks = false;
  if (open.length > 0) {
    for (let i = 0; i < 60; i++) {
      const at = openSpacesAt(open, Tf);
      const lost = at.reduce((s, o) => s + o.volumeM3, 0);
      const lostArea = at.reduce((s, o) => s + o.areaM2, 0);
      const f = Aw * (Tf - T1) - lost;
      const slope = Aw - lostArea;
      if (slope <= 1e-9 * Aw) {
        sinks = true;
        break;
      }
      const step = -f / slope;
      Tf += step;
      if (Math.abs(step) < 1e-10 * Math.max(1, Tf)) break;
      if (Tf > 10 * ship.depthM) {
        sinks = true;
        break;
      }
    }
  }
  const os = openSpacesAt(open, Tf);
  const lostVolume = os.reduce((s, o) => s + o.volumeM3, 0);
  // each kept liquid rides on its space's sea water: its slice above the interface, and its free
  // surfaces ρ·μ·(i_top − i_interface) (the layered free surface of the texts; the sea water's own
  // surface, the interface, is taken by the lost waterplane or, by added weight, as sea water)
  const kept: string[] = [];
  for (const o of open) {
    if (!o.kept) continue;
    const mu = o.permeability > 0 ? o.permeability : 1;
    const table = uprightTable(o.geometry);
    const zi = Tf - o.kept.interfaceDepthM;
    const below = volumeBelow(o.solid, UP, zi);
    const zt = Math.min(levelOfVolume(table, below.volume + o.kept.volumeM3 / mu), table.top);
    const upto = volumeBelow(o.solid, UP, zt);
    const slice = upto.volume - below.volume;
    const c = slice > 1e-12 ? [(upto.mx - below.mx) / slice, (upto.my - below.my) / slice, (upto.mz - below.mz) / slice] : [upto.mx / Math.max(upto.volume, 1e-12), upto.my / Math.max(upto.volume, 1e-12), zt];
    const m = o.kept.massKg;
    Mx += m * c[0];
    My += m * c[1];
    Mz += m * c[2];
    kept.push(o.spaceId);
    const rhoKept = o.kept.massKg / o.kept.volumeM3;
    const iTop = zt < table.top ? sectionMoments(planeSection(o.solid, UP, zt), UP).iAlongM4 : 0;
    const fsmKept = rhoKept * mu * (iTop - sectionMoments(planeSection(o.solid, UP, zi), UP).iAlongM4);
    if (Math.abs(fsmKept) > 1e-9) {
      fsmAdded += fsmKept;
      freeSurfaces.push({ spaceId: o.spaceId, momentKgM: fsmKept });
    }
  }

  let disp: number, kg: number, lcg: number, tcg: number, km: number, kb: number, lcb: number, tcb: number, mct: number, lcf: number, area: number;
  let fsm = fsmAdded;
  if (openMethod === 'added-weight' || open.length === 0) {
    // ADDED WEIGHT, open spaces included as water up to the final waterline.
    const wo = rho * lostVolume;
    disp = d1 + wo;
    let mx = d0 * ship.lcgM + Mx, my = d0 * ship.tcgM + My, mz = d0 * ship.kgM + Mz;
    for (const o of os) {
      mx += rho * o.volumeM3 * o.centroid[0];
      my += rho * o.volumeM3 * o.centroid[1];
      mz += rho * o.volumeM3 * o.centroid[2];
      const m = rho * o.iAlongM4;
      if (m > 0) {
        fsm += m;
        freeSurfaces.push({ spaceId: o.spaceId, momentKgM: m });
      }
    }
    kg = mz / disp;
    lcg = mx / disp;
    tcg = my / disp;
    const hf = ship.kind === 'box' ? ship.at(Tf) : h1;
    km = hf.kmM;
    kb = Tf / 2;
    lcf = hf.lcfM;
    area = hf.waterplaneAreaM2;
    // The added layer of buoyancy lies at the centre of flotation (box: upright box, B at L/2).
    lcb = ship.kind === 'box' ? L / 2 : (d0 * ship.lcbM + (disp - d0) * lcf) / disp;
    tcb = 0;
    mct = hf.mctKgM(disp, kg);
  } else {
    // LOST BUOYANCY: displacement and G as with the added weights alone.
    disp = d1;
    kg = (d0 * ship.kgM + Mz) / d1;
    lcg = (d0 * ship.lcgM + Mx) / d1;
    tcg = (d0 * ship.tcgM + My) / d1;
    const s = Tf - T1;
    // Buoyancy: the layer Aw·s between T1 and Tf comes in, the open spaces' volume goes out.
    let zLost = 0, xLost = 0, yLost = 0, aLost = 0, ayLost = 0, axLost = 0, iT = 0, iL = 0;
    for (const o of os) {
      zLost += o.volumeM3 * o.centroid[2];
      xLost += o.volumeM3 * o.centroid[0];
      yLost += o.volumeM3 * o.centroid[1];
      aLost += o.areaM2;
      ayLost += o.areaM2 * o.areaCentroid[1];
      axLost += o.areaM2 * o.areaCentroid[0];
      // each lost piece about the centreline and about the intact LCF (parallel axes)
      iT += o.iAlongM4 + o.areaM2 * o.areaCentroid[1] ** 2;
      iL += o.iAcrossM4 + o.areaM2 * (o.areaCentroid[0] - h1.lcfM) ** 2;
    }
    const dKb = (Aw * s * (T1 + Tf) / 2 - zLost) / V1;
    area = Aw - aLost;
    const yF = -ayLost / area;
    lcf = (Aw * h1.lcfM - axLost) / area;
    // Remaining waterplane's second moments about its own centroid (parallel-axis theorem).
    const dIT = -iT - area * yF * yF;
    const dIL = -iL - area * (lcf - h1.lcfM) ** 2;
    km = h1.kmM + dKb + dIT / V1;
    kb = T1 / 2 + dKb;
    const lcb1 = ship.kind === 'box' ? L / 2 : (d0 * ship.lcbM + W * h1.lcfM) / d1;
    lcb = lcb1 + (Aw * s * h1.lcfM - xLost) / V1;
    tcb = -yLost / V1;
    mct = h1.mctKgM(d1, kg) + (d1 * (dKb + dIL / V1)) / L;
  }

  const gmSolid = km - kg;
  const fsc = fsm / disp;
  const gmFluid = gmSolid - fsc;
  const trim = mct > 0 ? (disp * (lcb - lcg)) / mct : 0;
  // Heel: positive to starboard; G to port of B heels her to port.
  const arm = tcg - tcb;
  let heelBy: ShipResponse['heelBy'] = 'small-angle';
  let tanPort: number;
  if (gmFluid > 0) {
    tanPort = arm / gmFluid;
  } else {
    heelBy = 'loll';
    tanPort = wallSidedHeel(gmFluid, Math.max(km - kb, 1e-6), arm);
  }
  const heelDeg = (-Math.atan(tanPort) * 180) / Math.PI;

  const draftAt = (x: number) => Tf + (trim * (lcf - x)) / L;
  const marks = survey.vessel.draughtMarks;
  const attitude: ShipAttitude = {
    heelDeg,
    trimM: draftAt(0) - draftAt(L),
    draftAftM: draftAt(marks.aftXM),
    draftForeM: draftAt(marks.forwardXM),
    meanDraftM: draftAt(L / 2),
  };
  const tanHeel = Math.tan((heelDeg * Math.PI) / 180);
  const halfB = ship.breadthM / 2;
  let deckEdge = Infinity;
  for (const x of [0, L]) for (const y of [-halfB, halfB]) deckEdge = Math.min(deckEdge, ship.depthM - (draftAt(x) - y * tanHeel));

  if (sinks || Tf >= ship.depthM) {
    warn('sinks', 'danger', 'By these figures the remaining buoyancy cannot carry the ship: she would founder. The figures below do not apply.');
  }
  if (gmFluid <= 0) {
    warn('gm-negative', 'danger', `GM fluid is ${gmFluid.toFixed(2)} m: the ship is unstable upright and may loll or capsize. The heel shown is a rough angle of loll (wall-sided formula${arm === 0 ? '; she may lie over to either side' : ''}); small-angle figures do not apply.`);
  }
  if (Math.abs(heelDeg) > SMALL_ANGLE_LIMIT_DEG) {
    warn('heel-beyond-range', 'warning', `Heel ${Math.abs(heelDeg).toFixed(1)}° is beyond the ${SMALL_ANGLE_LIMIT_DEG}° to which the small-angle method holds; the real heel may differ a good deal.`);
  }
  if (Math.abs(attitude.trimM) > LARGE_TRIM_FRACTION * L) {
    warn('trim-beyond-range', 'warning', `Trim ${Math.abs(attitude.trimM).toFixed(2)} m is more than ${(LARGE_TRIM_FRACTION * 100).toFixed(0)} % of the length: hydrostatics for an even keel lose accuracy.`);
  }
  if (deckEdge < 0) {
    warn('deck-edge-immersed', 'warning', `The deck edge is ${(-deckEdge).toFixed(2)} m under water at this attitude: the ship has less stability than these figures show.`);
  }
  if (ship.kind === 'booklet' && Math.abs(Tf - ship.draftM) > Math.max(0.05 * ship.draftM, 0.25)) {
    warn('hydrostatics-far', 'warning', `The mean draft moves from ${ship.draftM.toFixed(2)} m to ${Tf.toFixed(2)} m: read the hydrostatics at a draft nearer the new one (TPC, LCF, MCT and KM were taken as at ${ship.draftM.toFixed(2)} m).`);
  }

  return {
    attitude,
    draftAftPerpM: draftAt(0),
    draftForePerpM: draftAt(L),
    displacementKg: disp,
    kgM: kg,
    kmM: km,
    gmSolidM: gmSolid,
    gmFluidM: gmFluid,
    freeSurfaceCorrectionM: fsc,
    freeSurfaces,
    methods: {
      addedWeight: openMethod === 'added-weight' ? [...added, ...open.map((o) => o.spaceId)] : added,
      lostBuoyancy: openMethod === 'added-weight' ? [] : open.map((o) => o.spaceId),
      ownLiquidKept: kept,
    },
    heelBy,
    deckEdgeFreeboardM: deckEdge,
    waterplaneAreaM2: area,
    lcfM: lcf,
    mctKgM: mct,
    warnings,
  };
}

/**
 * tan φ of the heel (to port positive) where a wall-sided ship with negative or zero GM comes to
 * rest: GZ = sin φ (GM + ½ BM tan² φ) balances the off-centre arm `a` (m to port) × cos φ, i.e.
 * ½ BM t³ + GM t − a = 0 (the wall-sided formula, Barrass & Derrett, ch. "Angle of loll").
 * With no off-centre arm, the angle of loll tan φ = √(−2 GM / BM), shown to starboard.
 */
function wallSidedHeel(gm: number, bm: number, a: number): number {
  const sign = a >= 0 ? 1 : -1;
  const target = Math.abs(a);
  const g = (t: number) => 0.5 * bm * t * t * t + gm * t - target;
  if (target === 0) return -Math.sqrt(Math.max(0, (-2 * gm) / bm));
  let lo = 0, hi = 1;
  while (g(hi) < 0 && hi < 1e6) hi *= 2;
  for (let i = 0; i < 100; i++) {
    const mid = (lo + hi) / 2;
    if (g(mid) < 0) lo = mid;
    else hi = mid;
  }
  return sign * hi;
}

/**
 * The FloodWeights of a computed condition: each space's liquids (permeability and density applied,
 * as computeSurvey found them) as floodWeightsAtLevels places them: at their centroid with the ship
 * upright on an even keel, with the free-surface moment of every slack surface ρ·μ·i_T, i_T the
 * exact second moment of the surface polygon (the compartment solid cut at the level, at the
 * condition's heel and trim) about its own axis along the ship. The liquid's shift to the low side
 * of a ship the readings show heeled is in that free-surface correction alone; taking the heeled
 * centroid as the weight's place as well would count it twice (Barrass & Derrett, chapters on free
 * surface; checked in tests/reference/stability-heeled-readings.test.ts). Between two layers (oil on
 * water) the interface counts with the difference of their densities; a surface pressed up to the
 * top of its space has no polygon and no free surface. Units: kg, m, kg·m.
 */
export function floodWeightsFromResults(survey: Survey, results: Omit<SurveyResults, 'boundaries'>): FloodWeight[] {
  const up: [number, number, number] = [results.frame.up.x, results.frame.up.y, results.frame.up.z];
  const compartments = new Set(survey.compartments.map((c) => c.id));
  const condition = survey.conditions.find((k) => k.id === results.conditionId);
  const contents = new Map((condition?.contents ?? []).map((k) => [k.compartmentId, k]));
  // Open to the sea means in balance with it: no contents given (the engine floods it to the
  // waterline) or a top layer at the outside waterline. A breached space still filling is a weight.
  const inBalance = (id: string) => {
    const layers = contents.get(id)?.layers;
    return !layers || layers.length === 0 || layers[layers.length - 1].level.kind === 'openToSea';
  };
  const spaces = results.compartments
    .filter((r) => compartments.has(r.id) && r.liquid.centroid && r.liquid.massKg > 0)
    .map((r) => ({ spaceId: r.id, permeability: r.permeability, openToSea: r.openToSea && inBalance(r.id), layers: r.layers.map((l) => ({ ...l, sea: l.fluidId === 'sea-water' })) }));
  return floodWeightsAtLevels(survey, up, spaces, results.frame.waterlineElevationM);
}

/** A liquid layer for the weights: its volume (permeability applied, m³) and its top's elevation along `up`, m. */
export interface LevelledLayer {
  densityKgM3: number;
  volumeM3: number;
  levelElevationM: number;
  /** Sea water (of a space open to the sea: the sea's own water, in communication with it). */
  sea?: boolean;
}

/** ρ·μ·i_T of every slack surface of a space's layers (bottom up), kg·m: see floodWeightsFromResults. */
function freeSurfaceMoment(solid: Polyhedron, up: [number, number, number], permeability: number, layersIn: readonly LevelledLayer[]): number {
  const layers = layersIn.filter((l) => l.volumeM3 > 0);
  let fsm = 0;
  layers.forEach((l, i) => {
    const contrast = l.densityKgM3 - (layers[i + 1]?.densityKgM3 ?? 0);
    if (contrast <= 0) return;
    fsm += contrast * permeability * sectionMoments(planeSection(solid, up, l.levelElevationM), up).iAlongM4;
  });
  return fsm;
}

const uprightTables = new WeakMap<object, LevelTable>();
function uprightTable(geometry: object & Parameters<typeof compartmentSolid>[0]): LevelTable {
  let t = uprightTables.get(geometry);
  if (!t) uprightTables.set(geometry, (t = levelTable(geometry, UP)));
  return t;
}

/**
 * FloodWeights of liquids given by their volumes and their level planes at the attitude `up`
 * describes (a forecast's state at one moment). Each layer's weight acts where it would lie with the
 * ship upright on an even keel (its volume's slice of the solid, found again with the upright level
 * table: the exact volume below a plane), as the added-weight method places a weight; the liquid's
 * shift as she heels is taken by the free-surface correction alone, from the actual surface polygons
 * at `up` (ρ·μ·i_T, as floodWeightsFromResults), so it is never counted twice however far she has
 * already heeled. Units: kg, m, kg·m; volumes with permeability applied.
 *
 * A space open to the sea whose sea water (`sea` layers) carries lighter liquids of its own (a holed
 * fuel tank's oil) gets them as `kept`, with the depth of their underside below the outside
 * waterline at elevation `waterlineElevationM` (along `up`): they stay aboard as a weight, and only
 * the sea water is lost buoyancy. Without the waterline, or with no sea water in the space, the
 * space is taken as before (open: all of it lost buoyancy; no sea water: an added weight).
 */
export function floodWeightsAtLevels(
  survey: Survey,
  up: readonly [number, number, number],
  spaces: readonly { spaceId: string; permeability: number; openToSea: boolean; layers: readonly LevelledLayer[] }[],
  waterlineElevationM?: number,
): FloodWeight[] {
  const u: [number, number, number] = [up[0], up[1], up[2]];
  const compartments = new Map(survey.compartments.map((c) => [c.id, c]));
  const out: FloodWeight[] = [];
  for (const sp of spaces) {
    const comp = compartments.get(sp.spaceId);
    if (!comp) continue;
    const solid = solidOf(comp.geometry);
    const table = uprightTable(comp.geometry);
    const mu = sp.permeability > 0 ? sp.permeability : 1;
    let mass = 0, mx = 0, my = 0, mz = 0, cum = 0;
    let below = { volume: 0, mx: 0, my: 0, mz: 0 };
    for (const l of sp.layers) {
      if (!(l.volumeM3 > 0)) continue;
      cum += l.volumeM3;
      const v = volumeBelow(solid, UP, Math.min(levelOfVolume(table, cum / mu), table.top));
      const slice = v.volume - below.volume;
      const m = l.densityKgM3 * l.volumeM3;
      // a layer pressed up above the top of its space (into its pipes) sits at the top
      const c = slice > 1e-12 ? [(v.mx - below.mx) / slice, (v.my - below.my) / slice, (v.mz - below.mz) / slice] : [v.mx / Math.max(v.volume, 1e-12), v.my / Math.max(v.volume, 1e-12), table.top];
      mass += m;
      mx += m * c[0];
      my += m * c[1];
      mz += m * c[2];
      below = v;
    }
    if (!(mass > 0)) continue;
    const fsm = freeSurfaceMoment(solid, u, mu, sp.layers);
    const weight: FloodWeight = { spaceId: sp.spaceId, massKg: mass, x: mx / mass, y: my / mass, z: mz / mass, freeSurfaceMomentKgM2: fsm, openToSea: sp.openToSea };
    if (sp.openToSea && waterlineElevationM !== undefined) {
      const present = sp.layers.filter((l) => l.volumeM3 > 0);
      const lastSea = present.findLastIndex((l) => l.sea);
      const above = present.slice(lastSea + 1);
      if (lastSea < 0) {
        // no sea water inside: nothing is lost, the space's liquid is a weight like any other
        weight.openToSea = false;
      } else if (above.length > 0) {
        weight.kept = {
          massKg: above.reduce((a, l) => a + l.densityKgM3 * l.volumeM3, 0),
          volumeM3: above.reduce((a, l) => a + l.volumeM3, 0),
          interfaceDepthM: waterlineElevationM - present[lastSea].levelElevationM,
        };
      }
    }
    out.push(weight);
  }
  return out;
}

/** The condition with the drafts and heel of `attitude` (to compute levels and loads at it). */
export function conditionAtAttitude(condition: Condition, attitude: ShipAttitude): Condition {
  return {
    ...condition,
    drafts: { forwardM: attitude.draftForeM, aftM: attitude.draftAftM },
    heelDeg: attitude.heelDeg,
  };
}

