/** "Spaces": the compartments, as a box or a prism between two frames, with permeability and openness to the sea. */
import { MarkChip } from './mark-chip';
import { useForm } from 'react-hook-form';
import { useId, useMemo } from 'react';
import { CompartmentSchema, type Compartment, type Survey } from '@shared/schemas/survey';
import type { TankState } from '@shared/schemas/flooding';
import { mouldedVolumeM3, tankFloodRoom, TANK_PERMEABILITY_SOURCE } from '@shared/engine';
import { fluidOptions } from '../utils/fluid-options';
import { CARGO_PERMEABILITY, defaultPermeability, SPACE_TYPES, type CargoState, type SpaceType } from '@shared/schemas/space-types';
import type { UnitSystem } from '@shared/units/units';
import { byKey, measureLabel, parseField, showField, unitResolver } from '../utils/form-units';
import { NumberInput, TextInput, SelectInput, FormError, primaryBtn, dangerBtn, secondaryBtn, inputCls, Field, errorAt } from '@client/components/ui/fields';
import { useAutosave } from '../hooks/use-autosave';
import { SaveIndicator } from './save-indicator';
import type { Apply, EditOp, SectionProps } from '../utils/types';
import { newCompartment } from '../utils/new-entities';
import { frameToX, parseFrameText, useFrameTable, type FrameTable } from '../utils/frames';
import { parseX } from '../utils/parse-x';
import { fmt } from '@client/lib/unit-system';
import { VirtualList } from '@client/components/ui/virtual-list';

export const SPACE_TYPE_LABEL: Record<SpaceType, string> = {
  'dry-cargo': 'Dry cargo hold',
  container: 'Container hold',
  'ro-ro': 'Ro-ro deck',
  stores: 'Stores',
  accommodation: 'Accommodation',
  machinery: 'Machinery space',
  void: 'Void',
  tank: 'Tank',
};

interface CompartmentForm {
  name: string;
  spaceType: SpaceType;
  permeability: string;
  cargoState: CargoState | '';
  tankState: TankState | '';
  tankFluid: string;
  tankVolume: string;
  openToSea: boolean;
  kind: 'box' | 'prism';
  xAft: string;
  xFore: string;
  yStbd: string;
  yPort: string;
  zBottom: string;
  zTop: string;
  section: string;
}

const MEASURES = byKey({ x: 'length', y: 'length', z: 'length', xAftM: 'length', xForeM: 'length', permeability: 'ratio', volumeM3: 'volume' });

function parseSection(text: string, system: UnitSystem): { y: number | undefined; z: number | undefined }[] {
  return text
    .split(/\n|;/)
    .map((l) => l.trim())
    .filter(Boolean)
    .map((l) => {
      const [y, z] = l.split(/[\s,]+/);
      return { y: parseField(y ?? '', 'length', system), z: parseField(z ?? '', 'length', system) };
    });
}

function toModel(v: CompartmentForm, base: Compartment, system: UnitSystem, frames: FrameTable): unknown {
  const L = (t: string) => parseField(t, 'length', system);
  const xa = parseX(v.xAft, system, frames);
  const xf = parseX(v.xFore, system, frames);
  const geometry =
    v.kind === 'box'
      ? { kind: 'box', min: { x: xa, y: L(v.yStbd), z: L(v.zBottom) }, max: { x: xf, y: L(v.yPort), z: L(v.zTop) } }
      : { kind: 'prism', xAftM: xa, xForeM: xf, section: parseSection(v.section, system) };
  return {
    ...base,
    name: v.name,
    spaceType: v.spaceType,
    permeability: v.permeability.trim() === '' ? undefined : Number(v.permeability.replace(',', '.')),
    cargoState: CARGO_PERMEABILITY[v.spaceType] && v.cargoState !== '' ? v.cargoState : undefined,
    tankContents:
      v.spaceType === 'tank' && v.tankState !== ''
        ? {
            state: v.tankState,
            fluidId: v.tankState === 'empty' || v.tankFluid === '' ? undefined : v.tankFluid,
            volumeM3: v.tankState === 'part-full' ? parseField(v.tankVolume, 'volume', system) : undefined,
          }
        : undefined,
    openToSea: v.openToSea || undefined,
    geometry,
  };
}

