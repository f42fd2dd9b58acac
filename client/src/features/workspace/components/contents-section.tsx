/** "Contents": what each compartment holds in the readings in use: layers bottom up, each level from a sounding, ullage or the sea, and the gas space. */
import { useFieldArray, useForm } from 'react-hook-form';
import { ContentsSchema, type Compartment, type Condition, type Contents, type LevelSource } from '@shared/schemas/survey';
import { catalogueFluid } from '@shared/fluids/catalogue';
import { fluidOptions } from '../utils/fluid-options';
import type { UnitSystem } from '@shared/units/units';
import { formatNumber } from '@shared/units/units';
import { byKey, measureLabel, parseField, showField, unitResolver } from '../utils/form-units';
import { NumberInput, SelectInput, FormError, primaryBtn, secondaryBtn, dangerBtn, errorAt } from '@client/components/ui/fields';
import { useAutosave } from '../hooks/use-autosave';
import { SaveIndicator } from './save-indicator';
import type { Apply, EditOp, SectionProps } from '../utils/types';
import { activeCondition, newId } from '../utils/new-entities';
import { display, unitLabel, fmt } from '@client/lib/unit-system';
import type { Survey } from '@shared/schemas/survey';
import { settleMarks, withMark, type Marks } from '@shared/schemas/marks';
import { MarkChip } from './mark-chip';
import { VirtualList } from '@client/components/ui/virtual-list';
import { withheldSentence } from '@shared/engine';
import { formatShipAndUtc } from '@shared/review/time-words';
import { conditionName } from '@shared/review/plain-words';

type LevelKind = LevelSource['kind'];

interface LayerForm {
  id: string;
  fluidId: string;
  density: string;
  levelKind: LevelKind;
  px: string;
  py: string;
  pz: string;
  reading: string;
  /** Ullages: how the tape ran (along the pipe, the ship's z axis; or plumb, earth-vertical). */
  tape: 'along-pipe' | 'plumb';
  /** Not an input: this layer's marks ("level" estimated), set by the chip under the reading. */
  marks: Marks;
}

interface ContentsForm {
  gasKind: 'vented' | 'pressurised';
  gasPressure: string;
  layers: LayerForm[];
}

const LEVEL_LABEL: Record<LevelKind, string> = {
  sounding: 'Sounding (up from the pipe bottom)',
  ullage: 'Ullage (down from a reference point)',
  interfaceSounding: 'Interface sounding (water-finding paste)',
  openToSea: 'Open to sea (outside waterline)',
  point: 'Surface passes through a point',
};

const MEASURES = byKey({ x: 'length', y: 'length', z: 'length', bottomZM: 'length', soundingM: 'length', ullageM: 'length', densityKgM3: 'density', gaugePressurePa: 'pressure' });

function centreOf(c: Compartment): { x: number; y: number; zb: number; zt: number } {
  const g = c.geometry;
  if (g.kind === 'box') return { x: (g.min.x + g.max.x) / 2, y: (g.min.y + g.max.y) / 2, zb: g.min.z, zt: g.max.z };
  const ys = g.section.map((p) => p.y), zs = g.section.map((p) => p.z);
  return { x: (g.xAftM + g.xForeM) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2, zb: Math.min(...zs), zt: Math.max(...zs) };
}

function layerToForm(l: Contents['layers'][number], system: UnitSystem, c: Compartment): LayerForm {
  const S = (n: number | undefined) => showField(n, 'length', system);
  const ctr = centreOf(c);
  const base = { id: l.id, fluidId: l.fluidId, density: showField(l.densityKgM3, 'density', system), levelKind: l.level.kind, px: S(ctr.x), py: S(ctr.y), pz: S(ctr.zb), reading: '', tape: 'along-pipe' as LayerForm['tape'], marks: l.marks ?? {} };
  const lv = l.level;
  switch (lv.kind) {
    case 'sounding':
    case 'interfaceSounding':
      return { ...base, px: S(lv.pipe.x), py: S(lv.pipe.y), pz: S(lv.pipe.bottomZM), reading: S(lv.soundingM) };
    case 'ullage':
      return { ...base, px: S(lv.reference.x), py: S(lv.reference.y), pz: S(lv.reference.z), reading: S(lv.ullageM), tape: lv.tape ?? 'along-pipe' };
    case 'point':
      return { ...base, px: S(lv.point.x), py: S(lv.point.y), pz: S(lv.point.z) };
    default:
      return base;
  }
}

