/**
 * The survey's history in plain words: a recorded field change ("compartment 3f…, field contents,
 * old [...], new [...]") becomes lines a person reads ("Sounding in No. 2 hold: 5.40 m → 6.40 m").
 * Used by the review desk's history and by anything else that says what changed between two
 * revisions. Values are worded in the reader's unit system; nothing here shows a field name, an id
 * or JSON. Revisions from one sitting (the same person, no pause longer than `SITTING_GAP_MS`) are
 * grouped into one entry, with each field's first old value and last new value.
 */
import type { FieldChange, RevisionEntry } from '../api/review';
import { catalogueFluid } from '../fluids/catalogue';
import { pointWords } from '../units/point-words';
import { formatNumber, formatOpeningArea, formatQuantity, formatStress, INCH_M, type Dimension, type UnitSystem } from '../units/units';
import { formatShipAndUtc } from './time-words';
import { boundaryKindWords, END_CONDITION_WORDS, SPACE_TYPE_WORDS } from './plain-words';

/** One change, said in words. `target` names the entity it belongs to, so a screen can link to its inputs. */
export interface ChangeLine {
  subject: string;
  /** Absent for an item added or removed (the subject says so). */
  from?: string;
  to?: string;
  target?: { kind: 'condition' | 'compartment' | 'boundary' | 'fluid' | 'photo' | 'vessel' | 'survey'; id?: string };
}

/** What the words need from the survey: names of the things changes point at, and the ship's clock. */
export interface ChangeContext {
  system: UnitSystem;
  /** Names by id (compartments, boundaries, conditions, fluids, photos), from the survey as it is now. */
  names: ReadonlyMap<string, string>;
  shipTimeOffsetMin?: number;
}

/** A pause longer than this between two revisions by the same person starts a new sitting. */
export const SITTING_GAP_MS = 20 * 60_000;

/** At most this many lines are said for one recorded change (a reshaped plate moves many points). */
const MAX_LINES_PER_CHANGE = 12;

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);
const isPoint = (v: unknown): v is { x: number; y: number; z: number } =>
  isObj(v) && typeof v.x === 'number' && typeof v.y === 'number' && typeof v.z === 'number';

function same(a: unknown, b: unknown): boolean {
  if (a === b) return true;
  if (a === null || b === null || a === undefined || b === undefined) return (a ?? null) === (b ?? null);
  if (typeof a !== 'object' || typeof b !== 'object') return false;
  return JSON.stringify(a) === JSON.stringify(b);
}

// ---- values ---------------------------------------------------------------------------------------

/** The dimension of a numeric field, read from its name's unit suffix (the survey format's convention). */
function dimensionOf(key: string): Dimension | 'percent' | 'plain' {
  if (/KgM3$/.test(key)) return 'density';
  if (/M3S$/.test(key)) return 'flow';
  if (/M4$/.test(key)) return 'plain';
  if (/N$/.test(key)) return 'force';
  if (/M3$/.test(key)) return key === 'sectionModulusM3' ? 'sectionModulus' : 'volume';
  if (/M2$/.test(key)) return 'area';
  if (/Pa$/.test(key)) return 'pressure';
  if (/Deg$/.test(key)) return 'angle';
  if (/MS2$/.test(key)) return 'plain';
  if (/M$/.test(key) || key === 'x' || key === 'y' || key === 'z') return 'length';
  if (key === 'permeability') return 'percent';
  return 'plain';
}

