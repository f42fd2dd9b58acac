/**
 * "Stability": the ship's hydrostatic particulars for the active readings (from her approved
 * stability information, each with where it was read, or a box-shaped vessel), her downflooding
 * points, and the ship's response panel. Works offline like every section; a value that does not
 * validate stays in its field, unsaved, with its message.
 */
import { useEffect, useRef, useState } from 'react';
import { useForm, useWatch } from 'react-hook-form';
import { ConditionStabilitySchema, DOWNFLOODING_KINDS, DownfloodingPointSchema, type ConditionStability, type Particulars } from '@shared/schemas/stability';
import type { Condition } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { pointWords } from '@shared/units/point-words';
import { FormError, NumberInput, SelectInput, TextInput, dangerBtn, errorAt, secondaryBtn } from '@client/components/ui/fields';
import { ShipResponsePanel } from '@client/features/results/components/ship-response';
import { byKey, measureLabel, parseField, showField, unitResolver, type Measure } from '../utils/form-units';
import { useAutosave } from '../hooks/use-autosave';
import { activeCondition } from '../utils/new-entities';
import type { Apply, EditOp, SectionProps } from '../utils/types';
import { SaveIndicator } from './save-indicator';

type FigureKey =
  | 'displacementT' | 'meanDraftM' | 'kgM' | 'gmM' | 'lcgM' | 'tcgM' | 'lcbM' | 'tpcT' | 'waterplaneAreaM2' | 'lcfM' | 'mct1cmTM' | 'kmM'
  | 'lengthM' | 'breadthM' | 'draftM' | 'depthM';

interface FigureSpec {
  key: FigureKey;
  label: string;
  /** The name US users know it by (TPI, MTI), when it differs. */
  usLabel?: string;
  measure: Measure;
  /** Schema value = SI value × this (t for displacement, t/cm for TPC, t·m/cm for MCT 1 cm); the field shows the user's unit. */
  scale?: number;
  required: boolean;
  hint?: string;
}

const BOOKLET: FigureSpec[] = [
  { key: 'displacementT', label: 'Displacement', measure: 'mass', scale: 1 / 1000, required: true, hint: 'intact, spaces modelled here empty' },
  { key: 'meanDraftM', label: 'Mean draft', measure: 'length', required: true, hint: 'at which the hydrostatics were read' },
  { key: 'kgM', label: 'KG', measure: 'length', required: false, hint: 'give KG or GM' },
  { key: 'gmM', label: 'GM', measure: 'length', required: false, hint: 'give KG or GM' },
  { key: 'lcgM', label: 'LCG', measure: 'length', required: true, hint: 'from the aft perpendicular' },
  { key: 'tcgM', label: 'TCG', measure: 'length', required: false, hint: 'to port; empty: centreline' },
  { key: 'lcbM', label: 'LCB', measure: 'length', required: false, hint: 'empty: even keel' },
  { key: 'tpcT', label: 'TPC', usLabel: 'TPI (tons per inch)', measure: 'immersion', scale: 1e-5, required: false, hint: 'give TPC or waterplane area' },
  { key: 'waterplaneAreaM2', label: 'Waterplane area', measure: 'area', required: false, hint: 'give TPC or waterplane area' },
  { key: 'lcfM', label: 'LCF', measure: 'length', required: true, hint: 'from the aft perpendicular' },
  { key: 'mct1cmTM', label: 'MCT 1 cm', usLabel: 'MTI (moment to trim 1 inch)', measure: 'trimMoment', scale: 1e-5, required: true },
  { key: 'kmM', label: 'KM', measure: 'length', required: true },
];

const BOX: FigureSpec[] = [
  { key: 'lengthM', label: 'Length', measure: 'length', required: true },
  { key: 'breadthM', label: 'Breadth', measure: 'length', required: true },
  { key: 'draftM', label: 'Draft (intact)', measure: 'length', required: true },
  { key: 'depthM', label: 'Depth to deck edge', measure: 'length', required: false, hint: 'empty: the vessel’s depth' },
  { key: 'kgM', label: 'KG', measure: 'length', required: true },
  { key: 'lcgM', label: 'LCG', measure: 'length', required: false, hint: 'empty: half the length' },
  { key: 'tcgM', label: 'TCG', measure: 'length', required: false, hint: 'to port; empty: centreline' },
];