function toModel(v: ContentsForm, compartmentId: string, system: UnitSystem, before: Contents): unknown {
  const L = (t: string) => parseField(t, 'length', system);
  return {
    compartmentId,
    gas: v.gasKind === 'pressurised' ? { kind: 'pressurised', gaugePressurePa: parseField(v.gasPressure, 'pressure', system) } : { kind: 'vented' },
    layers: v.layers.map((l) => {
      const level =
        l.levelKind === 'sounding' || l.levelKind === 'interfaceSounding'
          ? { kind: l.levelKind, pipe: { x: L(l.px), y: L(l.py), bottomZM: L(l.pz) }, soundingM: L(l.reading) }
          : l.levelKind === 'ullage'
            ? { kind: 'ullage', reference: { x: L(l.px), y: L(l.py), z: L(l.pz) }, ullageM: L(l.reading), tape: l.tape === 'plumb' ? 'plumb' : undefined }
            : l.levelKind === 'point'
              ? { kind: 'point', point: { x: L(l.px), y: L(l.py), z: L(l.pz) } }
              : { kind: 'openToSea' };
      const layer = { id: l.id, fluidId: l.fluidId, densityKgM3: parseField(l.density, 'density', system), level };
      return { ...layer, marks: settleMarks(l.marks, before.layers.find((x) => x.id === l.id), layer) };
    }),
  };
}