/** A figure of the survey format said with its unit, read from the field's name (`soundingM` → "5.40 m"). */
export function figureWords(value: number, key: string, system: UnitSystem): string {
  // thin things in millimetres (inches), stresses in MPa (ksi): the units the plate form takes them in
  if (/[tT]hickness|corrosionAllowance/.test(key)) return system === 'us' ? `${(value / INCH_M).toFixed(2)} in` : `${(value * 1000).toFixed(1)} mm`;
  if (STRESS_KEYS.has(key)) return formatStress(value, system);
  // holes (breaches, openings) and shore sections: whole cm² or m² to two decimals, as measured
  if (key === 'areaM2') return formatOpeningArea(value, system);
  const dim = dimensionOf(key);
  if (dim === 'percent') return `${formatNumber(value * 100, 3)} %`;
  if (dim === 'plain') return formatNumber(value, 4);
  if (dim === 'length') {
    // lengths as a tape reads them: two decimals (5.40 m), never floating-point noise
    const q = formatQuantity(value, 'length', system);
    return `${q.value.toFixed(2)} ${q.label}`;
  }
  if (dim === 'angle') return `${value.toFixed(1)}°`;
  // stored SI; angles are stored in degrees, everything else converts
  return formatQuantity(value, dim, system).text;
}

const STRESS_KEYS = new Set(['allowableStressPa', 'yieldStressPa', 'elasticModulusPa', 'failureStressPa']);

/** A code of the survey format ("hatch-cover", "simply-supported") as words. */
function codeWords(code: string): string {
  if (code === 'A' || code === 'B') return `side ${code}`;
  return code.replace(/([a-z])([A-Z])/g, '$1 $2').replace(/-/g, ' ').toLowerCase();
}

function valueWords(value: unknown, key: string, ctx: ChangeContext): string {
  if (value === null || value === undefined) return 'not set';
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (typeof value === 'number') return figureWords(value, key, ctx.system);
  if (typeof value === 'string') {
    if (key === 'time') return formatShipAndUtc(value, ctx.shipTimeOffsetMin);
    if (key === 'fluidId') return fluidName(value, ctx);
    if (key === 'kind' && Object.hasOwn(BOUNDARY_KINDS, value)) return boundaryKindWords(value);
    if (key === 'spaceType') return (SPACE_TYPE_WORDS as Record<string, string>)[value] ?? codeWords(value);
    if (key === 'endCondition') return (END_CONDITION_WORDS as Record<string, string>)[value] ?? codeWords(value);
    if (key.endsWith('Id')) return ctx.names.get(value) ?? 'an item since removed';
    if (CODE_KEYS.has(key)) return codeWords(value);
    return `“${value.length > 80 ? `${value.slice(0, 77)}…` : value}”`;
  }
  if (isPoint(value)) return pointWords(value, ctx.system);
  if (Array.isArray(value)) return value.length === 0 ? 'none' : `${value.length} ${value.length === 1 ? 'item' : 'items'}`;
  if (isObj(value) && typeof value.kind === 'string') return sideOrKindWords(value, ctx);
  return 'set';
}

const BOUNDARY_KINDS = { bulkhead: 1, deck: 1, 'tank-top': 1, 'hatch-cover': 1, door: 1, manhole: 1, shell: 1, patch: 1 };
const CODE_KEYS = new Set(['kind', 'endFixity', 'endCondition', 'side', 'tape', 'category', 'cargoState', 'face', 'method', 'material', 'contentType']);

function sideOrKindWords(v: Obj, ctx: ChangeContext): string {
  if (v.kind === 'compartment' && typeof v.compartmentId === 'string') return ctx.names.get(v.compartmentId) ?? 'a space since removed';
  if (v.kind === 'sea') return 'the sea';
  if (v.kind === 'air') return 'open air';
  if (v.kind === 'vented') return 'vented';
  if (v.kind === 'pressurised' && typeof v.gaugePressurePa === 'number') return `held at ${figureWords(v.gaugePressurePa, 'gaugePressurePa', ctx.system)}`;
  return codeWords(v.kind as string);
}

function fluidName(id: string, ctx: ChangeContext): string {
  return ctx.names.get(id) ?? catalogueFluid(id)?.name.toLowerCase() ?? codeWords(id);
}

// ---- field labels ---------------------------------------------------------------------------------

