/**
 * A differing number between two sets of engine results (`compareNumbers` in compare.ts) said as an
 * engineer reads it: which boundary or space, which quantity, and both figures with their unit
 * ("No. 2/3 bulkhead", "net force (+ towards side B)", "1 234.5678 kN"), never the result path
 * (`boundaries[id=…].net.forceN`). The figures carry as many digits as it takes to see the
 * difference, since two figures that differ by 1 part in 10⁸ look equal at four.
 */
import type { NumberMismatch } from './compare';
import { formatNumber, formatQuantity, type Dimension, type UnitSystem } from '../units/units';
import { boundaryKindWords } from './plain-words';

export interface MismatchWords {
  /** The boundary, space or part of the ship the number belongs to. */
  where: string;
  /** The quantity, in words. */
  what: string;
  /** Each side's figure with its unit, or "missing". */
  a: string;
  b: string;
}

/** The quantity each result field holds, in words (engine results, shared/engine/results.ts). */
const KEY_WORDS: Record<string, string> = {
  // the ship
  heelDeg: 'heel',
  trimDeg: 'trim angle',
  trimM: 'trim',
  up: 'earth-up direction',
  waterlinePoint: 'outside waterline point',
  waterlineElevationM: 'outside waterline height',
  seaDensityKgM3: 'sea water density',
  gravityMS2: 'gravity',
  floodWater: 'flood water',
  oil: 'oil',
  other: 'other liquids',
  allLiquids: 'all liquids',
  maxUtilisation: 'highest utilisation',
  totalInflowM3S: 'total inflow',
  totalPumpCapacityM3S: 'total pump capacity',
  // spaces
  permeability: 'permeability',
  grossVolumeM3: 'gross volume',
  gasGaugePressurePa: 'gas space pressure',
  liquid: 'liquid',
  fillFraction: 'filled',
  volumeM3: 'volume',
  massKg: 'mass',
  centroid: 'centroid',
  densityKgM3: 'density',
  levelElevationM: 'level height',
  levelPoint: 'level',
  levelRange: 'level range',
  lowElevationM: 'lowest level',
  highElevationM: 'highest level',
  headM: 'head',
  flowM3S: 'flow',
  orificeInflowM3S: 'inflow through breaches',
  measured: 'sounding log',
  inflowM3S: 'inflow',
  netRiseM3S: 'net rise',
  r2: 'fit (r²)',
  pumpedSinceM3: 'pumped since',
  residualM3: 'residual',
  ratio: 'measured ÷ breach inflow',
  pumpCapacityM3S: 'pump capacity',
  inflowUsedM3S: 'inflow used',
  netRemovalM3S: 'net removal',
  timeToPumpOutS: 'time to pump out',
  // boundaries
  areaM2: 'area',
  normal: 'normal',
  plateAxes: 'plate axes',
  origin: 'origin',
  sideA: 'side A',
  sideB: 'side B',
  forceN: 'force',
  peakPressurePa: 'peak pressure',
  wettedAreaM2: 'wetted area',
  liquidTopElevationM: 'liquid top height',
  net: 'net',
  referenceDirection: 'reference direction',
  coupleNm: 'couple',
  resultantN: 'resultant force',
  forceVector: 'force',
  verticalN: 'vertical force',
  horizontalN: 'horizontal force',
  horizontalDirection: 'horizontal direction',
  centreOfPressure: 'centre of pressure',
  centreOfPressurePlate: 'centre of pressure on the plate',
  centreOfPressureAboveLowestM: 'centre of pressure above the lowest point',
  lineOfAction: 'line of action',
  point: 'point',
  direction: 'direction',
  residualMomentNm: 'moment left about the line of action',
  positive: 'part pushing towards side B',
  negative: 'part pushing towards side A',
  peak: 'peak',
  pressurePa: 'pressure',
  maxPressurePa: 'highest pressure',
  minPressurePa: 'lowest pressure',
  sM: 'distance up the plate',
  widthM: 'width',
  stiffeners: 'stiffeners',
  spacingM: 'spacing',
  offsetM: 'offset from the edge',
  tributaryWidthM: 'width of plate carried',
  shoreForcesN: 'shore forces',
  requiredModulusM3: 'section modulus needed',
  utilisation: 'utilisation',
  edgeLoadN: 'load taken by the edges',
  spanM: 'span',
  totalLoadN: 'total load',
  reactionStartN: 'reaction at the start',
  reactionEndN: 'reaction at the end',
  maxMomentNm: 'largest bending moment',
  maxMomentAtM: 'largest bending moment at',
  endMomentStartNm: 'end moment at the start',
  endMomentEndNm: 'end moment at the end',
  governingIndex: 'governing item',
  plating: 'plating',
  netThicknessM: 'net thickness',
  allowableStressPa: 'allowable stress',
  yieldStressPa: 'yield stress',
  longSideM: 'long side',
  shortSideM: 'short side',
  pressureMinPa: 'least pressure',
  pressureMaxPa: 'greatest pressure',
  stressPa: 'stress',
  tributaryAreaM2: 'area carried',
  tributaryForceN: 'load from the plate',
  axialLoadN: 'axial load',
  effectiveLengthFactor: 'effective length factor',
  designCapacityN: 'design capacity',
  designStressPa: 'design stress',
  eulerLoadN: 'Euler load',
  eulerRatio: 'load ÷ Euler load',
  slenderness: 'slenderness',
  slendernessLimit: 'slenderness limit',
  columnStabilityFactor: 'column stability factor',
  lengthToLeastDimension: 'length ÷ least thickness',
  capacity: 'rating',
  rated: 'rated value',
  actual: 'acting value',
};

