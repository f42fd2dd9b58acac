/**
 * What changed between two versions of a survey, in plain words ("Sounding in No. 2 hold: 5.40 m →
 * 6.40 m"): the review desk's "changed since review" list. The server compares the document that
 * was reviewed with the current one (`surveyChangeLines`); the desk words each line in the viewer's
 * units (`changeLineText`). Numbers keep their SI value and dimension until then.
 */
import { z } from 'zod';
import type { Survey } from '../schemas/survey';
import { entityNoun } from '../api/entity-nouns';
import { formatNumber, formatQuantity, type Dimension, type UnitSystem } from '../units/units';

export const ChangeValueSchema = z.discriminatedUnion('kind', [
  z.object({ kind: z.literal('quantity'), si: z.number(), dim: z.string() }),
  z.object({ kind: z.literal('number'), value: z.number(), suffix: z.string() }),
  z.object({ kind: z.literal('text'), text: z.string() }),
  z.object({ kind: z.literal('none') }),
]);
export type ChangeValue = z.infer<typeof ChangeValueSchema>;

export const ChangeLineSchema = z.object({ subject: z.string(), old: ChangeValueSchema, new: ChangeValueSchema });
export type ChangeLine = z.infer<typeof ChangeLineSchema>;

/** At most this many lines: past it the desk says how many more (the History tab has them all). */
export const MAX_CHANGE_LINES = 200;

const NONE: ChangeValue = { kind: 'none' };
const text = (t: string): ChangeValue => ({ kind: 'text', text: t.length > 80 ? `${t.slice(0, 77)}…` : t });

/** Unit suffixes of the survey format's field names, longest first, and what they measure. */
const SUFFIXES: [string, Dimension | 'deg' | null][] = [
  ['KgM3', 'density'],
  ['M3S', 'flow'],
  ['M4', null],
  ['M3', 'volume'],
  ['M2', 'area'],
  ['Pa', 'pressure'],
  ['Deg', 'deg'],
  ['MS2', null],
  ['Kg', 'mass'],
  ['N', 'force'],
  ['M', 'length'],
  ['S', 'time'],
];

function suffixOf(key: string): [string, Dimension | 'deg' | null] | undefined {
  // Only a suffix after a lower-case letter or digit is a unit ("soundingM", not "M").
  return SUFFIXES.find(([s]) => key.length > s.length && key.endsWith(s) && /[a-z0-9]/.test(key[key.length - s.length - 1]!));
}

/** "soundingM" → "sounding", "allowableStressPa" → "allowable stress". */
function keyWords(key: string): string {
  const s = suffixOf(key);
  const bare = s ? key.slice(0, -s[0].length) : key;
  return bare.replace(/([a-z0-9])([A-Z])/g, '$1 $2').toLowerCase();
}

function valueOf(key: string, v: unknown): ChangeValue {
  if (v === undefined || v === null) return NONE;
  if (typeof v === 'number') {
    const dim = suffixOf(key)?.[1];
    if (dim === 'deg') return { kind: 'number', value: v, suffix: '°' };
    if (dim) return { kind: 'quantity', si: v, dim };
    return { kind: 'number', value: v, suffix: '' };
  }
  if (typeof v === 'boolean') return text(v ? 'yes' : 'no');
  if (typeof v === 'string') return text(v);
  return text('changed');
}

/** Parts a person describes as one thing ("the shape changed"), not coordinate by coordinate. */
const WHOLE = new Set(['geometry', 'pipe', 'reference', 'position', 'direction', 'marks', 'section', 'point', 'vertices', 'facets', 'readings', 'plan']);

const DRAFT_WORDS: Record<string, string> = { forwardM: 'Draft forward', aftM: 'Draft aft', midPortM: 'Draft midship, port', midStarboardM: 'Draft midship, starboard' };

type Lines = ChangeLine[];
type Named = { id: string; name?: string; caption?: string };

const hasId = (x: unknown): x is Named => typeof x === 'object' && x !== null && typeof (x as Named).id === 'string';
const keyOf = (x: unknown, i: number): string =>
  hasId(x) ? x.id : typeof x === 'object' && x !== null && typeof (x as { compartmentId?: unknown }).compartmentId === 'string' ? (x as { compartmentId: string }).compartmentId : String(i);

/** "Boundary “X”" + ["rated capacity", "pressure"] → "Boundary “X”: rated capacity pressure". */
const said = (subject: string, words: string[]) => (words.length ? `${subject}: ${words.join(' ')}` : subject);

/**
 * Walks two values side by side, one line per changed leaf (or per changed WHOLE part). `words`:
 * the field names on the way down, in words; an entity with a name in an array starts a new subject.
 */