function ContentsEditor({ survey, condition, compartment, contents, apply, system }: { survey: Survey; condition: Condition; compartment: Compartment; contents: Contents; apply: Apply; system: UnitSystem }) {
  const form = useForm<ContentsForm, unknown, Contents>({
    mode: 'onChange',
    resolver: unitResolver(ContentsSchema, (v: ContentsForm) => toModel(v, compartment.id, system, contents), system, MEASURES),
    defaultValues: {
      gasKind: contents.gas?.kind ?? 'vented',
      gasPressure: contents.gas?.kind === 'pressurised' ? showField(contents.gas.gaugePressurePa, 'pressure', system) : '',
      layers: contents.layers.map((l) => layerToForm(l, system, compartment)),
    },
  });
  const { fields, append, remove, move } = useFieldArray({ control: form.control, name: 'layers', keyName: 'key' });
  const others = condition.contents.filter((k) => k.compartmentId !== compartment.id);
  const edit = (v: Contents): EditOp => ({ kind: 'upsert', collection: 'conditions', entity: { ...condition, contents: [...others, v] } });
  const save = (v: Contents, base: Contents | undefined) => apply(edit(v), base && edit(base));
  const state = useAutosave(form, save);
  const { register, formState, watch } = form;
  const e = formState.errors;
  const lu = measureLabel('length', system);
  const gasKind = watch('gasKind');
  const layers = watch('layers');
  const ctr = centreOf(compartment);
  const S = (n: number) => showField(n, 'length', system);
  const addLayer = (fluidId: string) => {
    const below = layers.at(-1);
    append({ id: newId(), fluidId, density: '', levelKind: 'sounding', px: below?.px ?? S(ctr.x), py: below?.py ?? S(ctr.y), pz: below?.pz ?? S(ctr.zb), reading: '', tape: 'along-pipe', marks: {} });
  };
  const layerErr = (i: number, ...paths: string[]) => paths.map((p) => errorAt(e, `layers.${i}.${p}`)).find(Boolean);
  return (
    <form className="space-y-3" onSubmit={(ev) => ev.preventDefault()} noValidate aria-label={`Contents of ${compartment.name}`}>
      <FormError errors={formState.errors} />
      <ol className="flex flex-col-reverse gap-3" aria-label="Layers, top first">
        {fields.map((f, i) => {
          const l = layers[i];
          const kind = l?.levelKind ?? 'sounding';
          const fluid = catalogueFluid(l?.fluidId ?? '') ?? survey.fluids.find((x) => x.id === l?.fluidId);
          const defaultDensity = fluid && 'densityKgM3' in fluid && fluid.densityKgM3 ? fluid.densityKgM3 : undefined;
          const isOil = (fluid && 'category' in fluid && fluid.category === 'oil') ?? false;
          const readingLabel = kind === 'ullage' ? 'Ullage' : kind === 'interfaceSounding' ? 'Interface sounding' : 'Sounding';
          return (
            <li key={f.key} className={`rounded-lg border-2 p-3 ${isOil ? 'border-oil bg-oil-soft' : 'border-sea bg-sea-soft'}`} data-testid="layer">
              <div className="mb-2 flex flex-wrap items-center gap-2">
                <span className="font-bold">Layer {i + 1}{i === 0 ? ' (bottom)' : ''}</span>
                <span className="ml-auto flex gap-1">
                  {i > 0 && (
                    <button type="button" className={secondaryBtn} onClick={() => move(i, i - 1)} aria-label={`Move layer ${i + 1} down`}>
                      ↓
                    </button>
                  )}
                  {i < fields.length - 1 && (
                    <button type="button" className={secondaryBtn} onClick={() => move(i, i + 1)} aria-label={`Move layer ${i + 1} up`}>
                      ↑
                    </button>
                  )}
                  <button type="button" className={dangerBtn} onClick={() => remove(i)}>
                    Remove
                  </button>
                </span>
              </div>
              <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                <SelectInput register={register} name={`layers.${i}.fluidId`} label="Liquid" errors={{ layers: { [i]: { fluidId: layerErr(i, 'fluidId') } } }} options={fluidOptions(survey.fluids)} />
                <NumberInput
                  register={register}
                  name={`layers.${i}.density`}
                  label="Measured density"
                  unit={unitLabel('density', system)}
                  errors={{ layers: { [i]: { density: layerErr(i, 'densityKgM3') } } }}
                  placeholder={defaultDensity ? formatNumber(display(defaultDensity, 'density', system), 4) : ''}
                  hint={l?.fluidId === 'sea-water' ? 'empty: the sea water density of these readings' : undefined}
                  extra={
                    (l?.density ?? '').trim() === '' && defaultDensity && l?.fluidId !== 'sea-water' ? (
                      <MarkChip
                        mark="assumed"
                        assumedValue={`${formatNumber(display(defaultDensity, 'density', system), 4)} ${unitLabel('density', system)}, catalogue`}
                        onChange={() => undefined}
                        onConfirm={() => form.setValue(`layers.${i}.density`, formatNumber(display(defaultDensity, 'density', system), 4), { shouldDirty: true })}
                      />
                    ) : undefined
                  }
                />
                <div className="col-span-2">
                  <SelectInput register={register} name={`layers.${i}.levelKind`} label="Top of this layer from" errors={{}} options={(Object.keys(LEVEL_LABEL) as LevelKind[]).map((k) => ({ value: k, label: LEVEL_LABEL[k] }))} />
                </div>
                {(kind === 'sounding' || kind === 'interfaceSounding' || kind === 'ullage') && (
                  <NumberInput
                    register={register}
                    name={`layers.${i}.reading`}
                    label={readingLabel}
                    unit={lu}
                    errors={{ layers: { [i]: { reading: layerErr(i, 'level.soundingM', 'level.ullageM') } } }}
                    hint={(l?.reading ?? '').trim() === '' ? 'not read yet: no loads for this space until it is' : undefined}
                    extra={
                      <MarkChip
                        mark={l?.marks.level}
                        canEstimate={(l?.reading ?? '').trim() !== ''}
                        onChange={(m) => form.setValue(`layers.${i}.marks`, withMark(l?.marks, 'level', m) ?? {}, { shouldDirty: true })}
                      />
                    }
                  />
                )}
                {kind === 'ullage' && (
                  <div className="col-span-2">
                    <SelectInput
                      register={register}
                      name={`layers.${i}.tape`}
                      label="How the ullage tape ran"
                      errors={{}}
                      options={[
                        { value: 'along-pipe', label: 'Along the pipe (slants with heel)' },
                        { value: 'plumb', label: 'Plumb (hangs straight down)' },
                      ]}
                      hint={
                        l?.tape === 'plumb'
                          ? 'the tape hung true vertical: the level is the reference point\'s height less the ullage, whatever the heel'
                          : "read along the ship's upright: at heel the tape runs slant, and the level is taken along that line"
                      }
                    />
                  </div>
                )}
                {kind !== 'openToSea' && (
                  <>
                    <NumberInput register={register} name={`layers.${i}.px`} label={kind === 'point' ? 'Point x' : kind === 'ullage' ? 'Reference x' : 'Pipe x'} unit={lu} errors={{ layers: { [i]: { px: layerErr(i, 'level.pipe.x', 'level.reference.x', 'level.point.x') } } }} />
                    <NumberInput register={register} name={`layers.${i}.py`} label={kind === 'point' ? 'Point y' : kind === 'ullage' ? 'Reference y' : 'Pipe y'} unit={lu} errors={{ layers: { [i]: { py: layerErr(i, 'level.pipe.y', 'level.reference.y', 'level.point.y') } } }} />
                    <NumberInput
                      register={register}
                      name={`layers.${i}.pz`}
                      label={kind === 'point' ? 'Point z' : kind === 'ullage' ? 'Reference height z' : 'Pipe bottom z'}
                      unit={lu}
                      errors={{ layers: { [i]: { pz: layerErr(i, 'level.pipe.bottomZM', 'level.reference.z', 'level.point.z') } } }}
                    />
                  </>
                )}
              </div>
            </li>
          );
        })}
      </ol>
      {fields.length === 0 && <p className="text-ink-soft">Dry: no liquid entered for this space.</p>}
      <div className="flex flex-wrap gap-2">
        <button type="button" className={primaryBtn} onClick={() => addLayer('sea-water')}>
          + Sea water layer
        </button>
        <button type="button" className={secondaryBtn} onClick={() => addLayer('dma')}>
          + Oil layer
        </button>
      </div>
      <fieldset className="grid grid-cols-2 gap-3">
        <legend className="mb-1 font-bold">Gas space above the liquid</legend>
        <SelectInput
          register={register}
          name="gasKind"
          label="Gas space"
          errors={{}}
          options={[
            { value: 'vented', label: 'Vented (open to air)' },
            { value: 'pressurised', label: 'Pressurised or under suction' },
          ]}
        />
        {gasKind === 'pressurised' && (
          <NumberInput register={register} name="gasPressure" label="Gauge pressure" unit={measureLabel('pressure', system)} errors={{ gasPressure: errorAt(e, 'gas.gaugePressurePa') }} hint="negative for suction" />
        )}
      </fieldset>
      <SaveIndicator state={state} />
    </form>
  );
}

