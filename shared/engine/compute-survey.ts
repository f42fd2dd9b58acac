/**
 * computeSurvey: the one entry point the app and the server call. Takes a parsed Survey
 * (SurveySchema) and returns plain-JSON results for one condition (the active one unless
 * options.conditionId is given). Pure and deterministic: no clock, no randomness, no I/O.
 */
import { catalogueFluid, crudeDensityFromApi, type FluidCategory } from '../fluids/catalogue';
import { CARGO_PERMEABILITY, defaultPermeability, PERMEABILITY_SOURCE } from '../schemas/space-types';
import type { Boundary, BoundarySide, Compartment, LevelSource, Survey } from '../schemas/survey';
import { earthFrame, HEEL_AGREEMENT_TOLERANCE_DEG, type EarthFrame } from './frame';
import { balanceOpenToSea, spaceInflow } from './flooding-space';
import { levelOfMouldedVolume, splitOwnLiquid, TANK_PERMEABILITY_SOURCE, tankFloodRoom, type TankRoom } from './tank-contents';
import { soundingEvidence } from './flooding-soundings';
import { timeToPumpOut } from './inflow';
import { missingShipReadings, withheldItems, withheldSentence } from './readings';
import {
  childAsHole,
  circlePlate,
  evalProfile,
  integratePlate,
  loadDiagram,
  newPlateIntegration,
  plateToShip,
  polygonPlate,
  newScratchPlate,
  polygonPlateXYZ,
  addPolygonStrips,
  RegionClip,
  stripsArea,
  stripsNetForce,
  zeroRegionStrips,
  type FlatPlate,
  type PartLoad,
  type PlateFrame,
  type PlateIntegration,
} from './plate';
import { compartmentSolidInto, elevationRangeFlat, newFlatSolid, volumeBelowFlat, type VolumeMoments } from './polyhedron';
import { constantProfile, differenceProfileInto, layeredProfile, type PressureProfile } from './profile';
import type {
  Aggregate,
  BoundaryResult,
  CompartmentResult,
  EngineWarning,
  FacetResult,
  InflowResult,
  LayerResult,
  NetResult,
  Point,
  Severity,
  ShoreResult,
  SideResult,
  SurveyResults,
  SurveySummary,
  BoundaryTable,
  BoundarySummary,
  CapacityResult,
  SurveyLevelResults,
  TankResult,
} from './results';
import { facetOrientation } from './facets';
import { newBoundaryTable, setBoundaryRow } from './boundary-table';
import { platingCheck } from './plating';
import { capacitiesOf, governingCapacity, governingRatingLean } from './ratings';
import { shoreResult, shoreUtilisation } from './shore-check';
import { plainLayout, platingPanels, stiffenedPlateLean, stiffenedPlateLoads, type StiffenerLayout } from './shore-stiffener';
import { add, cross, dot, fromPoint, norm, scale, sub, toPoint, unit, type V3 } from './vec';
import { ENGINE_VERSION } from './version';

export interface ComputeOptions {
  /** Condition to compute (default: survey.activeConditionId). */
  conditionId?: string;
  /**
   * Include each flat boundary's load diagram. Default false: a diagram is bulky (about a third of
   * a large vessel's results) and only the boundary being viewed needs one (computeBoundaryDetail).
   */
  includeLoadDiagrams?: boolean;
  /** Leave out the per-compartment inflow and pump-out figures (the forecast has its own). Default true. */
  includeInflow?: boolean;
}

interface ResolvedFluid {
  name: string;
  category: FluidCategory;
  densityKgM3: number;
}

const NULL_POINT_TOL = 1e-12;

/** One compartment's solid, and the volumes below the levels asked of it (prepareCondition's compartment loop). */
const scratchSolid = newFlatSolid();
const memoKeys: number[] = [];
const memoValues: VolumeMoments[] = [];
let memoCount = 0;

/**
 * Everything of one condition that the boundaries need: the earth frame, each compartment's
 * results and pressure profile, the flat plates of parents and their openings, and the warnings so
 * far. Built once per computation, whichever of the three entry points asked.
 */