/** Labels of fields, by key. A key not here is split into words ("firstOffsetM" → "first offset"). */
const LABELS: Record<string, string> = {
  name: 'name', title: 'title', casualtyDescription: 'casualty description', imo: 'IMO number',
  shipTimeOffsetMin: "ship's clock offset (minutes from UTC)", lbpM: 'length between perpendiculars', breadthM: 'breadth',
  depthM: 'depth', forwardXM: 'forward draught marks position', aftXM: 'aft draught marks position', midshipXM: 'midship draught marks position',
  forwardM: 'forward draft', aftM: 'aft draft', midPortM: 'midship draft, port', midStarboardM: 'midship draft, starboard',
  heelDeg: 'heel', seaDensityKgM3: 'sea water density', gravityMS2: 'gravity', time: 'time of the readings',
  spaceType: 'type', permeability: 'permeability', cargoState: 'cargo state', openToSea: 'open to the sea', airTight: 'air-tight',
  kind: 'kind', sideA: 'side A', sideB: 'side B', notes: 'notes', parentBoundaryId: 'part of',
  spacingM: 'stiffener spacing', firstOffsetM: 'first stiffener offset', spanM: 'stiffener span', endFixity: 'stiffener end fixity',
  sectionModulusM3: 'stiffener section modulus', allowableStressPa: 'allowable stress', direction: 'stiffener direction',
  lengthM: 'length', elasticModulusPa: 'elastic modulus', endCondition: 'end condition', side: 'side', angleFromNormalDeg: 'angle from square',
  position: 'position', densityKgM3: 'density', fluidId: 'liquid', caption: 'caption', category: 'category', apiGravity: 'API gravity',
  thicknessM: 'plate thickness', corrosionAllowanceM: 'corrosion allowance', yieldStressPa: 'yield stress',
  dischargeCoefficient: 'discharge coefficient', suctionHeightM: 'suction height', running: 'running', rateM3S: 'rate',
  bottomZM: 'pipe bottom height', gas: 'gas space', widthM: 'width', outerDiameterM: 'outer diameter', wallThicknessM: 'wall thickness',
};