function defaults(c: Compartment, system: UnitSystem): CompartmentForm {
  const S = (n: number | undefined) => showField(n, 'length', system);
  const g = c.geometry;
  const base = {
    name: c.name,
    spaceType: c.spaceType,
    permeability: c.permeability === undefined ? '' : String(c.permeability),
    cargoState: (c.cargoState ?? '') as CargoState | '',
    tankState: (c.tankContents?.state ?? '') as TankState | '',
    tankFluid: c.tankContents?.fluidId ?? '',
    tankVolume: showField(c.tankContents?.volumeM3, 'volume', system),
    openToSea: c.openToSea ?? false,
  };
  if (g.kind === 'box') {
    return { ...base, kind: 'box', xAft: S(g.min.x), xFore: S(g.max.x), yStbd: S(g.min.y), yPort: S(g.max.y), zBottom: S(g.min.z), zTop: S(g.max.z), section: '' };
  }
  const ys = g.section.map((p) => p.y), zs = g.section.map((p) => p.z);
  return {
    ...base,
    kind: 'prism',
    xAft: S(g.xAftM),
    xFore: S(g.xForeM),
    yStbd: S(Math.min(...ys)),
    yPort: S(Math.max(...ys)),
    zBottom: S(Math.min(...zs)),
    zTop: S(Math.max(...zs)),
    section: g.section.map((p) => `${S(p.y)}, ${S(p.z)}`).join('\n'),
  };
}

/**
 * The compartment's schema with one check the survey format cannot make alone: a part-full tank's own
 * liquid must fit in what the tank holds (its permeability × its moulded volume).
 */
function formSchema(system: UnitSystem) {
  return CompartmentSchema.superRefine((c, ctx) => {
    const t = c.tankContents;
    if (c.spaceType !== 'tank' || t?.state !== 'part-full' || t.volumeM3 === undefined) return;
    const gross = mouldedVolumeM3(c.geometry);
    const capacity = (c.permeability ?? defaultPermeability('tank', undefined).value) * gross;
    if (t.volumeM3 > capacity * (1 + 1e-9)) {
      ctx.addIssue({ code: 'custom', path: ['tankContents', 'volumeM3'], message: `More than the tank holds: ${fmt(capacity, 'volume', system)} (choose "Full")` });
    }
  });
}