export function ContentsSection({ survey, results, apply, system, selectedId, select }: SectionProps) {
  const condition = activeCondition(survey);
  const compartment = survey.compartments.find((c) => c.id === selectedId) ?? survey.compartments[0] ?? null;
  const contents = compartment ? condition.contents.find((k) => k.compartmentId === compartment.id) : undefined;
  const start = async () => {
    if (!compartment) return;
    const ctr = centreOf(compartment);
    const entry: Contents = {
      compartmentId: compartment.id,
      gas: { kind: 'vented' },
      // the pipe is placed at the space's centre to start with; the sounding waits for the tape
      layers: [{ id: newId(), fluidId: 'sea-water', level: { kind: 'sounding', pipe: { x: ctr.x, y: ctr.y, bottomZM: ctr.zb } } }],
    };
    await apply({ kind: 'upsert', collection: 'conditions', entity: { ...condition, contents: [...condition.contents, entry] } });
  };
  const clear = async () => {
    if (!compartment) return;
    await apply({ kind: 'upsert', collection: 'conditions', entity: { ...condition, contents: condition.contents.filter((k) => k.compartmentId !== compartment.id) } });
  };
  const cr = results?.compartments.find((c) => c.id === compartment?.id);
  const held = results?.withheld?.find((w) => w.entityId === compartment?.id);
  return (
    <section aria-labelledby="contents-h" className="space-y-4">
      <h2 id="contents-h" className="text-2xl">
        Contents
      </h2>
      <p className="text-sm text-ink-soft">In the readings “{conditionName(condition, survey.vessel.shipTimeOffsetMin)}”, taken {formatShipAndUtc(condition.time, survey.vessel.shipTimeOffsetMin)}. Layers from the bottom up; the top of each is where its level was read.</p>
      {survey.compartments.length === 0 ? (
        <p className="text-ink-soft">Add compartments under Spaces first.</p>
      ) : (
        <VirtualList
          items={survey.compartments}
          itemKey={(c) => c.id}
          label="Compartment"
          className="flex flex-wrap gap-2"
          active={compartment ? survey.compartments.indexOf(compartment) : -1}
          render={(c) => (
            <button type="button" className={c.id === compartment?.id ? primaryBtn : secondaryBtn} aria-pressed={c.id === compartment?.id} onClick={() => select(c.id)}>
              {c.name}
            </button>
          )}
        />
      )}
      {compartment && (
        <div className="rounded-lg border-2 border-hull bg-card p-3">
          {held && (
            <p className="mb-2 rounded-md border-2 border-caution bg-caution-soft p-2 text-sm font-bold" data-testid="contents-withheld">
              {withheldSentence(held)}
            </p>
          )}
          {cr && (
            <p className="mb-2 text-sm" data-testid="contents-summary">
              <b>{compartment.name}:</b> {fmt(cr.liquid.volumeM3, 'volume', system)} of liquid, {fmt(cr.liquid.massKg, 'mass', system)}, {(cr.fillFraction * 100).toFixed(0)} % full
            </p>
          )}
          {contents ? (
            <>
              <ContentsEditor key={`${compartment.id}-${condition.id}-${system}`} survey={survey} condition={condition} compartment={compartment} contents={contents} apply={apply} system={system} />
              <button type="button" className={`${dangerBtn} mt-2`} onClick={() => void clear()}>
                Mark {compartment.name} dry
              </button>
            </>
          ) : (
            <div className="space-y-2">
              <p>{compartment.openToSea ? `${compartment.name} is open to the sea: it floods to the outside waterline.` : `${compartment.name} is dry in these readings.`}</p>
              <button type="button" className={primaryBtn} onClick={() => void start()}>
                Enter contents of {compartment.name}
              </button>
            </div>
          )}
        </div>
      )}
    </section>
  );
}