function prepareCondition(survey: Survey, conditionIdIn: string | undefined, includeInflow = true) {
  const conditionId = conditionIdIn ?? survey.activeConditionId;
  const condition = survey.conditions.find((c) => c.id === conditionId);
  if (!condition) throw new Error(`computeSurvey: no condition with id ${conditionId}`);
  const warnings: EngineWarning[] = [];
  const warn = (code: string, severity: Severity, entityId: string | null, message: string) =>
    warnings.push({ code, severity, entityId, message });

  const frame = earthFrame(survey.vessel, condition);
  const { up, g } = frame;
  const fluids = fluidResolver(survey);
  const withheld = withheldItems(survey, condition);
  for (const w of [...withheld.compartments.values(), ...withheld.boundaries.values()]) warn('reading-missing', 'warning', w.entityId, withheldSentence(w));
  if (condition.heelDeg !== undefined && frame.heelFromDraftsDeg !== null && Math.abs(condition.heelDeg - frame.heelFromDraftsDeg) > HEEL_AGREEMENT_TOLERANCE_DEG) {
    warn(
      'heel-disagrees',
      'warning',
      condition.id,
      `The inclinometer reads ${condition.heelDeg.toFixed(1)}° but the midship drafts give ${frame.heelFromDraftsDeg.toFixed(1)}°, more than ${HEEL_AGREEMENT_TOLERANCE_DEG}° apart: check both (the loads use the inclinometer)`,
    );
  }

  // ---- compartments: contents, profiles, volumes
  const contentsById = new Map(condition.contents.map((c) => [c.compartmentId, c]));
  // only the pressure profiles outlive the compartment loop
  const profiles = new Map<string, PressureProfile>();
  const compartmentResults: CompartmentResult[] = [];
  const ship = { water: acc(), oil: acc(), other: acc(), own: acc(), all: acc() };
  let totalInflow = 0;
  let totalPumps = 0;

  for (const comp of survey.compartments) {
    if (withheld.compartments.has(comp.id)) continue;
    // the solid in scratch space: only this compartment's computation reads it
    const solid = compartmentSolidInto(comp.geometry, scratchSolid);
    const [eBottom, eTop] = elevationRangeFlat(solid, up);
    memoCount = 0;
    const below = (eta: number): VolumeMoments => {
      const key = eta <= eBottom ? -Infinity : eta >= eTop ? Infinity : eta;
      // (keys compared as a Map compares them: 0 and −0 alike, NaN equal to NaN)
      for (let i = 0; i < memoCount; i++) if (memoKeys[i] === key || (memoKeys[i] !== memoKeys[i] && key !== key)) return memoValues[i];
      const r = key === -Infinity ? { volume: 0, mx: 0, my: 0, mz: 0 } : volumeBelowFlat(solid, up, key);
      if (memoCount === memoKeys.length) {
        memoKeys.push(key);
        memoValues.push(r);
      } else {
        memoKeys[memoCount] = key;
        memoValues[memoCount] = r;
      }
      memoCount++;
      return r;
    };
    const gross = below(Infinity);
    const defaultPerm = defaultPermeability(comp.spaceType, comp.cargoState);
    const permeability = comp.permeability ?? defaultPerm.value;
    const permeabilitySource = comp.permeability !== undefined ? 'given by the surveyor' : defaultPerm.source;
    if (comp.permeability === undefined && CARGO_PERMEABILITY[comp.spaceType] && !comp.cargoState) {
      warn('cargo-state-unknown', 'info', comp.id, `${comp.name}: how loaded the space is was not given, so the loaded-space permeability ${defaultPerm.value.toFixed(2)} is used; empty it would be ${CARGO_PERMEABILITY[comp.spaceType]!.empty.toFixed(2)} (${PERMEABILITY_SOURCE})`);
    }
    const contents = contentsById.get(comp.id);
    // a tank's own liquid, told apart from flood water (tank-contents.ts)
    const tank = comp.spaceType === 'tank' ? comp.tankContents : undefined;
    const ownFluidId = tank && tank.state !== 'empty' ? tank.fluidId : undefined;
    const room = comp.spaceType === 'tank' ? tankFloodRoom(gross.volume, permeability, tank) : null;
    // open to the sea with no readings: sea water in balance, and a tank's own liquid (if not sea
    // water itself) as a layer of its stated volume, on top of the sea water or under it by density
    const ownLayer =
      !contents && comp.openToSea && ownFluidId && ownFluidId !== 'sea-water' && room && room.ownStatedM3 > 0
        ? { id: `${comp.id}-own`, fluidId: ownFluidId, level: { kind: 'point' as const, point: { x: 0, y: 0, z: 0 } } }
        : null;
    const seaLayer = { id: comp.id, fluidId: 'sea-water', densityKgM3: frame.seaDensityKgM3, level: { kind: 'openToSea' as const } };
    const ownBelowSea = ownLayer !== null && fluids(ownLayer.fluidId).densityKgM3 > frame.seaDensityKgM3;
    const layersIn: { id: string; fluidId: string; densityKgM3?: number; level: LevelSource }[] = contents
      ? contents.layers
      : comp.openToSea
        ? ownLayer
          ? ownBelowSea
            ? [ownLayer, seaLayer]
            : [seaLayer, ownLayer]
          : [seaLayer]
        : [];
    const pGas = contents?.gas?.kind === 'pressurised' ? contents.gas.gaugePressurePa : 0;

    const levels: { top: number; densityKgM3: number }[] = [];
    const layerResults: LayerResult[] = [];
    let prevTop = -Infinity;
    const liquid = acc();
    const centroidXY: V3 = gross.volume > 0 ? [gross.mx / gross.volume, gross.my / gross.volume, gross.mz / gross.volume] : [0, 0, 0];
    const densityOf = (layer: (typeof layersIn)[number]) =>
      layer.densityKgM3 ?? (layer.fluidId === 'sea-water' && !survey.fluids.some((f) => f.id === 'sea-water') ? frame.seaDensityKgM3 : fluids(layer.fluidId).densityKgM3);
    let tops = layersIn.map((layer) => levelElevation(layer.level, frame));
    if (ownLayer && room && permeability > 0) {
      // the own liquid's moulded volume, measured from the bottom (balanceOpenToSea keeps the
      // volume of a layer above the open one as entered, from the open one's entered top)
      const ownTop = levelOfMouldedVolume((eta) => below(eta).volume, [eBottom, eTop], room.ownStatedM3 / permeability);
      tops = ownBelowSea ? [ownTop, ownTop] : [eBottom, ownTop];
    }
    const open = layersIn.findIndex((l) => l.level.kind === 'openToSea');
    if (open >= 0) {
      // in balance with the sea at the opening, any oil or gas on top included
      const openings = (comp.breaches ?? []).map((b) => dot(up, fromPoint(b.position)));
      tops = balanceOpenToSea(tops, layersIn.map(densityOf), open, pGas, openings.length > 0 ? Math.min(...openings) : eBottom, [eBottom, eTop], (eta) => below(eta).volume, {
        up,
        waterlineElevationM: frame.waterlineElevation,
        seaDensityKgM3: frame.seaDensityKgM3,
        g,
      });
    }
    layersIn.forEach((layer, i) => {
      const fluid = fluids(layer.fluidId);
      const density = densityOf(layer);
      let top = tops[i];
      if (top < prevTop) {
        warn('level-order', 'warning', layer.id, `${comp.name}: layer ${i + 1} (${fluid.name}) has its surface below the layer beneath it; taken as empty`);
        top = prevTop;
      }
      if (i === layersIn.length - 1 && top > eTop + 1e-9) {
        warn('level-above-top', 'info', layer.id, `${comp.name}: liquid surface is ${(top - eTop).toFixed(3)} m above the compartment's highest point (pressed up into pipes or hatch coamings)`);
      }
      if (top < eBottom - 1e-9 && layer.level.kind !== 'openToSea') {
        warn('level-below-bottom', 'info', layer.id, `${comp.name}: layer ${i + 1} (${fluid.name}) surface is below the compartment bottom`);
      }
      const lv = layer.level;
      let levelRange: LayerResult['levelRange'] = null;
      if ((lv.kind === 'sounding' || lv.kind === 'interfaceSounding') && lv.soundingM === 0 && top > eBottom + 1e-9) {
        // a dry tape says only that the surface is at or below the pipe's bottom
        levelRange = { lowElevationM: Math.max(eBottom, prevTop), highElevationM: top };
        warn('sounding-zero', 'warning', layer.id, `${comp.name}: a zero sounding puts the ${fluid.name.toLowerCase()} surface at or below the pipe bottom, anywhere in the lowest ${(top - levelRange.lowElevationM).toFixed(2)} m of the space here; loads take it at the pipe bottom (the most liquid it can be)`);
      }
      levels.push({ top, densityKgM3: density });
      const hi = below(top), lo = i === 0 ? below(-Infinity) : below(prevTop);
      const vGeom = hi.volume - lo.volume;
      const vol = Math.max(0, vGeom * permeability);
      const c: Point | null = vGeom > 1e-12 ? { x: (hi.mx - lo.mx) / vGeom, y: (hi.my - lo.my) / vGeom, z: (hi.mz - lo.mz) / vGeom } : null;
      const mass = vol * density;
      layerResults.push({
        layerId: layer.id,
        fluidId: layer.fluidId,
        fluidName: fluid.name,
        category: fluid.category,
        densityKgM3: density,
        levelElevationM: top,
        levelPoint: toPoint(pointOnLevel(up, top, centroidXY[0], centroidXY[1])),
        levelRange,
        volumeM3: vol,
        massKg: mass,
        centroid: c,
        ownVolumeM3: 0,
      });
      if (c) addAcc(liquid, vol, mass, c);
      prevTop = Math.max(prevTop, top);
    });
    const split = splitOwnLiquid(layerResults, ownFluidId, room?.ownStatedM3 ?? 0);
    let ownV = 0, ownM = 0;
    layerResults.forEach((l, i) => {
      l.ownVolumeM3 = split.ownM3[i];
      const ownMass = l.volumeM3 > 0 ? (l.massKg * l.ownVolumeM3) / l.volumeM3 : 0;
      ownV += l.ownVolumeM3;
      ownM += ownMass;
      if (!l.centroid) return;
      addAcc(ship.all, l.volumeM3, l.massKg, l.centroid);
      if (l.ownVolumeM3 > 0) addAcc(ship.own, l.ownVolumeM3, ownMass, l.centroid);
      // flood water is what is not the tank's own; oil and other liquids are counted whole
      if (l.category === 'water') addAcc(ship.water, l.volumeM3 - l.ownVolumeM3, l.massKg - ownMass, l.centroid);
      else addAcc(l.category === 'oil' ? ship.oil : ship.other, l.volumeM3, l.massKg, l.centroid);
    });
    const tankResult = room
      ? tankResultOf({ comp, ownFluidName: ownFluidId ? fluids(ownFluidId).name : null, room, missingM3: split.missingM3, ownV, ownM, liquid, permeability, grossM3: gross.volume }, warn)
      : null;
    const profile = layeredProfile(levels, pGas, g);
    profiles.set(comp.id, profile);

    const inflow = !includeInflow ? null : compartmentInflow(comp, layerResults, pGas, frame, permeability, below, liquid.volume, warn);
    if (inflow) {
      totalInflow += inflow.inflowUsedM3S;
      totalPumps += inflow.pumpCapacityM3S;
    }
    const permeableVolume = gross.volume * permeability;
    compartmentResults.push({
      id: comp.id,
      name: comp.name,
      spaceType: comp.spaceType,
      permeability,
      permeabilitySource,
      grossVolumeM3: gross.volume,
      openToSea: comp.openToSea ?? false,
      gasGaugePressurePa: pGas,
      layers: layerResults,
      liquid: finishAcc(liquid),
      fillFraction: permeableVolume > 0 ? Math.min(1, liquid.volume / permeableVolume) : 0,
      inflow,
      tank: tankResult,
    });
  }

  // ---- boundaries
  const seaProfile = layeredProfile([{ top: frame.waterlineElevation, densityKgM3: frame.seaDensityKgM3 }], 0, g);
  const airProfile = constantProfile(0);
  const sideProfile = (s: BoundarySide): PressureProfile =>
    s.kind === 'sea' ? seaProfile : s.kind === 'air' ? airProfile : (profiles.get(s.compartmentId) ?? airProfile);

  // flat plates first, so children can be cut out of their parents
  // (only parents and their openings are built ahead; every other plate is built, used and dropped
  // in the main loop, so it never outlives a young-generation collection)
  const parentIds = new Set<string>();
  for (const b of survey.boundaries) if (b.parentBoundaryId) parentIds.add(b.parentBoundaryId);
  const plates = new Map<string, { plate: FlatPlate; pts: V3[] | null }>();
  // (with no openings, as in most surveys, the two passes below have nothing to do)
  for (const b of parentIds.size > 0 ? survey.boundaries : []) {
    const geom = b.geometry;
    if (geom.kind === 'faceted' || !(b.parentBoundaryId || parentIds.has(b.id))) continue;
    const built = buildFlat(geom, up, !!b.parentBoundaryId);
    if (built) plates.set(b.id, built);
  }
  const openings = new Map<string, string[]>();
  for (const b of parentIds.size > 0 ? survey.boundaries : []) {
    if (!b.parentBoundaryId) continue;
    const parent = plates.get(b.parentBoundaryId);
    const child = plates.get(b.id);
    if (!parent || !child) {
      warn('opening-not-excluded', 'info', b.id, `${b.name}: parent is not a flat plate; the parent is loaded over its full outline`);
      continue;
    }
    const size = Math.sqrt(Math.max(1e-12, Math.abs(parent.plate.vMax - parent.plate.vMin)));
    const hole = childAsHole(parent.plate, child.plate, child.pts, 1e-3 * Math.max(1, size));
    if (typeof hole === 'string') {
      warn('opening-not-excluded', 'info', b.id, `${b.name} ${hole}; the parent is loaded over its full outline, opening included`);
      continue;
    }
    parent.plate.region.push({ shape: hole, sign: -1 });
    const list = openings.get(b.parentBoundaryId) ?? [];
    list.push(b.id);
    openings.set(b.parentBoundaryId, list);
  }

  // the net profile of a boundary, merged into scratch space: valid until the next boundary's
  // (merging two short lists costs less than looking a shared one up)
  const scratchNet: PressureProfile = { breaks: [], a: [], b: [], liquidTop: -Infinity };
  const netProfile = (pa: PressureProfile, pb: PressureProfile): PressureProfile => differenceProfileInto(pa, pb, scratchNet);


  return { survey, condition, frame, up, g, warnings, warn, withheld, compartmentResults, ship, totalInflow, totalPumps, sideProfile, netProfile, plates, openings };
}