type FigureText = { value: string; from: string };
interface StabilityForm {
  kind: 'booklet' | 'box';
  openSpaceMethod: 'lost-buoyancy' | 'added-weight';
  particulars: Partial<Record<FigureKey, FigureText>>;
  /** Where she is aground (both empty: afloat). */
  aground: { position: { x: string; y: string }; from: string };
}

const labelOf = (f: FigureSpec, system: UnitSystem) => (system === 'us' && f.usLabel ? f.usLabel : f.label);

const MEASURES = byKey({ ...Object.fromEntries([...BOOKLET, ...BOX].map((f) => [f.key, f.measure])), x: 'length', y: 'length' });
const specsOf = (kind: StabilityForm['kind']) => (kind === 'box' ? BOX : BOOKLET);

function toModel(v: StabilityForm, system: UnitSystem): unknown {
  const particulars: Record<string, unknown> = { kind: v.kind };
  for (const f of specsOf(v.kind)) {
    const t = v.particulars[f.key];
    const valueText = t?.value ?? '';
    const from = t?.from?.trim() ?? '';
    if (!f.required && valueText.trim() === '' && from === '') continue;
    const si = parseField(valueText, f.measure, system);
    particulars[f.key] = { value: si === undefined ? undefined : si * (f.scale ?? 1), from: from === '' ? undefined : from };
  }
  const { x, y } = v.aground.position;
  const aground =
    x.trim() === '' && y.trim() === ''
      ? undefined
      : { position: { x: parseField(x, 'length', system), y: y.trim() === '' ? undefined : parseField(y, 'length', system) }, from: v.aground.from.trim() || undefined };
  return { particulars, openSpaceMethod: v.openSpaceMethod, aground };
}

function toForm(s: ConditionStability | undefined, survey: SectionProps['survey'], system: UnitSystem): StabilityForm {
  const p: Particulars | undefined = s?.particulars;
  const kind = p?.kind ?? 'booklet';
  const texts: StabilityForm['particulars'] = {};
  for (const f of [...BOOKLET, ...BOX]) {
    const fig = p ? (p as unknown as Record<string, { value: number; from?: string } | undefined>)[f.key] : undefined;
    texts[f.key] = { value: fig ? showField(fig.value / (f.scale ?? 1), f.measure, system) : '', from: fig?.from ?? '' };
  }
  // a box starts from the vessel's own length and breadth
  if (p?.kind !== 'box') {
    texts.lengthM = { value: showField(survey.vessel.lbpM, 'length', system), from: '' };
    texts.breadthM = { value: showField(survey.vessel.breadthM, 'length', system), from: '' };
  }
  const g = s?.aground;
  const aground = {
    position: { x: g ? showField(g.position.x, 'length', system) : '', y: g?.position.y !== undefined ? showField(g.position.y, 'length', system) : '' },
    from: g?.from ?? '',
  };
  return { kind, openSpaceMethod: s?.openSpaceMethod ?? 'lost-buoyancy', particulars: texts, aground };
}