/** Items of a list without a name of their own, by the list's field ("shore 2", "plating panel 3"). */
const ITEM_WORDS: Record<string, string> = {
  breaches: 'breach',
  shores: 'shore',
  items: 'stiffener',
  panels: 'plating panel',
  facets: 'facet',
  loadDiagram: 'load diagram point',
  readings: 'sounding log reading',
  warnings: 'warning',
  withheld: 'withheld item',
};

/** Lists whose items carry a name of their own (or a fluid's). */
const LISTS_OF_NAMED = new Set(['boundaries', 'compartments', 'layers', 'capacities']);

/** Figures of no listed item belong to the ship or the survey as a whole: said in `where`, not in the quantity. */
const TOP_LEVEL: Record<string, string> = { frame: 'Ship attitude', ship: 'Whole ship', summary: 'Whole survey' };

/** Words read together with the next ("net peak pressure", "side A force", "flood water mass"), not as a list. */
const JOINS_NEXT = new Set(['net', 'sideA', 'sideB', 'peak', 'liquid', 'floodWater', 'oil', 'other', 'allLiquids', 'measured']);

/** Containers whose fields already say what they are (a space's `inflow.orificeInflowM3S` is "inflow through breaches"). */
const UNSAID = new Set(['inflow']);

/** A force's components along the ship's axes. */
const FORCE_AXIS_WORDS: Record<string, string> = { x: 'forward component', y: 'to-port component', z: 'upward component' };

/** Fields holding a unit direction: their x, y, z are components, not positions. */
const DIRECTIONS = new Set(['up', 'normal', 'referenceDirection', 'direction', 'horizontalDirection', 'u', 'v']);
const AXIS_WORDS: Record<string, string> = { x: 'distance fwd of AP', y: 'distance to port', z: 'height above base' };
const PERCENT_KEYS = new Set(['permeability', 'fillFraction', 'utilisation', 'maxUtilisation']);

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

type Token = { kind: 'key'; key: string } | { kind: 'item'; match: string };

function tokens(path: string): Token[] {
  const out: Token[] = [];
  for (const m of path.matchAll(/\[([^\]]*)\]|([^.[\]]+)/g)) out.push(m[1] !== undefined ? { kind: 'item', match: m[1] } : { kind: 'key', key: m[2]! });
  return out;
}

/** The list item a path step names: `id=…` (or `layerId=…`) by that field, a bare number by position. */
function findItem(list: unknown, match: string): { item: unknown; index: number } {
  if (!Array.isArray(list)) return { item: undefined, index: Number(match) || 0 };
  const eq = match.indexOf('=');
  if (eq < 0) return { item: list[Number(match)], index: Number(match) };
  const field = match.slice(0, eq);
  const value = match.slice(eq + 1);
  const index = list.findIndex((x) => isObj(x) && x[field] === value);
  return { item: list[index], index };
}

function itemName(listKey: string, item: unknown, index: number): string {
  const rec = isObj(item) ? item : {};
  if (typeof rec.name === 'string' && rec.name.trim()) {
    return listKey === 'boundaries' && typeof rec.kind === 'string' && !rec.name.toLowerCase().includes(boundaryKindWords(rec.kind)) ? `${rec.name} (${boundaryKindWords(rec.kind)})` : rec.name;
  }
  if (listKey === 'layers') return typeof rec.fluidName === 'string' ? `${rec.fluidName} layer` : `layer ${index + 1}`;
  if (listKey === 'capacities') return rec.direction === 'towards-A' ? 'rating towards side A' : rec.direction === 'towards-B' ? 'rating towards side B' : 'rating';
  return `${ITEM_WORDS[listKey] ?? 'item'} ${index + 1}`;
}

type Unit = Dimension | 'percent' | 'plain' | 'acceleration';