function walk(before: unknown, after: unknown, subject: string, key: string, out: Lines, words: string[]): void {
  if (JSON.stringify(before) === JSON.stringify(after)) return;
  // Absent and empty say the same (a form may write `marks: {}` where there were none).
  const empty = (x: unknown) => x === undefined || (typeof x === 'object' && x !== null && Object.keys(x).length === 0);
  if (empty(before) && empty(after)) return;
  const here = key ? [...words, keyWords(key)] : words;
  const whole = WHOLE.has(key) || (typeof before !== typeof after && before !== undefined && after !== undefined);
  const isObj = (x: unknown) => typeof x === 'object' && x !== null;
  if (!whole && (Array.isArray(before) || Array.isArray(after))) {
    const a = (Array.isArray(before) ? before : []) as unknown[];
    const b = (Array.isArray(after) ? after : []) as unknown[];
    const one = keyWords(key).replace(/s$/, '');
    const byKey = new Map(a.map((x, i) => [keyOf(x, i), x]));
    const seen = new Set<string>();
    b.forEach((x, i) => {
      const k = keyOf(x, i);
      seen.add(k);
      const named = hasId(x) && (x.name ?? x.caption);
      const sub = named ? `${said(subject, words)} ${one} “${named}”` : subject;
      if (!byKey.has(k)) out.push({ subject: named ? sub : said(subject, [...words, one]), old: NONE, new: text('added') });
      else walk(byKey.get(k), x, sub, '', out, named ? [] : here);
    });
    for (const [k, x] of byKey) {
      if (!seen.has(k)) out.push({ subject: `${said(subject, [...words, one])}${hasId(x) && x.name ? ` “${x.name}”` : ''}`, old: text('present'), new: text('removed') });
    }
    return;
  }
  if (!whole && isObj(before) && isObj(after)) {
    const keys = [...new Set([...Object.keys(before as object), ...Object.keys(after as object)])];
    for (const k of keys) walk((before as Record<string, unknown>)[k], (after as Record<string, unknown>)[k], subject, k, out, here);
    return;
  }
  if (whole || isObj(before) || isObj(after)) {
    out.push({ subject: said(subject, here), old: before === undefined ? NONE : text('as before'), new: after === undefined ? text('removed') : text('changed') });
    return;
  }
  // The same instant written another way (a form writes times back with milliseconds) is no change.
  if (typeof before === 'string' && typeof after === 'string' && ISO_TIME.test(before) && Date.parse(before) === Date.parse(after)) return;
  out.push({ subject: said(subject, here), old: valueOf(key, before), new: valueOf(key, after) });
}

const ISO_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}/;

const LEVEL_WORDS: Record<string, string> = { sounding: 'Sounding', interfaceSounding: 'Interface sounding', ullage: 'Ullage' };

/** A condition's readings, worded the way they are read on deck. */
function conditionLines(before: Survey['conditions'][number], after: Survey['conditions'][number], names: Map<string, string>, suffix: string, out: Lines): void {
  for (const k of ['forwardM', 'aftM', 'midPortM', 'midStarboardM'] as const) {
    if (before.drafts[k] !== after.drafts[k]) out.push({ subject: `${DRAFT_WORDS[k]}${suffix}`, old: valueOf(k, before.drafts[k]), new: valueOf(k, after.drafts[k]) });
  }
  if (before.heelDeg !== after.heelDeg) out.push({ subject: `Heel${suffix}`, old: valueOf('heelDeg', before.heelDeg), new: valueOf('heelDeg', after.heelDeg) });
  const oldContents = new Map(before.contents.map((c) => [c.compartmentId, c]));
  for (const c of after.contents) {
    const space = names.get(c.compartmentId) ?? 'a space';
    const was = oldContents.get(c.compartmentId);
    oldContents.delete(c.compartmentId);
    if (!was) {
      out.push({ subject: `Contents of ${space}${suffix}`, old: NONE, new: text('added') });
      continue;
    }
    const oldLayers = new Map(was.layers.map((l) => [l.id, l]));
    for (const l of c.layers) {
      const o = oldLayers.get(l.id);
      oldLayers.delete(l.id);
      const reading = (x: typeof l.level) => (x.kind === 'sounding' || x.kind === 'interfaceSounding' ? x.soundingM : x.kind === 'ullage' ? x.ullageM : undefined);
      if (!o) {
        out.push({ subject: `Layer of ${l.fluidId} in ${space}${suffix}`, old: NONE, new: text('added') });
        continue;
      }
      if (o.level.kind === l.level.kind && reading(o.level) !== reading(l.level)) {
        out.push({ subject: `${LEVEL_WORDS[l.level.kind] ?? 'Level'} in ${space}${suffix}`, old: valueOf('readingM', reading(o.level)), new: valueOf('readingM', reading(l.level)) });
      } else if (o.level.kind !== l.level.kind) {
        out.push({ subject: `How the level in ${space} is found${suffix}`, old: text(LEVEL_WORDS[o.level.kind] ?? o.level.kind), new: text(LEVEL_WORDS[l.level.kind] ?? l.level.kind) });
      } else {
        walk(o.level, l.level, `Level in ${space}${suffix}`, '', out, []);
      }
      const { level: _a, ...restOld } = o;
      const { level: _b, ...restNew } = l;
      walk(restOld, restNew, `Layer in ${space}${suffix}`, '', out, []);
    }
    for (const l of oldLayers.values()) out.push({ subject: `Layer of ${l.fluidId} in ${space}${suffix}`, old: text('present'), new: text('removed') });
    walk(was.gas, c.gas, `Gas space of ${space}${suffix}`, '', out, []);
  }
  for (const c of oldContents.values()) out.push({ subject: `Contents of ${names.get(c.compartmentId) ?? 'a space'}${suffix}`, old: text('present'), new: text('removed') });
  const { drafts: _d1, heelDeg: _h1, contents: _c1, ...rb } = before;
  const { drafts: _d2, heelDeg: _h2, contents: _c2, ...ra } = after;
  walk(rb, ra, `Condition${suffix}`, '', out, []);
}