function CompartmentEditor({ compartment, survey, apply, system }: { compartment: Compartment; survey: Survey; apply: Apply; system: UnitSystem }) {
  const frames = useFrameTable(survey.id);
  const schema = useMemo(() => formSchema(system), [system]);
  const form = useForm<CompartmentForm, unknown, Compartment>({
    mode: 'onChange',
    resolver: unitResolver(schema, (v: CompartmentForm) => toModel(v, compartment, system, frames), system, MEASURES),
    defaultValues: defaults(compartment, system),
  });
  const edit = (v: Compartment): EditOp => ({ kind: 'upsert', collection: 'compartments', entity: v });
  const state = useAutosave(form, (v, base) => apply(edit(v), base && edit(base)));
  const { register, formState, watch, setValue } = form;
  const kind = watch('kind');
  const spaceType = watch('spaceType');
  const cargoState = watch('cargoState');
  const perm = defaultPermeability(spaceType, cargoState === '' ? undefined : cargoState);
  const permeability = watch('permeability');
  const tankState = watch('tankState');
  const xAft = watch('xAft');
  const xFore = watch('xFore');
  const lu = measureLabel('length', system);
  const sectionId = useId();
  const openId = useId();
  const e = formState.errors;
  const frameHint = (t: string) => {
    const f = parseFrameText(t);
    return f === null ? 'number or Fr 45' : `Fr ${f} = ${fmt(frameToX(f, frames), 'length', system)}`;
  };
  const geomErr = errorAt(e, 'geometry.min.x') ?? errorAt(e, 'geometry.xAftM');
  return (
    <form className="space-y-3" onSubmit={(ev) => ev.preventDefault()} noValidate aria-label={`Compartment ${compartment.name}`}>
      <FormError errors={formState.errors} />
      <div className="grid gap-3 sm:grid-cols-3">
        <TextInput register={register} name="name" label="Name" errors={e} />
        <SelectInput register={register} name="spaceType" label="Space type" errors={e} options={SPACE_TYPES.map((t) => ({ value: t, label: SPACE_TYPE_LABEL[t] }))} />
        <NumberInput
          register={register}
          name="permeability"
          label="Permeability"
          unit=""
          errors={e}
          placeholder={perm.value.toFixed(2)}
          hint={`empty: default ${perm.value.toFixed(2)} (${perm.source})`}
          extra={
            permeability.trim() === '' ? (
              <MarkChip
                mark="assumed"
                assumedValue={`${perm.value.toFixed(2)}, ${perm.source}`}
                onChange={() => undefined}
                onConfirm={() => setValue('permeability', perm.value.toFixed(2), { shouldDirty: true })}
              />
            ) : undefined
          }
        />
      </div>
      {CARGO_PERMEABILITY[spaceType] && (
        <SelectInput
          register={register}
          name="cargoState"
          label="How loaded is the space? (sets the default permeability)"
          errors={e}
          options={[
            { value: '', label: `Not stated (taken as loaded, ${CARGO_PERMEABILITY[spaceType]!.loaded.toFixed(2)})` },
            { value: 'empty', label: `Empty of cargo (${CARGO_PERMEABILITY[spaceType]!.empty.toFixed(2)})` },
            { value: 'part-loaded', label: `Part loaded (${CARGO_PERMEABILITY[spaceType]!['part-loaded'].toFixed(2)})` },
            { value: 'loaded', label: `Loaded (${CARGO_PERMEABILITY[spaceType]!.loaded.toFixed(2)})` },
          ]}
        />
      )}
      {spaceType === 'tank' && (
        <TankContentsFields
          compartment={compartment}
          survey={survey}
          form={form}
          tankState={tankState}
          permeability={permeability.trim() === '' ? perm.value : Number(permeability.replace(',', '.'))}
          system={system}
        />
      )}
      <div className="flex items-center gap-2">
        <input id={openId} type="checkbox" className="size-6" {...register('openToSea')} />
        <label htmlFor={openId} className="font-bold">
          Open to the sea (floods to the outside waterline unless contents are given)
        </label>
      </div>
      <SelectInput
        register={register}
        name="kind"
        label="Shape"
        errors={e}
        options={[
          { value: 'box', label: 'Box (side to side, floor to top)' },
          { value: 'prism', label: 'Prism (a drawn section)' },
        ]}
      />
      <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-3">
        <legend className="mb-1 font-bold">Ends (x from the aft perpendicular)</legend>
        <NumberInput register={register} name="xAft" label="Aft end" unit={lu} errors={{ xAft: geomErr }} allowFrames hint={frameHint(xAft)} />
        <NumberInput register={register} name="xFore" label="Forward end" unit={lu} errors={{ xFore: errorAt(e, 'geometry.max.x') ?? errorAt(e, 'geometry.xForeM') }} allowFrames hint={frameHint(xFore)} />
      </fieldset>
      {kind === 'box' ? (
        <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          <legend className="mb-1 font-bold">Sides and heights</legend>
          <NumberInput register={register} name="yStbd" label="Starboard side y" unit={lu} errors={{ yStbd: errorAt(e, 'geometry.min.y') }} hint="negative to starboard" />
          <NumberInput register={register} name="yPort" label="Port side y" unit={lu} errors={{ yPort: errorAt(e, 'geometry.max.y') }} />
          <NumberInput register={register} name="zBottom" label="Floor height z" unit={lu} errors={{ zBottom: errorAt(e, 'geometry.min.z') }} hint="above baseline" />
          <NumberInput register={register} name="zTop" label="Top height z" unit={lu} errors={{ zTop: errorAt(e, 'geometry.max.z') }} />
        </fieldset>
      ) : (
        <Field
          id={sectionId}
          label="Section corners: y, z on each line"
          unit={lu}
          error={errorAt(e, 'geometry.section')?.message ?? ((e as Record<string, unknown>).geometry ? 'Check the section corners: each line needs y and z.' : undefined)}
          hint="y positive to port, z above baseline; at least 3 corners, in order round the section"
        >
          <textarea id={sectionId} className={`${inputCls} py-2 font-mono`} rows={5} {...register('section')} />
        </Field>
      )}
      <SaveIndicator state={state} />
    </form>
  );
}

export function SpacesSection({ survey, apply, system, selectedId, select }: SectionProps) {
  const selected = survey.compartments.find((c) => c.id === selectedId) ?? null;
  const add = async () => {
    const c = newCompartment(survey);
    await apply({ kind: 'upsert', collection: 'compartments', entity: c });
    select(c.id);
  };
  return (
    <section aria-labelledby="spaces-h" className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="spaces-h" className="text-2xl">
          Spaces
        </h2>
        <button type="button" className={primaryBtn} onClick={() => void add()}>
          + Add compartment
        </button>
      </div>
      {survey.compartments.length === 0 && <p className="text-ink-soft">No compartments yet: add the flooded holds, tanks and spaces next to them.</p>}
      <VirtualList
        items={survey.compartments}
        itemKey={(c) => c.id}
        label="Compartments"
        className="flex flex-wrap gap-2"
        active={selected ? survey.compartments.indexOf(selected) : -1}
        render={(c) => (
          <button
            type="button"
            className={c.id === selectedId ? primaryBtn : secondaryBtn}
            aria-pressed={c.id === selectedId}
            onClick={() => select(c.id === selectedId ? null : c.id)}
          >
            {c.name}
            {c.openToSea && <span className="text-xs font-normal">(open to sea)</span>}
          </button>
        )}
      />
      {selected && (
        <div className="rounded-lg border-2 border-hull bg-card p-3">
          <CompartmentEditor key={`${selected.id}-${system}`} compartment={selected} survey={survey} apply={apply} system={system} />
          <DeleteCompartment survey={survey} compartment={selected} apply={apply} onDeleted={() => select(null)} />
        </div>
      )}
    </section>
  );
}