/** The unit of a result field, read from its name's suffix (the engine's convention: forceN, areaM2, timeToPumpOutS). */
function unitOf(key: string, parentKey: string | undefined, capacityKind: unknown): Unit {
  if (PERCENT_KEYS.has(key)) return 'percent';
  if ((key === 'rated' || key === 'actual') && (capacityKind === 'pressure' || capacityKind === 'force')) return capacityKind;
  if (key === 'x' || key === 'y' || key === 'z') return parentKey === 'forceVector' ? 'force' : parentKey && DIRECTIONS.has(parentKey) ? 'plain' : 'length';
  if (key === 'requiredModulusM3') return 'sectionModulus';
  if (/MS2$/.test(key)) return 'acceleration';
  if (key === 'u' || key === 'v') return 'length';
  if (/KgM3$/.test(key)) return 'density';
  if (/M3S$/.test(key)) return 'flow';
  if (/Nm$/.test(key)) return 'moment';
  if (/N$/.test(key)) return 'force';
  if (/Kg$/.test(key)) return 'mass';
  if (/M3$/.test(key)) return 'volume';
  if (/M2$/.test(key)) return 'area';
  if (/Pa$/.test(key)) return 'pressure';
  if (/Deg$/.test(key)) return 'angle';
  if (/M$/.test(key)) return 'length';
  if (/S$/.test(key)) return 'time';
  return 'plain';
}

/** Enough significant digits to tell the two figures apart (at least 4, at most 15). */
function digitsFor(m: NumberMismatch): number {
  if (m.relative === null || m.relative <= 0) return 4;
  return Math.min(15, Math.max(4, Math.ceil(-Math.log10(m.relative)) + 2));
}

function figure(value: number | null, unit: Unit, system: UnitSystem, digits: number): string {
  if (value === null) return 'missing';
  if (unit === 'percent') return `${formatNumber(value * 100, digits)} %`;
  if (unit === 'plain') return formatNumber(value, digits);
  if (unit === 'angle') return `${formatNumber(value, digits)}°`;
  // gravity is entered and stored in m/s² in either system
  if (unit === 'acceleration') return `${formatNumber(value, digits)} m/s²`;
  return formatQuantity(value, unit, system, digits).text;
}

/**
 * One differing number in words. `a` and `b` are the two results compared (`compareNumbers(a, b)`),
 * used to name the boundaries, spaces and layers the path points at.
 */
export function mismatchWords(m: NumberMismatch, a: unknown, b: unknown, system: UnitSystem): MismatchWords {
  const where: string[] = [];
  const what: { words: string; joinsNext: boolean }[] = [];
  const say = (words: string, key?: string) => what.push({ words, joinsNext: key !== undefined && JOINS_NEXT.has(key) });
  let nodeA: unknown = a;
  let nodeB: unknown = b;
  let lastKey: string | undefined;
  let parentKey: string | undefined;
  let capacityKind: unknown;
  for (const t of tokens(m.path)) {
    if (t.kind === 'item') {
      const fa = findItem(nodeA, t.match);
      const fb = findItem(nodeB, t.match);
      const found = fa.item !== undefined ? fa : fb;
      where.push(itemName(lastKey ?? '', found.item, found.index));
      // the quantity is named from here on: what came before only led to the item
      what.length = 0;
      nodeA = fa.item;
      nodeB = fb.item;
      if (lastKey === 'capacities' && isObj(found.item)) capacityKind = found.item.kind;
      continue;
    }
    if (t.key === 'capacity') capacityKind = (isObj(nodeA) && isObj(nodeA.capacity) ? nodeA.capacity : isObj(nodeB) && isObj(nodeB.capacity) ? nodeB.capacity : {}).kind;
    parentKey = lastKey;
    lastKey = t.key;
    nodeA = isObj(nodeA) ? nodeA[t.key] : undefined;
    nodeB = isObj(nodeB) ? nodeB[t.key] : undefined;
    const direction = parentKey !== undefined && DIRECTIONS.has(parentKey);
    if (parentKey === undefined && TOP_LEVEL[t.key]) continue;
    const axis = t.key === 'x' || t.key === 'y' || t.key === 'z';
    if (UNSAID.has(t.key)) continue;
    if (axis && parentKey === 'forceVector') say(FORCE_AXIS_WORDS[t.key]!);
    else if (axis && !direction) say(AXIS_WORDS[t.key]!);
    else if (axis) say(`${t.key} component`);
    else if (t.key === 'u' && parentKey === 'centreOfPressurePlate') say('across the plate');
    else if (t.key === 'v' && parentKey === 'centreOfPressurePlate') say('up the plate');
    else if (t.key in ITEM_WORDS || LISTS_OF_NAMED.has(t.key)) continue;
    else say(KEY_WORDS[t.key] ?? t.key.replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase(), t.key);
  }
  let quantity = what.map((w, i) => w.words + (i === what.length - 1 ? '' : w.joinsNext ? ' ' : ', ')).join('');
  // the signed net force, said as the results table says it
  if (quantity === 'net force') quantity = 'net force (+ towards side B)';
  if (!quantity) quantity = 'value';
  const unit = unitOf(lastKey ?? '', parentKey, capacityKind);
  const digits = digitsFor(m);
  return {
    where: where.length ? where.join(', ') : (TOP_LEVEL[m.path.split(/[.[]/)[0]!] ?? 'Whole survey'),
    what: quantity,
    a: figure(m.a, unit, system, digits),
    b: figure(m.b, unit, system, digits),
  };
}