function label(key: string): string {
  return LABELS[key] ?? key.replace(/(KgM3|M3S|MS2|M4|M3|M2|Pa|Deg|Min|M)$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase();
}

const cap = (s: string) => (s ? s[0]!.toUpperCase() + s.slice(1) : s);

// ---- the walk -------------------------------------------------------------------------------------

/** Geometry is said as one line: a reshaped plate moves many points, and their list helps nobody. */
const WHOLE_KEYS = new Set(['geometry', 'vertices', 'facets', 'origin', 'edgeU', 'edgeV', 'centre', 'normal', 'marks', 'design', 'section', 'stability', 'flooding', 'downfloodingPoints', 'draughtMarks', 'ratedCapacity', 'directionalCapacity', 'soundingLog', 'openings']);

interface Walk {
  lines: ChangeLine[];
  ctx: ChangeContext;
  target: ChangeLine['target'];
}

function push(w: Walk, subject: string, from: unknown, to: unknown, key: string) {
  if (w.lines.length >= MAX_LINES_PER_CHANGE) return;
  w.lines.push({ subject: cap(subject), from: valueWords(from, key, w.ctx), to: valueWords(to, key, w.ctx), target: w.target });
}

function note(w: Walk, subject: string) {
  if (w.lines.length >= MAX_LINES_PER_CHANGE) return;
  w.lines.push({ subject: cap(subject), target: w.target });
}

/** Differences between two values of field `key`, said about `of` ("of Aft bulkhead"). */
function diff(w: Walk, key: string, of: string, a: unknown, b: unknown) {
  if (same(a, b)) return;
  if (key === 'marks') return marksDiff(w, of, a, b);
  if (WHOLE_KEYS.has(key)) {
    if (a === null || a === undefined) return note(w, `${label(key)} ${of}: added`);
    if (b === null || b === undefined) return note(w, `${label(key)} ${of}: removed`);
    return note(w, `${key === 'geometry' || key === 'vertices' || key === 'facets' ? 'shape or position' : label(key)} ${of}: changed`);
  }
  if (isPoint(a) || isPoint(b) || !isObj(a) || !isObj(b)) {
    if (Array.isArray(a) || Array.isArray(b)) return listDiff(w, key, of, (a as unknown[]) ?? [], (b as unknown[]) ?? []);
    return push(w, `${label(key)} ${of}`, a, b, key);
  }
  // an object whose kind changed is said whole (a side from sea to a hold; a gas space vented to held)
  if (a.kind !== b.kind && (typeof a.kind === 'string' || typeof b.kind === 'string')) return push(w, `${label(key)} ${of}`, a, b, key);
  if (key === 'sideA' || key === 'sideB' || key === 'gas') return push(w, `${label(key)} ${of}`, a, b, key);
  for (const k of new Set([...Object.keys(a), ...Object.keys(b)])) {
    if (k === 'kind' || k === 'id') continue;
    diff(w, k, of, a[k], b[k]);
  }
}

/** A list of things with ids (shores, breaches, pumps): added, removed, and changed by name. */
function listDiff(w: Walk, key: string, of: string, a: unknown[], b: unknown[]) {
  const idOf = (x: unknown) => (isObj(x) && typeof x.id === 'string' ? x.id : null);
  if (!a.every(idOf) || !b.every(idOf)) return push(w, `${label(key)} ${of}`, a, b, key);
  const before = new Map(a.map((x) => [idOf(x)!, x as Obj]));
  const after = new Map(b.map((x) => [idOf(x)!, x as Obj]));
  const noun = ITEM_NOUNS[key] ?? 'item';
  const nameOf = (x: Obj, i: number) => (typeof x.name === 'string' ? `${noun} “${x.name}”` : `${noun} ${i + 1}`);
  b.forEach((x, i) => {
    const id = idOf(x)!;
    const old = before.get(id);
    if (!old) note(w, `${nameOf(x as Obj, i)} added ${of}`);
    else diff(w, '', `of ${nameOf(x as Obj, i)} ${of}`, stripId(old), stripId(x as Obj));
  });
  a.forEach((x, i) => {
    if (!after.has(idOf(x)!)) note(w, `${nameOf(x as Obj, i)} removed ${of}`);
  });
}

const ITEM_NOUNS: Record<string, string> = { shores: 'shore', breaches: 'breach', pumps: 'pump', layers: 'layer', openings: 'opening' };
const stripId = (x: Obj): Obj => {
  const { id: _id, ...rest } = x;
  return rest;
};

function marksDiff(w: Walk, of: string, a: unknown, b: unknown) {
  const ma = (isObj(a) ? a : {}) as Record<string, string>;
  const mb = (isObj(b) ? b : {}) as Record<string, string>;
  for (const path of new Set([...Object.keys(ma), ...Object.keys(mb)])) {
    if (ma[path] === mb[path]) continue;
    const field = label(path.split('.').pop() ?? path);
    if (!mb[path]) note(w, `${field} ${of}: no longer ${ma[path]}`);
    else note(w, `${field} ${of}: marked ${mb[path]}`);
  }
}

/** A condition's contents: per space, per layer, the readings that set its level. */
function contentsDiff(w: Walk, conditionOf: string, a: unknown, b: unknown) {
  const byCompartment = (v: unknown) => new Map((Array.isArray(v) ? v : []).filter(isObj).map((c) => [c.compartmentId as string, c]));
  const ca = byCompartment(a);
  const cb = byCompartment(b);
  for (const id of new Set([...ca.keys(), ...cb.keys()])) {
    const space = w.ctx.names.get(id) ?? 'a space since removed';
    const before = ca.get(id);
    const after = cb.get(id);
    const layersA = new Map(((before?.layers as Obj[]) ?? []).map((l) => [l.id as string, l]));
    const layersB = new Map(((after?.layers as Obj[]) ?? []).map((l) => [l.id as string, l]));
    const saved = w.target;
    w.target = { kind: 'compartment', id };
    for (const [lid, lb] of layersB) {
      const la = layersA.get(lid);
      const fluid = fluidName(String(lb.fluidId), w.ctx);
      if (!la) {
        note(w, `${fluid} layer added in ${space}${levelNow(lb.level, w.ctx)}`);
        continue;
      }
      if (la.fluidId !== lb.fluidId) push(w, `liquid in ${space}`, la.fluidId, lb.fluidId, 'fluidId');
      if (!same(la.densityKgM3, lb.densityKgM3)) push(w, `density of the ${fluid} in ${space}`, la.densityKgM3, lb.densityKgM3, 'densityKgM3');
      levelDiff(w, space, la.level, lb.level);
      if (!same(la.marks, lb.marks)) marksDiff(w, `in ${space}`, la.marks, lb.marks);
    }
    for (const [lid, la] of layersA) if (!layersB.has(lid)) note(w, `${fluidName(String(la.fluidId), w.ctx)} layer removed from ${space}`);
    if (!same(before?.gas, after?.gas)) push(w, `gas space over ${space}`, before?.gas, after?.gas, 'gas');
    w.target = saved;
  }
  void conditionOf;
}

function levelNow(level: unknown, ctx: ChangeContext): string {
  if (!isObj(level)) return '';
  if (typeof level.soundingM === 'number') return `, sounding ${figureWords(level.soundingM, 'soundingM', ctx.system)}`;
  if (typeof level.ullageM === 'number') return `, ullage ${figureWords(level.ullageM, 'ullageM', ctx.system)}`;
  if (level.kind === 'openToSea') return ', level with the sea';
  return '';
}

const READING_WORDS: Record<string, string> = { sounding: 'sounding', interfaceSounding: 'interface sounding', ullage: 'ullage', openToSea: 'level with the sea outside', point: 'level through a point' };

function levelDiff(w: Walk, space: string, a: unknown, b: unknown) {
  if (same(a, b) || !isObj(a) || !isObj(b)) return;
  if (a.kind !== b.kind) {
    note(w, `How the level in ${space} is found: ${READING_WORDS[String(a.kind)] ?? 'other'} → ${READING_WORDS[String(b.kind)] ?? 'other'}${levelNow(b, w.ctx)}`);
    return;
  }
  const what = READING_WORDS[String(b.kind)] ?? 'level';
  if (!same(a.soundingM, b.soundingM)) push(w, `${what} in ${space}`, a.soundingM, b.soundingM, 'soundingM');
  if (!same(a.ullageM, b.ullageM)) push(w, `ullage in ${space}`, a.ullageM, b.ullageM, 'ullageM');
  if (!same(a.tape, b.tape)) push(w, `how the tape ran in ${space}`, a.tape, b.tape, 'tape');
  if (!same(a.pipe, b.pipe)) note(w, `Sounding pipe in ${space}: moved`);
  if (!same(a.reference, b.reference)) push(w, `ullage reference point in ${space}`, a.reference, b.reference, 'reference');
  if (!same(a.point, b.point)) push(w, `level point in ${space}`, a.point, b.point, 'point');
}

const ENTITY_WORDS: Record<string, string> = { compartment: 'space', boundary: 'boundary', condition: 'condition', fluid: 'fluid', photo: 'photo' };

/** One recorded change as lines of words. */
export function changeWords(c: FieldChange, ctx: ChangeContext): ChangeLine[] {
  const kind = (c.entity in ENTITY_WORDS || c.entity === 'vessel' || c.entity === 'survey' ? c.entity : 'survey') as NonNullable<ChangeLine['target']>['kind'];
  const target: ChangeLine['target'] = c.entityId ? { kind, id: c.entityId } : { kind };
  const w: Walk = { lines: [], ctx, target };
  const value = (isObj(c.new) ? c.new : isObj(c.old) ? c.old : null) as Obj | null;
  const noun = ENTITY_WORDS[c.entity] ?? c.entity;
  const entityName = (c.entityId && ctx.names.get(c.entityId)) || (value && typeof value.name === 'string' ? value.name : value && typeof value.caption === 'string' ? value.caption : null);
  const called = c.entity === 'condition' ? `the ${conditionWords(entityName)}` : entityName ? `${noun} “${entityName}”` : `a ${noun}`;

  if (c.entity === 'survey' && c.field === null) {
    // the first revision of every survey records only that it was made
    note(w, c.new === 'created' ? 'Survey started' : c.new === null ? 'Survey removed' : 'Survey changed');
    return w.lines;
  }
  if (c.entity === 'survey' || c.entity === 'vessel') {
    if (c.field === 'vessel' || c.entity === 'vessel') diff(w, '', "of the ship", c.old, c.new);
    else if (c.field === 'activeConditionId') push(w, 'condition in use', c.old, c.new, 'activeConditionId');
    else if (c.field === 'vesselId') note(w, 'Ship record linked');
    else push(w, label(c.field ?? 'survey'), c.old, c.new, c.field ?? '');
    return w.lines;
  }
  if (c.field === null) {
    const described = c.entity === 'photo' ? `photo “${entityName ?? ''}”` : called;
    note(w, c.new === null ? `${cap(described)} removed` : `${cap(described)} added`);
    return w.lines;
  }
  const of = c.entity === 'condition' ? `in the ${conditionWords(entityName)}` : `of ${called}`;
  if (c.entity === 'condition' && c.field === 'contents') contentsDiff(w, of, c.old, c.new);
  else if (c.entity === 'condition' && c.field === 'drafts' && isObj(c.old) && isObj(c.new)) diff(w, 'drafts', of, c.old, c.new);
  else if (c.field === 'kind' && c.entity === 'boundary') push(w, `kind ${of}`, c.old, c.new, 'kind');
  else diff(w, c.field, of, c.old, c.new);
  return w.lines;
}

function conditionWords(name: string | null | undefined): string {
  return name ? `condition “${name}”` : 'readings';
}

/** A line as one sentence: "Sounding in No. 2 hold: 5.40 m → 6.40 m". */
export function changeLineText(l: ChangeLine): string {
  return l.from !== undefined ? `${l.subject}: ${l.from} → ${l.to}` : l.subject;
}

/** Several changes of one field, net: each field keeps its first old value and its last new one; undone edits drop out. */
export function netChanges(changes: readonly FieldChange[]): FieldChange[] {
  const byKey = new Map<string, FieldChange>();
  for (const c of changes) {
    const key = `${c.entity}\u0000${c.entityId ?? ''}\u0000${c.field ?? ''}`;
    const prior = byKey.get(key);
    if (!prior) byKey.set(key, c);
    else {
      byKey.delete(key); // re-insert so the order follows the last edit
      byKey.set(key, { ...prior, new: c.new });
    }
  }
  return [...byKey.values()].filter((c) => !same(c.old, c.new));
}

/** Consecutive revisions by one person, none more than `SITTING_GAP_MS` after the one before. */
export interface Sitting {
  firstRevision: number;
  lastRevision: number;
  authorName: string | null;
  from: string;
  to: string;
  revisionCount: number;
  changes: FieldChange[];
}

/** Revisions (oldest first) grouped into sittings, each with its net changes. */
export function groupSittings(revisions: readonly RevisionEntry[], gapMs = SITTING_GAP_MS): Sitting[] {
  const out: (Sitting & { raw: FieldChange[] })[] = [];
  for (const r of revisions) {
    const last = out[out.length - 1];
    if (last && last.authorName === r.authorName && Date.parse(r.at) - Date.parse(last.to) <= gapMs) {
      last.lastRevision = r.revision;
      last.to = r.at;
      last.revisionCount += 1;
      last.raw.push(...r.changes);
    } else {
      out.push({ firstRevision: r.revision, lastRevision: r.revision, authorName: r.authorName, from: r.at, to: r.at, revisionCount: 1, changes: [], raw: [...r.changes] });
    }
  }
  return out.map(({ raw, ...s }) => ({ ...s, changes: netChanges(raw) }));
}