type Prepared = ReturnType<typeof prepareCondition>;

/** The full result of one boundary (load diagram when asked), or null when it has no area. */
function boundaryResultOf(p: Prepared, b: Boundary, withDiagram: boolean, warn: Warn): BoundaryResult | null {
  const pa = p.sideProfile(b.sideA), pb = p.sideProfile(b.sideB);
  const net = p.netProfile(pa, pb);
  return b.geometry.kind === 'faceted'
    ? facetedBoundary(b, b.geometry.facets.map((f) => f.vertices.map(fromPoint)), pa, pb, net, p.frame, warn)
    : flatBoundary(b, p.plates.get(b.id)?.plate ?? scratchFlat(b.geometry, p.up) ?? undefined, pa, pb, net, p.frame, p.openings.get(b.id) ?? [], withDiagram, warn);
}

/** Survey-level maximum utilisation and the over-capacity list and warnings, as boundaries are added. */
function utilisationTally(warn: Warn) {
  const t = {
    maxU: null as number | null,
    maxUId: null as string | null,
    over: [] as string[],
    add(id: string, name: string, u: number | null): void {
      if (u === null) return;
      if (t.maxU === null || u > t.maxU) {
        t.maxU = u;
        t.maxUId = id;
      }
      if (u > 1) {
        t.over.push(id);
        warn('over-capacity', 'danger', id, `${name}: utilisation ${(100 * u).toFixed(0)} % exceeds capacity`);
      }
    },
  };
  return t;
}

/** The survey-level parts shared by the full and the summary results. */
function surveyLevel(p: Prepared, tally: ReturnType<typeof utilisationTally>): SurveyLevelResults {
  const { ship, frame, condition, survey } = p;
  return {
    engineVersion: ENGINE_VERSION,
    surveyId: survey.id,
    conditionId: condition.id,
    conditionTime: condition.time,
    frame: {
      heelDeg: frame.heelDeg,
      trimDeg: frame.trimDeg,
      trimM: frame.trimM,
      heelSource: frame.heelSource,
      up: toPoint(frame.up),
      waterlinePoint: toPoint(frame.waterlinePoint),
      waterlineElevationM: frame.waterlineElevation,
      seaDensityKgM3: frame.seaDensityKgM3,
      gravityMS2: frame.g,
      missingReadings: missingShipReadings(condition),
    },
    compartments: p.compartmentResults,
    ship: { floodWater: finishAcc(ship.water), oil: finishAcc(ship.oil), other: finishAcc(ship.other), tankContents: finishAcc(ship.own), allLiquids: finishAcc(ship.all) },
    summary: {
      maxUtilisation: tally.maxU,
      maxUtilisationBoundaryId: tally.maxUId,
      overCapacityBoundaryIds: tally.over,
      totalInflowM3S: p.totalInflow,
      totalPumpCapacityM3S: p.totalPumps,
    },
    withheld: [...p.withheld.compartments.values(), ...p.withheld.boundaries.values()],
    warnings: p.warnings,
  };
}

/**
 * Full results of one condition: every compartment and every boundary with all its detail
 * (sides, net resultant and its parts, stiffeners, shores; load diagrams only when asked).
 * What the server stores and the desk compares. Units SI throughout (see results.ts).
 */
export function computeSurvey(survey: Survey, options: ComputeOptions = {}): SurveyResults {
  const p = prepareCondition(survey, options.conditionId, options.includeInflow !== false);
  const withDiagrams = options.includeLoadDiagrams === true;
  const tally = utilisationTally(p.warn);
  const boundaryResults: BoundaryResult[] = [];
  for (const b of survey.boundaries) {
    if (p.withheld.boundaries.has(b.id)) continue;
    const r = boundaryResultOf(p, b, withDiagrams, p.warn);
    if (!r) continue;
    boundaryResults.push(r);
    tally.add(b.id, b.name, r.maxUtilisation);
  }
  const level = surveyLevel(p, tally);
  return { ...level, boundaries: boundaryResults };
}

/**
 * The lean results a screen needs on every edit: the same survey-level figures, compartments,
 * totals, utilisations and warnings as computeSurvey, but each boundary as one flat row of
 * headline numbers (BoundarySummary) instead of its full detail, so a large vessel's results stay
 * small (no per-boundary points, parts, stiffener items or diagrams). Every number in it equals
 * the corresponding number of computeSurvey (summariseBoundary). For repeated computation
 * (forecasts, pumping plans) and the device's per-edit path; open one boundary's detail with
 * computeBoundaryDetail.
 */
export function computeSurveySummary(survey: Survey, options: Pick<ComputeOptions, 'conditionId' | 'includeInflow'> = {}): SurveySummary {
  const p = prepareCondition(survey, options.conditionId, options.includeInflow !== false);
  const tally = utilisationTally(p.warn);
  const table = newBoundaryTable(survey.boundaries.length);
  let k = 0;
  const withheld = p.withheld.boundaries, anyWithheld = withheld.size > 0, anyPlates = p.plates.size > 0;
  for (const b of survey.boundaries) {
    if (anyWithheld && withheld.has(b.id)) continue;
    let written: boolean;
    if (b.geometry.kind === 'faceted') {
      const r = boundaryResultOf(p, b, false, p.warn);
      if (r) setBoundaryRow(table, k, summariseBoundary(r, b));
      written = r !== null;
    } else {
      const pa = p.sideProfile(b.sideA), pb = p.sideProfile(b.sideB);
      const plate = (anyPlates ? p.plates.get(b.id)?.plate : undefined) ?? scratchFlat(b.geometry, p.up) ?? undefined;
      written = flatSummary(b, plate, pa, pb, p.netProfile(pa, pb), p.warn, table, k);
    }
    if (!written) continue;
    const u = table.maxUtilisation[k];
    tally.add(b.id, b.name, Number.isNaN(u) ? null : u);
    k++;
  }
  table.length = k;
  return { ...surveyLevel(p, tally), boundaries: table };
}

/**
 * One boundary in full, load diagram included, for the boundary being viewed: equal to its entry
 * in computeSurvey(survey, { includeLoadDiagrams: true }). Null when the boundary is unknown or
 * has no area.
 */
export function computeBoundaryDetail(survey: Survey, boundaryId: string, options: Pick<ComputeOptions, 'conditionId'> = {}): BoundaryResult | null {
  const b = survey.boundaries.find((x) => x.id === boundaryId);
  if (!b) return null;
  const p = prepareCondition(survey, options.conditionId);
  if (p.withheld.boundaries.has(b.id)) return null;
  return boundaryResultOf(p, b, true, () => {});
}

/**
 * A full boundary result reduced to its summary row (the desk shows stored full results in the
 * same table as the device's summaries). `b` gives the sides as the survey states them.
 */