function ParticularsEditor({ condition, survey, apply, system }: { condition: Condition; survey: SectionProps['survey']; apply: Apply; system: UnitSystem }) {
  // The latest condition, so saving particulars never brings back older readings or contents.
  const latest = useRef(condition);
  useEffect(() => {
    latest.current = condition;
  });
  const form = useForm<StabilityForm, unknown, ConditionStability>({
    mode: 'onChange',
    resolver: unitResolver(ConditionStabilitySchema, (v: StabilityForm) => toModel(v, system), system, MEASURES),
    defaultValues: toForm(condition.stability, survey, system),
  });
  const edit = (v: ConditionStability): EditOp => ({ kind: 'upsert', collection: 'conditions', entity: { ...latest.current, stability: v } });
  const state = useAutosave(form, (v, base) => apply(edit(v), base && edit(base)));
  const { register, formState } = form;
  const kind = useWatch({ control: form.control, name: 'kind' });
  const either = (k: 'kgM' | 'tpcT') => errorAt(formState.errors, `particulars.${k}`)?.message;
  return (
    <form className="space-y-3" onSubmit={(e) => e.preventDefault()} noValidate aria-label="Hydrostatic particulars">
      <FormError errors={formState.errors} />
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectInput
          register={register}
          name="kind"
          label="Particulars from"
          errors={formState.errors}
          options={[
            { value: 'booklet', label: 'The ship’s stability information' },
            { value: 'box', label: 'A box-shaped vessel (exact from L, B, T)' },
          ]}
        />
        <SelectInput
          register={register}
          name="openSpaceMethod"
          label="Spaces open to the sea"
          errors={formState.errors}
          options={[
            { value: 'lost-buoyancy', label: 'Lost buoyancy' },
            { value: 'added-weight', label: 'Added weight' },
          ]}
        />
      </div>
      <p className="text-sm text-ink-soft">
        The intact ship with every space modelled here empty: the liquids in them are added as weights (or as lost buoyancy).
      </p>
      {(either('kgM') || either('tpcT')) && (
        <p className="text-sm font-bold text-danger" role="alert">
          <span aria-hidden="true">▲ </span>
          {[either('kgM'), either('tpcT')].filter(Boolean).join('; ')}
        </p>
      )}
      <div className="grid gap-3 sm:grid-cols-2" key={kind}>
        {specsOf(kind).map((f) => (
          <fieldset key={f.key} className="space-y-1 rounded-md border border-line p-2">
            <legend className="sr-only">{labelOf(f, system)}</legend>
            <NumberInput
              register={register}
              name={`particulars.${f.key}.value`}
              label={labelOf(f, system)}
              unit={measureLabel(f.measure, system)}
              errors={formState.errors}
              hint={f.hint ?? (f.required ? undefined : 'optional')}
            />
            {kind === 'booklet' && (
              <TextInput register={register} name={`particulars.${f.key}.from`} label={`${labelOf(f, system)} from`} errors={formState.errors} placeholder="e.g. booklet p. 34" />
            )}
          </fieldset>
        ))}
      </div>
      <fieldset className="space-y-1 rounded-md border border-line p-2">
        <legend className="text-sm font-bold">Aground at</legend>
        <p className="text-xs text-ink-soft">
          Where she bears on the ground, if she is aground: the ground reaction follows from the drafts read, and the forecast holds her draft there
          until she comes off. Both empty: afloat.
        </p>
        <div className="grid gap-3 sm:grid-cols-3">
          <NumberInput register={register} name="aground.position.x" label="x" unit={measureLabel('length', system)} errors={formState.errors} hint="from the aft perpendicular" />
          <NumberInput register={register} name="aground.position.y" label="y" unit={measureLabel('length', system)} errors={formState.errors} hint="to port; empty: keel line" />
          <TextInput register={register} name="aground.from" label="Aground from" errors={formState.errors} placeholder="e.g. diver's survey" />
        </div>
      </fieldset>
      <SaveIndicator state={state} />
    </form>
  );
}