function DeleteCompartment({ survey, compartment, apply, onDeleted }: { survey: SectionProps['survey']; compartment: Compartment; apply: Apply; onDeleted: () => void }) {
  const users = survey.boundaries.filter(
    (b) => (b.sideA.kind === 'compartment' && b.sideA.compartmentId === compartment.id) || (b.sideB.kind === 'compartment' && b.sideB.compartmentId === compartment.id),
  );
  if (users.length > 0) {
    return (
      <p className="mt-2 text-sm text-ink-soft">
        To delete {compartment.name}, first change or delete the boundaries that face it: {users.map((b) => b.name).join(', ')}.
      </p>
    );
  }
  const remove = async () => {
    // its contents go with it, in every set of readings
    for (const c of survey.conditions) {
      if (c.contents.some((k) => k.compartmentId === compartment.id)) {
        await apply({ kind: 'upsert', collection: 'conditions', entity: { ...c, contents: c.contents.filter((k) => k.compartmentId !== compartment.id) } });
      }
    }
    await apply({ kind: 'delete', collection: 'compartments', entityId: compartment.id });
    onDeleted();
  };
  return (
    <button type="button" className={`${dangerBtn} mt-2`} onClick={() => void remove()}>
      Delete {compartment.name}
    </button>
  );
}

/**
 * A tank's own liquid before the casualty: the engine tells it from flood water, which takes only the
 * room it leaves (SOLAS II-1/7-3 gives tanks 0 or 0.95: none when full, 0.95 of the tank when empty).
 */
function TankContentsFields({
  compartment,
  survey,
  form,
  tankState,
  permeability,
  system,
}: {
  compartment: Compartment;
  survey: Survey;
  form: ReturnType<typeof useForm<CompartmentForm, unknown, Compartment>>;
  tankState: TankState | '';
  permeability: number;
  system: UnitSystem;
}) {
  const { register, formState } = form;
  const e = formState.errors;
  const gross = mouldedVolumeM3(compartment.geometry);
  const mu = Number.isFinite(permeability) ? permeability : 0.95;
  const volume = parseField(form.watch('tankVolume'), 'volume', system);
  const room = tankFloodRoom(gross, mu, tankState === '' ? undefined : { state: tankState, volumeM3: volume });
  return (
    <fieldset className="grid gap-3 sm:grid-cols-3">
      <legend className="mb-1 font-bold">Its own liquid before the casualty</legend>
      <SelectInput
        register={register}
        name="tankState"
        label="The tank held"
        errors={e}
        options={[
          { value: '', label: 'Not stated (taken as empty)' },
          { value: 'empty', label: 'Nothing: empty' },
          { value: 'part-full', label: 'Part full' },
          { value: 'full', label: 'Full' },
        ]}
        hint={`Flood water can take ${fmt(room.floodRoomM3, 'volume', system)} (${room.floodPermeability.toFixed(2)} of the tank): what its own liquid leaves, none when full (${TANK_PERMEABILITY_SOURCE})`}
      />
      {tankState !== '' && tankState !== 'empty' && (
        <SelectInput
          register={register}
          name="tankFluid"
          label="Its own liquid"
          errors={{ tankFluid: errorAt(e, 'tankContents.fluidId') }}
          options={[{ value: '', label: 'Choose the liquid' }, ...fluidOptions(survey.fluids)]}
          hint="told apart from flood water in the results"
        />
      )}
      {tankState === 'part-full' && (
        <NumberInput
          register={register}
          name="tankVolume"
          label="Volume of its own liquid"
          unit={measureLabel('volume', system)}
          errors={{ tankVolume: errorAt(e, 'tankContents.volumeM3') }}
          hint={`from the tank tables; it holds ${fmt(mu * gross, 'volume', system)} full`}
        />
      )}
    </fieldset>
  );
}