export function summariseBoundary(r: BoundaryResult, b: Pick<Boundary, 'sideA' | 'sideB'>): BoundarySummary {
  const n = r.net, cop = n.centreOfPressure;
  return {
    id: r.id,
    name: r.name,
    kind: r.kind,
    geometryKind: r.geometryKind,
    parentBoundaryId: r.parentBoundaryId,
    sideA: b.sideA,
    sideB: b.sideB,
    areaM2: r.areaM2,
    forceN: n.forceN,
    resultantN: n.resultantN,
    forceX: n.forceVector.x,
    forceY: n.forceVector.y,
    forceZ: n.forceVector.z,
    copX: cop ? cop.x : null,
    copY: cop ? cop.y : null,
    copZ: cop ? cop.z : null,
    normalX: r.normal ? r.normal.x : null,
    normalY: r.normal ? r.normal.y : null,
    normalZ: r.normal ? r.normal.z : null,
    peakPressurePa: n.peak.pressurePa,
    signChange: n.signChange,
    capacityUtilisation: r.capacity ? r.capacity.utilisation : null,
    capacityDirection: r.capacity ? r.capacity.direction : null,
    capacityKind: r.capacity ? r.capacity.kind : null,
    capacityRated: r.capacity ? r.capacity.rated : null,
    capacityActual: r.capacity ? r.capacity.actual : null,
    stiffenerUtilisation: r.stiffeners ? r.stiffeners.maxUtilisation : null,
    platingUtilisation: r.plating ? r.plating.maxUtilisation : null,
    shoreUtilisation: maxShoreUtilisation(r.shores),
    maxUtilisation: r.maxUtilisation,
  };
}

function maxShoreUtilisation(shores: readonly ShoreResult[]): number | null {
  let m: number | null = null;
  for (let i = 0; i < shores.length; i++) m = maxOf(shores[i].utilisation, undefined, m);
  return m;
}


// ---------------------------------------------------------------- helpers

function fluidResolver(survey: Survey): (id: string) => ResolvedFluid {
  const overrides = new Map(survey.fluids.map((f) => [f.id, f]));
  return (id) => {
    const o = overrides.get(id);
    if (o) return { name: o.name, category: o.category, densityKgM3: o.densityKgM3 ?? crudeDensityFromApi(o.apiGravity ?? 30) };
    const c = catalogueFluid(id);
    if (c) return { name: c.name, category: c.category, densityKgM3: c.densityKgM3 };
    // the schema rejects unknown fluids; an unparsed document falls back to sea water
    return { name: id, category: 'other', densityKgM3: 1025 };
  };
}

/**
 * Elevation of a level surface from how it was read. Sounding pipes are taken as straight along
 * the ship's z axis, readings measured along the pipe: the surface passes through
 * (x, y, bottom + sounding); an ullage through (x, y, reference z − ullage).
 */
export function levelElevation(level: LevelSource, frame: EarthFrame): number {
  const up = frame.up;
  switch (level.kind) {
    case 'sounding':
    case 'interfaceSounding':
      // a missing reading withholds the compartment before this is reached; NaN if called on one
      return dot(up, [level.pipe.x, level.pipe.y, level.pipe.bottomZM + (level.soundingM ?? Number.NaN)]);
    case 'ullage':
      // a plumb tape hangs along earth-vertical; a tape along a pipe runs along the ship's z axis
      // and so reads long by 1 / cos of the inclination
      return level.tape === 'plumb'
        ? dot(up, fromPoint(level.reference)) - (level.ullageM ?? Number.NaN)
        : dot(up, [level.reference.x, level.reference.y, level.reference.z - (level.ullageM ?? Number.NaN)]);
    case 'openToSea':
      return frame.waterlineElevation;
    case 'point':
      return dot(up, fromPoint(level.point));
  }
}

/** The point at (x, y) whose elevation is eta. */
function pointOnLevel(up: V3, eta: number, x: number, y: number): V3 {
  return [x, y, (eta - up[0] * x - up[1] * y) / up[2]];
}

interface Acc {
  volume: number;
  mass: number;
  mx: number;
  my: number;
  mz: number;
}
const acc = (): Acc => ({ volume: 0, mass: 0, mx: 0, my: 0, mz: 0 });
/** Mass-weighted centroid accumulation (the ship's centre of liquid mass). */
function addAcc(a: Acc, vol: number, mass: number, c: Point): void {
  a.volume += vol;
  a.mass += mass;
  a.mx += mass * c.x;
  a.my += mass * c.y;
  a.mz += mass * c.z;
}
function finishAcc(a: Acc): Aggregate {
  return {
    volumeM3: a.volume,
    massKg: a.mass,
    centroid: a.mass > 0 ? { x: a.mx / a.mass, y: a.my / a.mass, z: a.mz / a.mass } : null,
  };
}

/**
 * A tank's own liquid and its flood water apart, with the notes that keep the split honest: a tank
 * whose contents were not stated is taken as empty (flood water may take μ of it, the more severe
 * of SOLAS's 0 or 0.95), stated liquid that is not found, flood water beyond the room the tank's
 * own liquid leaves, and a permeability of 0 that leaves its own liquid no volume.
 */
function tankResultOf(
  t: { comp: Compartment; ownFluidName: string | null; room: TankRoom; missingM3: number; ownV: number; ownM: number; liquid: Acc; permeability: number; grossM3: number },
  warn: Warn,
): TankResult {
  const { comp, room } = t;
  const tank = comp.tankContents;
  const floodV = Math.max(0, t.liquid.volume - t.ownV);
  const tol = 1e-6 * Math.max(1, t.permeability * (room.ownStatedM3 + room.floodRoomM3));
  if (!tank && (comp.openToSea || (comp.breaches ?? []).length > 0)) {
    warn('tank-contents-unknown', 'info', comp.id, `${comp.name}: its own liquid was not stated, so it is taken as empty and flood water may take ${t.permeability.toFixed(2)} of it; full of its own liquid it would take none (${TANK_PERMEABILITY_SOURCE})`);
  }
  if (comp.permeability === 0 && tank && tank.state !== 'empty') {
    warn('tank-permeability-zero', 'warning', comp.id, `${comp.name}: permeability 0 leaves its own liquid no volume; leave the permeability empty for a full tank (flood water then gets no room by its contents)`);
  }
  const capacity = t.permeability * t.grossM3;
  if (tank?.state === 'part-full' && (tank.volumeM3 ?? 0) > capacity + tol) {
    warn('tank-volume-over-capacity', 'warning', comp.id, `${comp.name}: its own liquid is stated as ${formatM3(tank.volumeM3 ?? 0)}, more than the ${formatM3(capacity)} it holds (${t.permeability.toFixed(2)} of ${formatM3(t.grossM3)}); taken as full`);
  }
  if (t.missingM3 > Math.max(tol, 0.02 * room.ownStatedM3)) {
    warn('tank-own-missing', 'warning', comp.id, `${comp.name}: ${formatM3(t.missingM3)} of its own ${t.ownFluidName?.toLowerCase() ?? 'liquid'} stated is not in the readings (gone to the sea or elsewhere, or the stated contents are wrong)`);
  }
  if (floodV > room.floodRoomM3 + Math.max(tol, 0.02 * (room.ownStatedM3 + room.floodRoomM3))) {
    warn('tank-flood-beyond-room', 'warning', comp.id, `${comp.name}: the readings show ${formatM3(floodV)} of flood water, more than the ${formatM3(room.floodRoomM3)} its own liquid leaves room for: some of its own liquid has gone, or the stated contents are wrong`);
  }
  const ownMissing = t.missingM3 > tol ? t.missingM3 : 0;
  return {
    state: tank?.state ?? 'not-stated',
    ownFluidId: tank && tank.state !== 'empty' ? (tank.fluidId ?? null) : null,
    ownFluidName: t.ownFluidName,
    ownStatedM3: room.ownStatedM3,
    ownVolumeM3: t.ownV,
    ownMassKg: t.ownM,
    ownMissingM3: ownMissing,
    floodVolumeM3: floodV,
    floodMassKg: Math.max(0, t.liquid.mass - t.ownM),
    floodRoomM3: room.floodRoomM3,
    floodPermeability: room.floodPermeability,
    source: tank ? TANK_PERMEABILITY_SOURCE : `${TANK_PERMEABILITY_SOURCE}; its own liquid not stated, taken as empty`,
  };
}

const formatM3 = (v: number): string => `${v < 10 ? v.toFixed(2) : v.toFixed(1)} m³`;