function DownfloodingEditor({ survey, apply, system }: { survey: SectionProps['survey']; apply: Apply; system: UnitSystem }) {
  const points = survey.vessel.downfloodingPoints ?? [];
  const [draft, setDraft] = useState({ name: '', kind: 'air-pipe', x: '', y: '', z: '' });
  const [errors, setErrors] = useState<Record<string, string>>({});
  /** The point being changed in place (its id kept), or null when the form adds a new one. */
  const [editingId, setEditingId] = useState<string | null>(null);
  const lu = measureLabel('length', system);
  const save = (next: typeof points) => apply({ kind: 'set', path: 'vessel', value: { ...survey.vessel, downfloodingPoints: next } });
  const add = async () => {
    const L = (t: string) => parseField(t, 'length', system);
    const r = DownfloodingPointSchema.safeParse({ id: editingId ?? crypto.randomUUID(), name: draft.name, kind: draft.kind, position: { x: L(draft.x), y: L(draft.y), z: L(draft.z) } });
    if (!r.success) {
      const e: Record<string, string> = {};
      for (const i of r.error.issues) e[String(i.path[i.path.length - 1])] = i.code === 'invalid_type' ? 'Required: enter a number.' : i.message;
      setErrors(e);
      return;
    }
    setErrors({});
    // A point removed elsewhere while it was being edited comes back rather than losing the edit.
    const inPlace = editingId !== null && points.some((q) => q.id === editingId);
    await save(inPlace ? points.map((q) => (q.id === editingId ? r.data : q)) : [...points, r.data]);
    setEditingId(null);
    setDraft({ name: '', kind: draft.kind, x: '', y: '', z: '' });
  };
  const edit = (p: (typeof points)[number]) => {
    setErrors({});
    setEditingId(p.id);
    const show = (v: number) => showField(v, 'length', system);
    setDraft({ name: p.name, kind: p.kind, x: show(p.position.x), y: show(p.position.y), z: show(p.position.z) });
  };
  const cancel = () => {
    setErrors({});
    setEditingId(null);
    setDraft({ name: '', kind: draft.kind, x: '', y: '', z: '' });
  };
  const field = (k: 'x' | 'y' | 'z', label: string) => (
    <label className="block text-sm font-bold">
      {label} <span className="font-normal text-ink-soft">({lu})</span>
      <input
        className="min-h-touch w-full rounded-md border-2 border-line bg-card px-2 aria-[invalid=true]:border-danger"
        inputMode="decimal"
        value={draft[k]}
        aria-invalid={errors[k] ? true : undefined}
        onChange={(e) => setDraft({ ...draft, [k]: e.target.value })}
      />
      {errors[k] && <span className="block text-danger">▲ {errors[k]}</span>}
    </label>
  );
  return (
    <section aria-labelledby="downflooding-h" className="space-y-2">
      <h3 id="downflooding-h" className="text-lg">
        Downflooding points
      </h3>
      {points.length === 0 && <p className="text-sm text-ink-soft">None yet: add air pipes, vents, doors and hatch coamings that would let water in.</p>}
      <ul className="space-y-1">
        {points.map((p) => (
          <li key={p.id} className="flex flex-wrap items-center gap-2 rounded-md border border-line bg-card p-2 text-sm">
            <b>{p.name}</b>
            <span className="text-ink-soft">
              {p.kind.replace('-', ' ')} · <span data-testid="downflooding-position">{pointWords(p.position, system)}</span>
            </span>
            <button type="button" className={`${secondaryBtn} ml-auto`} aria-label={`Edit ${p.name}`} onClick={() => edit(p)}>
              Edit
            </button>
            <button
              type="button"
              className={dangerBtn}
              onClick={() => {
                if (p.id === editingId) cancel();
                void save(points.filter((q) => q.id !== p.id));
              }}
            >
              Remove
            </button>
          </li>
        ))}
      </ul>
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-5">
        <label className="col-span-2 block text-sm font-bold sm:col-span-1">
          Name
          <input
            className="min-h-touch w-full rounded-md border-2 border-line bg-card px-2 aria-[invalid=true]:border-danger"
            value={draft.name}
            aria-invalid={errors.name ? true : undefined}
            onChange={(e) => setDraft({ ...draft, name: e.target.value })}
          />
          {errors.name && <span className="block text-danger">▲ {errors.name}</span>}
        </label>
        <label className="block text-sm font-bold max-sm:col-span-full">
          Kind
          <select className="min-h-touch w-full rounded-md border-2 border-line bg-card px-2" value={draft.kind} onChange={(e) => setDraft({ ...draft, kind: e.target.value })}>
            {DOWNFLOODING_KINDS.map((k) => (
              <option key={k} value={k}>
                {k.replace('-', ' ')}
              </option>
            ))}
          </select>
        </label>
        {field('x', 'x (fwd of AP)')}
        {field('y', 'y (to port)')}
        {field('z', 'z (above base)')}
      </div>
      <div className="flex flex-wrap gap-2">
        <button type="button" className={secondaryBtn} onClick={() => void add()}>
          {editingId ? 'Save changes to this point' : '+ Add downflooding point'}
        </button>
        {editingId && (
          <button type="button" className={secondaryBtn} onClick={cancel}>
            Cancel editing
          </button>
        )}
      </div>
    </section>
  );
}

export function StabilitySection({ survey, results, apply, system }: SectionProps) {
  const condition = activeCondition(survey);
  const remove = () => {
    const rest: Condition = { ...condition };
    delete rest.stability;
    void apply({ kind: 'upsert', collection: 'conditions', entity: rest });
  };
  return (
    <section aria-labelledby="stability-h" className="space-y-4">
      <h2 id="stability-h" className="text-2xl">
        Stability
      </h2>
      <ShipResponsePanel survey={survey} results={results} system={system} />
      <h3 className="text-lg">Hydrostatic particulars for {condition.name ?? 'these readings'}</h3>
      <ParticularsEditor key={`${condition.id}-${system}`} condition={condition} survey={survey} apply={apply} system={system} />
      {condition.stability && (
        <button type="button" className={dangerBtn} onClick={remove}>
          Remove the particulars
        </button>
      )}
      <DownfloodingEditor survey={survey} apply={apply} system={system} />
    </section>
  );
}