const COLLECTIONS = ['compartments', 'boundaries', 'fluids', 'photos'] as const;

/** Every change from `before` to `after`, in plain words (ids become names). */
export function surveyChangeLines(before: Survey, after: Survey): ChangeLine[] {
  const out: Lines = [];
  const names = new Map<string, string>([...before.compartments, ...after.compartments].map((c) => [c.id, c.name]));
  if (before.title !== after.title) out.push({ subject: 'Title', old: text(before.title), new: text(after.title) });
  if (before.casualtyDescription !== after.casualtyDescription) out.push({ subject: 'Casualty description', old: text(before.casualtyDescription ?? ''), new: text(after.casualtyDescription ?? '') });
  walk(before.vessel, after.vessel, 'Vessel', '', out, []);
  const oldConditions = new Map(before.conditions.map((c) => [c.id, c]));
  for (const c of after.conditions) {
    const suffix = after.conditions.length > 1 ? ` (${c.name ?? 'readings of ' + c.time})` : '';
    const was = oldConditions.get(c.id);
    oldConditions.delete(c.id);
    if (!was) out.push({ subject: `Readings${suffix}`, old: NONE, new: text('added') });
    else conditionLines(was, c, names, suffix, out);
  }
  for (const c of oldConditions.values()) out.push({ subject: `Readings ${c.name ?? c.time}`, old: text('present'), new: text('removed') });
  if (before.activeConditionId !== after.activeConditionId) {
    const n = (id: string) => after.conditions.find((c) => c.id === id)?.name ?? before.conditions.find((c) => c.id === id)?.name ?? 'another set';
    out.push({ subject: 'Readings in use', old: text(n(before.activeConditionId)), new: text(n(after.activeConditionId)) });
  }
  for (const coll of COLLECTIONS) {
    const noun = entityNoun(coll);
    const label = (e: Named) => `${noun.charAt(0).toUpperCase()}${noun.slice(1)} “${e.name ?? e.caption ?? e.id.slice(0, 8)}”`;
    const a = (before[coll] ?? []) as Named[];
    const b = (after[coll] ?? []) as Named[];
    const old = new Map(a.map((e) => [e.id, e]));
    for (const e of b) {
      const was = old.get(e.id);
      old.delete(e.id);
      if (!was) out.push({ subject: label(e), old: NONE, new: text('added') });
      else walk(was, e, label(e), '', out, []);
    }
    for (const e of old.values()) out.push({ subject: label(e), old: text('present'), new: text('removed') });
  }
  return out;
}

/** "110.0 kPa" → "110 kPa", "0.001000" → "0.001": a typed value reads as typed. */
const trimZeros = (t: string) => t.replace(/(\.\d*?)0+(?=\D|$)/, '$1').replace(/\.(?=\D|$)/, '');

function valueText(v: ChangeValue, system: UnitSystem): string {
  switch (v.kind) {
    case 'none':
      return 'not given';
    case 'text':
      return v.text;
    case 'number':
      return `${trimZeros(formatNumber(v.value, 6))}${v.suffix}`;
    case 'quantity':
      return trimZeros(formatQuantity(v.si, v.dim as Dimension, system, 6).text);
  }
}

/** One line as a sentence in the reader's units: "Sounding in No. 2 hold: 5.4 m → 6.4 m". */
export function changeLineText(line: ChangeLine, system: UnitSystem): string {
  const whole = line.old.kind === 'none' || (line.old.kind === 'text' && (line.old.text === 'as before' || line.old.text === 'present'));
  if (whole && line.new.kind === 'text' && ['added', 'removed', 'changed'].includes(line.new.text)) return `${line.subject}: ${line.new.text}`;
  return `${line.subject}: ${valueText(line.old, system)} → ${valueText(line.new, system)}`;
}