function compartmentInflow(
  comp: Compartment,
  layers: readonly LayerResult[],
  pGas: number,
  frame: EarthFrame,
  permeability: number,
  below: (eta: number) => VolumeMoments,
  liquidVolume: number,
  warn: (code: string, s: Severity, id: string | null, m: string) => void,
): InflowResult | null {
  const breaches = comp.breaches ?? [];
  const pumps = (comp.pumps ?? []).filter((p) => p.running !== false);
  if (breaches.length === 0 && pumps.length === 0 && !comp.soundingLog) return null;
  const rhoSea = frame.seaDensityKgM3;
  const profile = layeredProfile(layers.map((l) => ({ top: l.levelElevationM, densityKgM3: l.densityKgM3 })), pGas, frame.g);
  // the flooding model's orifice law: the fluid present upstream flows, over the opening's height
  const now = spaceInflow(
    comp,
    { up: frame.up, waterlineElevationM: frame.waterlineElevation, seaDensityKgM3: rhoSea, g: frame.g },
    permeability,
    layers.map((l) => ({ fluidId: l.fluidId, name: l.fluidName, category: l.category, densityKgM3: l.densityKgM3, volumeM3: l.volumeM3 })),
    pGas,
  );
  const out: InflowResult['breaches'] = breaches.map((br, i) => {
    const e = dot(frame.up, fromPoint(br.position));
    const pOut = rhoSea * frame.g * Math.max(0, frame.waterlineElevation - e);
    return { id: br.id, headM: (pOut - evalProfile(profile, e)) / (rhoSea * frame.g), flowM3S: now.breaches[i].flowM3S };
  });
  const orifice = now.orificeInflowM3S;
  const evidence = soundingEvidence(comp, (soundingM) => {
    const log = comp.soundingLog!;
    return below(dot(frame.up, [log.pipe.x, log.pipe.y, log.pipe.bottomZM + soundingM])).volume * permeability;
  }, orifice);
  const measured: InflowResult['measured'] = evidence
    ? {
        inflowM3S: evidence.grossInflowM3S,
        netRiseM3S: evidence.netRiseM3S,
        r2: evidence.r2,
        readings: evidence.readings,
        ratio: evidence.ratio,
        disagree: evidence.disagree,
      }
    : null;
  const pumpCapacity = pumps.reduce((s, p) => s + p.capacityM3S, 0);
  const inflowUsed = measured ? measured.inflowM3S : orifice;
  // with breaches the inflow grows as the level falls: the model's run; with only a measured rate, that rate held
  const t = breaches.length > 0 ? now.timeToPumpOutS : timeToPumpOut(liquidVolume, pumpCapacity, inflowUsed);
  if (pumpCapacity > 0 && t === null) {
    warn('pumps-behind', 'danger', comp.id, `${comp.name}: pumps (${(pumpCapacity * 3600).toFixed(0)} m³/h) do not pump the space out against the inflow (${(inflowUsed * 3600).toFixed(0)} m³/h now)`);
  }
  if (evidence?.disagree) {
    warn('inflow-disagrees', 'warning', comp.id, `${comp.name}: the soundings show ${(evidence.grossInflowM3S * 3600).toFixed(0)} m³/h coming in, the breaches entered explain ${(orifice * 3600).toFixed(0)} m³/h: an unknown breach, or a wrong area`);
  }
  return {
    breaches: out,
    orificeInflowM3S: orifice,
    measured,
    pumpCapacityM3S: pumpCapacity,
    inflowUsedM3S: inflowUsed,
    netRemovalM3S: pumpCapacity - inflowUsed,
    timeToPumpOutS: t,
  };
}

const rectXYZ = new Float64Array(12);

/** A rectangle's corners o, o + eu, (o + eu) + ev, o + ev as x, y, z triples (scratch). */
function rectangleXYZ(geom: Extract<Boundary['geometry'], { kind: 'rectangle' }>): Float64Array {
  const o = geom.origin, eu = geom.edgeU, ev = geom.edgeV;
  const ax = o.x + eu.x, ay = o.y + eu.y, az = o.z + eu.z;
  const r = rectXYZ;
  r[0] = o.x; r[1] = o.y; r[2] = o.z;
  r[3] = ax; r[4] = ay; r[5] = az;
  r[6] = ax + ev.x; r[7] = ay + ev.y; r[8] = az + ev.z;
  r[9] = o.x + ev.x; r[10] = o.y + ev.y; r[11] = o.z + ev.z;
  return r;
}

/**
 * The flat plate of a boundary, and its 3D outline when `withOutline` (needed only to cut a child
 * out of its parent).
 */
function buildFlat(geom: Exclude<Boundary['geometry'], { kind: 'faceted' }>, up: V3, withOutline: boolean): { plate: FlatPlate; pts: V3[] | null } | null {
  switch (geom.kind) {
    case 'polygon': {
      const pts = geom.vertices.map(fromPoint);
      return { plate: polygonPlate(pts, up), pts };
    }
    case 'rectangle': {
      const r = rectangleXYZ(geom);
      const pts: V3[] | null = withOutline ? [[r[0], r[1], r[2]], [r[3], r[4], r[5]], [r[6], r[7], r[8]], [r[9], r[10], r[11]]] : null;
      return { plate: polygonPlateXYZ(r, 4, up), pts };
    }
    case 'circle':
      if (norm(fromPoint(geom.normal)) === 0) return null;
      return { plate: circlePlate(fromPoint(geom.centre), fromPoint(geom.normal), geom.radiusM, up), pts: null };
  }
}

const scratchPolygon = newScratchPlate('polygon');
const scratchCircle = newScratchPlate('circle');

/**
 * The flat plate of a boundary built into scratch space (valid until the next call): for the
 * plates the main loop builds, uses and drops. Null for a circle with no normal.
 */
function scratchFlat(geom: Exclude<Boundary['geometry'], { kind: 'faceted' }>, up: V3): FlatPlate | null {
  switch (geom.kind) {
    case 'polygon': {
      const v = geom.vertices;
      if (polyXYZ.length < 3 * v.length) polyXYZ = new Float64Array(6 * v.length);
      for (let i = 0; i < v.length; i++) {
        polyXYZ[3 * i] = v[i].x;
        polyXYZ[3 * i + 1] = v[i].y;
        polyXYZ[3 * i + 2] = v[i].z;
      }
      return polygonPlateXYZ(polyXYZ, v.length, up, scratchPolygon);
    }
    case 'rectangle':
      return polygonPlateXYZ(rectangleXYZ(geom), 4, up, scratchPolygon);
    case 'circle': {
      const nm = geom.normal;
      if (Math.sqrt(nm.x * nm.x + nm.y * nm.y + nm.z * nm.z) === 0) return null;
      setV3(circleC, geom.centre.x, geom.centre.y, geom.centre.z);
      setV3(circleN, nm.x, nm.y, nm.z);
      return circlePlate(circleC, circleN, geom.radiusM, up, scratchCircle);
    }
  }
}
let polyXYZ = new Float64Array(48);
const circleC: V3 = [0, 0, 0];
const circleN: V3 = [0, 0, 0];
function setV3(a: V3, x: number, y: number, z: number): void {
  a[0] = x;
  a[1] = y;
  a[2] = z;
}

function sideResult(side: BoundarySide, profile: PressureProfile, forceN: number, peak: number, wetted: number): SideResult {
  return {
    kind: side.kind,
    compartmentId: side.kind === 'compartment' ? side.compartmentId : null,
    forceN,
    peakPressurePa: peak,
    wettedAreaM2: wetted,
    liquidTopElevationM: Number.isFinite(profile.liquidTop) ? profile.liquidTop : null,
  };
}

/** Plate-axes point (u, v) to a ship-axes result point (the arithmetic of plateToShip, without the tuple). */
function platePoint(fr: PlateFrame, u: number, v: number): Point {
  const o = fr.origin, U = fr.u, W = fr.v;
  return { x: o[0] + u * U[0] + v * W[0], y: o[1] + u * U[1] + v * W[1], z: o[2] + u * U[2] + v * W[2] };
}

/** Direction of the earth-horizontal part of (fx, fy, fz), or null if it has none. */
function horizontalDirection(fx: number, fy: number, fz: number, up: V3, vertical: number, hn: number): Point | null {
  const fn = Math.sqrt(fx * fx + fy * fy + fz * fz);
  if (!(hn > NULL_POINT_TOL * Math.max(1, fn))) return null;
  const k = 1 / hn;
  return { x: (fx - up[0] * vertical) * k, y: (fy - up[1] * vertical) * k, z: (fz - up[2] * vertical) * k };
}

function horizontalMagnitude(fx: number, fy: number, fz: number, up: V3, vertical: number): number {
  const hx = fx - up[0] * vertical, hy = fy - up[1] * vertical, hz = fz - up[2] * vertical;
  return Math.sqrt(hx * hx + hy * hy + hz * hz);
}

/** Earth split of a force vector (faceted surfaces). */
function earthSplit(F: V3, up: V3): Pick<NetResult, 'verticalN' | 'horizontalN' | 'horizontalDirection'> {
  const vertical = dot(F, up);
  const hn = horizontalMagnitude(F[0], F[1], F[2], up, vertical);
  return { verticalN: vertical, horizontalN: hn, horizontalDirection: horizontalDirection(F[0], F[1], F[2], up, vertical, hn) };
}

/**
 * The two sides nearly cancel when the net force is under 2 % of the larger side's own force
 * (common practice, no source): the centre of pressure then lies far off the plate and means
 * nothing, so the load is given as the net force and a couple.
 */
export const CANCEL_FRACTION = 0.02;
function nearlyCancels(net: number, sideA: number, sideB: number): boolean {
  const larger = Math.max(Math.abs(sideA), Math.abs(sideB));
  return larger > 0 && Math.abs(net) < CANCEL_FRACTION * larger;
}
function warnCancels(b: Boundary, f: number, couple: number, warn: Warn): void {
  warn('net-cancels', 'warning', b.id, `${b.name}: the two sides nearly cancel (net ${(f / 1000).toFixed(1)} kN); the load is a couple of ${(couple / 1000).toFixed(1)} kN·m about the plate's centroid, not a force at a point`);
}

function flatNet(b: Boundary, plate: FlatPlate, it: PlateIntegration, up: V3, warn: Warn): NetResult {
  const fr = plate.frame;
  const n = fr.n;
  const F = it.netForceN;
  const cancels = nearlyCancels(F, it.sideForceA, it.sideForceB);
  // moment about the centroid: −(Mu − F cu) v + (Mv − F cv) u (u × n = −v, v × n = u)
  const couple = Math.hypot(it.netMomentU - F * it.centroidU, it.netMomentV - F * it.centroidV);
  if (cancels) warnCancels(b, F, couple, warn);
  const fx = n[0] * F, fy = n[1] * F, fz = n[2] * F;
  const vertical = fx * up[0] + fy * up[1] + fz * up[2];
  const hn = horizontalMagnitude(fx, fy, fz, up, vertical);
  const hasCop = F !== 0 && !cancels;
  const cu = it.netMomentU / F, cv = it.netMomentV / F;
  const useMin = Math.abs(it.peakMinPa) > Math.abs(it.peakMaxPa);
  return {
    forceN: F,
    referenceDirection: { x: n[0], y: n[1], z: n[2] },
    nearlyCancels: cancels,
    coupleNm: cancels ? couple : null,
    resultantN: Math.abs(F),
    forceVector: { x: fx, y: fy, z: fz },
    verticalN: vertical,
    horizontalN: hn,
    horizontalDirection: horizontalDirection(fx, fy, fz, up, vertical, hn),
    centreOfPressure: hasCop ? platePoint(fr, cu, cv) : null,
    centreOfPressurePlate: hasCop ? { u: cu, v: cv } : null,
    centreOfPressureAboveLowestM: hasCop ? fr.k * (cv - plate.vMin) : null,
    lineOfAction: hasCop
      ? { point: platePoint(fr, cu, cv), direction: F >= 0 ? { x: n[0], y: n[1], z: n[2] } : { x: n[0] * -1, y: n[1] * -1, z: n[2] * -1 } }
      : null,
    residualMomentNm: 0,
    positive: partResult(fr, it.positive),
    negative: partResult(fr, it.negative),
    signChange: it.positive.forceN !== 0 && it.negative.forceN !== 0,
    peak: useMin
      ? { pressurePa: it.peakMinPa, point: platePoint(fr, it.peakMinU, it.peakMinV) }
      : { pressurePa: it.peakMaxPa, point: platePoint(fr, it.peakMaxU, it.peakMaxV) },
    maxPressurePa: it.peakMaxPa,
    minPressurePa: it.peakMinPa,
  };
}

function partResult(fr: PlateFrame, p: PartLoad): NetResult['positive'] {
  return { forceN: p.forceN, areaM2: p.areaM2, centreOfPressure: p.forceN !== 0 ? platePoint(fr, p.copU, p.copV) : null };
}

/** Reused by every flat boundary: its numbers are copied into the results before the next one. */
const scratchIntegration = newPlateIntegration();

type Warn = (code: string, s: Severity, id: string | null, m: string) => void;

/**
 * Integrates a flat boundary into the shared scratch integration (returned), with the plate's
 * warnings. Null when the plate has no area.
 */
function flatIntegration(
  b: Boundary,
  plate: FlatPlate | undefined,
  pa: PressureProfile,
  pb: PressureProfile,
  net: PressureProfile,
  warn: Warn,
): PlateIntegration | null {
  if (!plate) {
    warn('degenerate', 'warning', b.id, `${b.name}: the plate has no area (zero normal); not computed`);
    return null;
  }
  const size = Math.max(plate.vMax - plate.vMin, 1e-9);
  if (plate.planarityErrorM > 1e-3 * size && plate.planarityErrorM > 1e-4) {
    warn('non-planar', 'warning', b.id, `${b.name}: vertices stray up to ${(plate.planarityErrorM * 1000).toFixed(1)} mm from the mean plane; loads are for that plane (model it as faceted if it is curved)`);
  }
  const it = integratePlate(plate, pa, pb, net, scratchIntegration);
  if (it.areaM2 <= 0) {
    warn('degenerate', 'warning', b.id, `${b.name}: the plate has no area (self-intersecting or collinear vertices); not computed`);
    return null;
  }
  if (it.positive.forceN !== 0 && it.negative.forceN !== 0) {
    warn('sign-change', 'info', b.id, `${b.name}: net pressure reverses across the plate (${(it.positive.forceN / 1000).toFixed(1)} kN towards side B, ${(-it.negative.forceN / 1000).toFixed(1)} kN towards side A)`);
  }
  return it;
}

/** Net pressure of largest magnitude on a flat plate (the minimum when it is larger in magnitude). */
const peakOf = (it: PlateIntegration): number => (Math.abs(it.peakMinPa) > Math.abs(it.peakMaxPa) ? it.peakMinPa : it.peakMaxPa);

/**
 * The structural checks of a flat boundary: ratings, stiffeners, plating, shores, and the largest
 * utilisation. `net` needs only the figures the ratings read.
 */
function flatChecks(b: Boundary, plate: FlatPlate, it: PlateIntegration, net: PressureProfile, netRes: Parameters<typeof capacitiesOf>[1], warn: Warn) {
  const stiffened = b.stiffening ? stiffenedPlateLoads(b, plate, net, it.cuts, warn) : null;
  const stiffeners = stiffened ? stiffened.stiffeners : null;
  const hasShores = !!b.shores && b.shores.length > 0;
  const shores = stiffened?.shores ?? (hasShores ? shoreLoads(b, plate, net, it.cuts, warn) : []);
  const structureModel = stiffened?.shores ? stiffeners!.model : hasShores ? SHORES_ONLY_MODEL_WORDS : stiffeners ? stiffeners.model : null;
  const plating = b.plating ? platingCheck(b.plating, platingPanels(plate, net, it.cuts, stiffened?.layout ?? plainLayout(plate))) : null;
  if (plating && plating.maxUtilisation !== null && plating.maxUtilisation > 1) warnPlating(b, plating.maxUtilisation, !!stiffened?.layout, warn);
  const capacities = capacitiesOf(b, netRes);
  const capacity = governingCapacity(capacities);
  let maxU = maxOf(capacity ? capacity.utilisation : undefined, stiffeners?.maxUtilisation ?? undefined, null);
  maxU = maxOf(plating?.maxUtilisation ?? undefined, undefined, maxU);
  for (let i = 0; i < shores.length; i++) maxU = maxOf(shores[i].utilisation, undefined, maxU);
  return { stiffeners, plating, shores, structureModel, capacities, capacity, maxU };
}

/** What the summary keeps of a flat boundary's checks (flatChecksLean); null where the full result has none. */
const leanChecks = { capacity: null as number | null, rating: null as Readonly<CapacityResult> | null, stiffeners: null as number | null, plating: null as number | null, shores: null as number | null, maxU: null as number | null };
/** Each shore's utilisation, in the order of b.shores, for the boundary being summarised. */
let shoreU = new Float64Array(8);

/**
 * flatChecks for the summary: the same checks, warnings (in the same order) and utilisations,
 * without building the stiffener items or shore results. Fills leanChecks.
 */
function flatChecksLean(b: Boundary, plate: FlatPlate, it: PlateIntegration, net: PressureProfile, peak: number, warn: Warn): typeof leanChecks {
  const nS = b.shores ? b.shores.length : 0;
  if (shoreU.length < nS) shoreU = new Float64Array(2 * nS);
  let stiffenerU: number | null = null;
  let layout: StiffenerLayout | null = null;
  let carried = false;
  if (b.stiffening) {
    const lean = stiffenedPlateLean(b, plate, net, it.cuts, warn, shoreU, !!b.plating);
    stiffenerU = lean.maxUtilisation;
    carried = lean.carriesShores;
    layout = lean.layout;
  }
  if (!carried && nS > 0) shoreCells(b, plate, net, it.cuts, warn, null);
  const plating = b.plating ? platingCheck(b.plating, platingPanels(plate, net, it.cuts, layout ?? plainLayout(plate))) : null;
  if (plating && plating.maxUtilisation !== null && plating.maxUtilisation > 1) warnPlating(b, plating.maxUtilisation, layout !== null, warn);
  const F = it.netForceN;
  const rating = governingRatingLean(b, F, Math.abs(F), it.peakMaxPa, it.peakMinPa, peak);
  const capacity = rating ? rating.utilisation : null;
  let maxU = maxOf(capacity ?? undefined, stiffenerU ?? undefined, null);
  maxU = maxOf(plating?.maxUtilisation ?? undefined, undefined, maxU);
  let shoreMax: number | null = null;
  for (let i = 0; i < nS; i++) {
    maxU = maxOf(shoreU[i], undefined, maxU);
    shoreMax = maxOf(shoreU[i], undefined, shoreMax);
  }
  leanChecks.capacity = capacity;
  leanChecks.rating = rating;
  leanChecks.stiffeners = stiffenerU;
  leanChecks.plating = plating ? plating.maxUtilisation : null;
  leanChecks.shores = shoreMax;
  leanChecks.maxU = maxU;
  return leanChecks;
}

function warnPlating(b: Boundary, u: number, betweenStiffeners: boolean, warn: Warn): void {
  warn('plating-overstressed', 'danger', b.id, `${b.name}: plating ${betweenStiffeners ? 'between stiffeners' : '(the whole plate as one panel)'} bent to ${(100 * u).toFixed(0)} % of its allowable stress`);
}

function flatBoundary(
  b: Boundary,
  plateIn: FlatPlate | undefined,
  pa: PressureProfile,
  pb: PressureProfile,
  net: PressureProfile,
  frame: EarthFrame,
  openingIds: string[],
  withDiagram: boolean,
  warn: Warn,
): BoundaryResult | null {
  const it = flatIntegration(b, plateIn, pa, pb, net, warn);
  if (!it) return null;
  const plate = plateIn!;
  const netRes = flatNet(b, plate, it, frame.up, warn);
  const { stiffeners, plating, shores, structureModel, capacities, capacity, maxU } = flatChecks(b, plate, it, net, netRes, warn);
  const fr = plate.frame;
  const n = fr.n;
  return {
    id: b.id,
    name: b.name,
    kind: b.kind,
    geometryKind: b.geometry.kind,
    parentBoundaryId: b.parentBoundaryId ?? null,
    areaM2: it.areaM2,
    normal: { x: n[0], y: n[1], z: n[2] },
    centroid: platePoint(fr, it.centroidU, it.centroidV),
    plateAxes: { origin: toPoint(fr.origin), u: toPoint(fr.u), v: toPoint(fr.v) },
    openingsExcluded: openingIds,
    sideA: sideResult(b.sideA, pa, it.sideForceA, it.sidePeakA, it.sideWettedA),
    sideB: sideResult(b.sideB, pb, it.sideForceB, it.sidePeakB, it.sideWettedB),
    net: netRes,
    loadDiagram: withDiagram ? loadDiagram(plate, net, it.cuts) : [],
    facets: null,
    reversedFacets: [],
    stiffeners,
    plating,
    shores,
    structureModel,
    capacity,
    capacities,
    maxUtilisation: maxU,
  };
}

/**
 * A flat boundary's summary written into row k of the table straight from its integration (the
 * same arithmetic as flatNet and platePoint, without building the full result's objects). False
 * when the plate has no area.
 */
function flatSummary(
  b: Boundary,
  plateIn: FlatPlate | undefined,
  pa: PressureProfile,
  pb: PressureProfile,
  net: PressureProfile,
  warn: Warn,
  t: BoundaryTable,
  k: number,
): boolean {
  const it = flatIntegration(b, plateIn, pa, pb, net, warn);
  if (!it) return false;
  const plate = plateIn!;
  const F = it.netForceN;
  const peak = peakOf(it);
  // As flatNet (and in its order, before the checks' warnings): when the two sides nearly cancel the load is a couple, with no point of action.
  const cancels = nearlyCancels(F, it.sideForceA, it.sideForceB);
  if (cancels) warnCancels(b, F, Math.hypot(it.netMomentU - F * it.centroidU, it.netMomentV - F * it.centroidV), warn);
  const checks = flatChecksLean(b, plate, it, net, peak, warn);
  const fr = plate.frame, n = fr.n, o = fr.origin, U = fr.u, W = fr.v;
  const hasCop = F !== 0 && !cancels;
  const cu = it.netMomentU / F, cv = it.netMomentV / F;
  t.id[k] = b.id;
  t.name[k] = b.name;
  t.kind[k] = b.kind;
  t.geometryKind[k] = b.geometry.kind;
  t.parentBoundaryId[k] = b.parentBoundaryId ?? null;
  t.sideA[k] = b.sideA;
  t.sideB[k] = b.sideB;
  t.areaM2[k] = it.areaM2;
  t.forceN[k] = F;
  t.resultantN[k] = Math.abs(F);
  t.forceX[k] = n[0] * F;
  t.forceY[k] = n[1] * F;
  t.forceZ[k] = n[2] * F;
  t.copX[k] = hasCop ? o[0] + cu * U[0] + cv * W[0] : NaN;
  t.copY[k] = hasCop ? o[1] + cu * U[1] + cv * W[1] : NaN;
  t.copZ[k] = hasCop ? o[2] + cu * U[2] + cv * W[2] : NaN;
  t.normalX[k] = n[0];
  t.normalY[k] = n[1];
  t.normalZ[k] = n[2];
  t.peakPressurePa[k] = peak;
  t.signChange[k] = it.positive.forceN !== 0 && it.negative.forceN !== 0 ? 1 : 0;
  t.capacityUtilisation[k] = checks.capacity ?? NaN;
  const rating = checks.rating;
  t.capacityDirection[k] = rating ? rating.direction : null;
  t.capacityKind[k] = rating ? rating.kind : null;
  t.capacityRated[k] = rating ? rating.rated : NaN;
  t.capacityActual[k] = rating ? rating.actual : NaN;
  t.stiffenerUtilisation[k] = checks.stiffeners ?? NaN;
  t.platingUtilisation[k] = checks.plating ?? NaN;
  t.shoreUtilisation[k] = checks.shores ?? NaN;
  t.maxUtilisation[k] = checks.maxU ?? NaN;
  return true;
}

/** Largest finite value among x, y and m (null when none). */
function maxOf(x: number | undefined, y: number | undefined, m: number | null): number | null {
  if (x !== undefined && Number.isFinite(x) && (m === null || x > m)) m = x;
  if (y !== undefined && Number.isFinite(y) && (m === null || y > m)) m = y;
  return m;
}

/**
 * Shore loads on a plate without stiffeners. Rule: each shore carries the net pressure on the part
 * of the plate nearer to it than to any other shore (nearest-shore, i.e. Voronoi, tributary areas,
 * cut exactly with half-planes), and the plate's edges are assumed to carry nothing, which errs on
 * the safe side for the shores. Circles are taken as inscribed 512-gons for this partition only.
 */
export const SHORES_ONLY_MODEL_WORDS =
  'Each shore carries the net pressure on the part of the plate nearer to it than to any other shore; the plate\'s edges are taken to carry nothing (on the safe side for the shores).';

function shoreLoads(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn): ShoreResult[] {
  const out: ShoreResult[] = [];
  shoreCells(b, plate, net, cuts, warn, out);
  return out;
}

const cellClip = new RegionClip();
let cellU = new Float64Array(8), cellV = new Float64Array(8);

/**
 * Each shore's nearest-shore cell, cut from the plate's region with half-planes, and its net force:
 * the shore results pushed to `out`, or (out null) only their utilisations written to shoreU.
 */
function shoreCells(b: Boundary, plate: FlatPlate, net: PressureProfile, cuts: readonly number[], warn: Warn, out: ShoreResult[] | null): void {
  const shores = b.shores!;
  const n = shores.length;
  const fr = plate.frame, o = fr.origin, U = fr.u, V = fr.v;
  if (cellU.length < n) {
    cellU = new Float64Array(2 * n);
    cellV = new Float64Array(2 * n);
  }
  for (let i = 0; i < n; i++) {
    const p = shores[i].position;
    const dx = p.x - o[0], dy = p.y - o[1], dz = p.z - o[2];
    cellU[i] = dx * U[0] + dy * U[1] + dz * U[2];
    cellV[i] = dx * V[0] + dy * V[1] + dz * V[2];
  }
  for (let i = 0; i < n; i++) {
    const strips = zeroRegionStrips(cuts);
    for (let r = 0; r < plate.region.length; r++) {
      cellClip.start(plate.region[r].shape);
      for (let j = 0; j < n && cellClip.len > 0; j++) {
        if (j === i) continue;
        const ax = cellU[j] - cellU[i], ay = cellV[j] - cellV[i];
        if (ax === 0 && ay === 0) continue;
        const c = (ax * (cellU[i] + cellU[j])) / 2 + (ay * (cellV[i] + cellV[j])) / 2;
        cellClip.clip(ax, ay, c);
      }
      if (cellClip.len > 0) addPolygonStrips(cellClip.pts, cellClip.len, plate.region[r].sign, cuts, strips);
    }
    const forceN = stripsNetForce(plate, net, cuts, strips);
    const s = shores[i];
    const towards = s.side === 'B' ? forceN : -forceN;
    if (out) out.push(shoreResult(b, s, towards, 'plate', stripsArea(cuts, strips), warn));
    else shoreU[i] = shoreUtilisation(b, s, towards, warn);
  }
}

/**
 * A faceted curved surface: facet forces and their moments about the surface centroid O are summed;
 * the resultant acts along the central axis r = O + (F × M_O) / |F|², the point of that line
 * closest to O. If M_O is not perpendicular to F the remainder is a couple about the axis,
 * reported as residualMomentNm.
 */
function facetedBoundary(
  b: Boundary,
  facets: V3[][],
  pa: PressureProfile,
  pb: PressureProfile,
  net: PressureProfile,
  frame: EarthFrame,
  warn: Warn,
): BoundaryResult | null {
  const up = frame.up;
  let reversedFacets: number[] = [];
  if (b.stiffening || (b.shores && b.shores.length > 0)) {
    warn('curved-structure', 'info', b.id, `${b.name}: stiffeners and shores are assessed on flat plates only; model the shored part as a flat boundary`);
  }
  if (b.geometry.kind === 'faceted') {
    const o = facetOrientation(b.geometry.facets);
    reversedFacets = o.reversed;
    if (o.reversed.length > 0) {
      warn('facets-reversed', 'danger', b.id, `${b.name}: facet${o.reversed.length > 1 ? 's' : ''} ${o.reversed.map((i) => i + 1).join(', ')} run${o.reversed.length > 1 ? '' : 's'} the other way round from ${o.reversed.length > 1 ? 'their' : 'its'} neighbours, so ${o.reversed.length > 1 ? 'their' : 'its'} load is counted the wrong way; turn ${o.reversed.length > 1 ? 'them' : 'it'} over in the plate's form`);
    }
  }
  const parts = facets.map((pts) => {
    const plate = polygonPlate(pts, up);
    return { plate, it: integratePlate(plate, pa, pb, net) };
  });
  let area = 0;
  let O: V3 = [0, 0, 0];
  let meanN: V3 = [0, 0, 0];
  for (const { plate, it } of parts) {
    area += it.areaM2;
    meanN = add(meanN, scale(plate.frame.n, it.areaM2));
    O = add(O, scale(plateToShip(plate.frame, it.centroidU, it.centroidV), it.areaM2));
  }
  if (area <= 0) {
    warn('degenerate', 'warning', b.id, `${b.name}: the surface has no area; not computed`);
    return null;
  }
  O = scale(O, 1 / area);
  let F: V3 = [0, 0, 0], M: V3 = [0, 0, 0];
  let Fp: V3 = [0, 0, 0], Fn: V3 = [0, 0, 0];
  let Ap = 0, An = 0;
  let peakMax = -Infinity, peakMin = Infinity, peakPt: V3 = O, peakVal = 0;
  const side = { fa: 0, fb: 0, wa: 0, wb: 0, pa: -Infinity, pb: -Infinity };
  const facetResults: FacetResult[] = [];
  for (const { plate, it } of parts) {
    const fr = plate.frame;
    const f = scale(fr.n, it.netForceN);
    F = add(F, f);
    let cop: V3 | null = null;
    if (it.netForceN !== 0) {
      cop = plateToShip(fr, it.netMomentU / it.netForceN, it.netMomentV / it.netForceN);
      M = add(M, cross(sub(cop, O), f));
    }
    Fp = add(Fp, scale(fr.n, it.positive.forceN));
    Fn = add(Fn, scale(fr.n, it.negative.forceN));
    Ap += it.positive.areaM2;
    An += it.negative.areaM2;
    if (Math.abs(it.peakMaxPa) > Math.abs(peakVal)) {
      peakVal = it.peakMaxPa;
      peakPt = plateToShip(fr, it.peakMaxU, it.peakMaxV);
    }
    if (Math.abs(it.peakMinPa) > Math.abs(peakVal)) {
      peakVal = it.peakMinPa;
      peakPt = plateToShip(fr, it.peakMinU, it.peakMinV);
    }
    peakMax = Math.max(peakMax, it.peakMaxPa);
    peakMin = Math.min(peakMin, it.peakMinPa);
    side.fa += it.sideForceA;
    side.fb += it.sideForceB;
    side.wa += it.sideWettedA;
    side.wb += it.sideWettedB;
    side.pa = Math.max(side.pa, it.sidePeakA);
    side.pb = Math.max(side.pb, it.sidePeakB);
    facetResults.push({ areaM2: it.areaM2, forceN: it.netForceN, centreOfPressure: cop ? toPoint(cop) : null });
  }
  const Fm = norm(F);
  let ref = unit(meanN);
  if (norm(meanN) < 1e-9 * area) {
    ref = unit(F);
    warn('facets-closed', 'info', b.id, `${b.name}: the facets' normals cancel (a closed surface?); the net force is given along its own direction`);
  }
  const cancels = nearlyCancels(Fm, side.fa, side.fb);
  let lowest = Infinity;
  for (const pts of facets) for (const q of pts) lowest = Math.min(lowest, dot(q, up));
  let point: V3 | null = null;
  let residual = 0;
  if (Fm > 0 && !cancels) {
    point = add(O, scale(cross(F, M), 1 / (Fm * Fm)));
    residual = dot(M, F) / Fm;
  }
  if (cancels) warnCancels(b, Fm, norm(M), warn);
  const netRes: NetResult = {
    forceN: dot(F, ref),
    referenceDirection: toPoint(ref),
    nearlyCancels: cancels,
    coupleNm: cancels ? norm(M) : null,
    resultantN: Fm,
    forceVector: toPoint(F),
    ...earthSplit(F, up),
    centreOfPressure: point ? toPoint(point) : null,
    centreOfPressurePlate: null,
    centreOfPressureAboveLowestM: point ? dot(point, up) - lowest : null,
    lineOfAction: point ? { point: toPoint(point), direction: toPoint(unit(F)) } : null,
    residualMomentNm: residual,
    positive: { forceN: norm(Fp), areaM2: Ap, centreOfPressure: null },
    negative: { forceN: An > 0 ? -norm(Fn) : 0, areaM2: An, centreOfPressure: null },
    signChange: Ap > 0 && An > 0,
    peak: { pressurePa: peakVal, point: toPoint(peakPt) },
    maxPressurePa: peakMax,
    minPressurePa: peakMin,
  };
  const capacities = capacitiesOf(b, netRes);
  const capacity = governingCapacity(capacities);
  return {
    id: b.id,
    name: b.name,
    kind: b.kind,
    geometryKind: 'faceted',
    parentBoundaryId: b.parentBoundaryId ?? null,
    areaM2: area,
    normal: null,
    centroid: toPoint(O),
    plateAxes: null,
    openingsExcluded: [],
    sideA: sideResult(b.sideA, pa, side.fa, side.pa, side.wa),
    sideB: sideResult(b.sideB, pb, side.fb, side.pb, side.wb),
    net: netRes,
    loadDiagram: [],
    facets: facetResults,
    reversedFacets,
    stiffeners: null,
    plating: null,
    shores: [],
    structureModel: null,
    capacity,
    capacities,
    maxUtilisation: capacity ? capacity.utilisation : null,
  };
}

