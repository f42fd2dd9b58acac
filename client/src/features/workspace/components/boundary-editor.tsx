/** The form for one plate: its spaces, shape on a plane, stiffening, shores and rated capacity. */
import { useFieldArray, useForm, type UseFormReturn } from 'react-hook-form';
import { useEffect, useId, useRef } from 'react';
import { BOUNDARY_KINDS, type Boundary, type Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { measureLabel, showField } from '../utils/form-units';
import { NumberInput, TextInput, SelectInput, FormError, secondaryBtn, dangerBtn, inputCls, Field, errorAt } from '@client/components/ui/fields';
import { useAutosave } from '../hooks/use-autosave';
import { SaveIndicator } from './save-indicator';
import type { Apply, EditOp } from '../utils/types';
import { useFrameTable } from '../utils/frames';
import { PLANE_AXES, SIDE_WORDS } from '../utils/plane-geometry';
import { boundaryResolver, boundaryToForm, sideOptions, type BoundaryForm } from '../utils/boundary-form';
import { newId } from '../utils/new-entities';
import { withMark, type FigureMark } from '@shared/schemas/marks';
import { MarkChip } from './mark-chip';
import { facetOrientation, reverseFacets } from '@shared/engine';
import { BOUNDARY_KIND_WORDS, END_CONDITION_WORDS } from '@shared/review/plain-words';

/** The chip under one of the plate's figures, kept in the form's `marks` value. */
function PlateMark({ form, field, filled = true }: { form: UseFormReturn<BoundaryForm, unknown, Boundary>; field: string; filled?: boolean }) {
  const marks = form.watch('marks');
  const set = (m: FigureMark | undefined) => form.setValue('marks', withMark(marks, field, m) ?? {}, { shouldDirty: true });
  return <MarkChip mark={marks[field]} onChange={set} canEstimate={filled} />;
}

/** Boundary kinds as the form shows them: the one table of words, capitalised. */
export const KIND_LABEL = Object.fromEntries(Object.entries(BOUNDARY_KIND_WORDS).map(([k, w]) => [k, w[0]!.toUpperCase() + w.slice(1)])) as Record<Boundary['kind'], string>;

const PLANE_LABEL = {
  transverse: 'Transverse (across the ship, at an x position)',
  longitudinal: 'Longitudinal (fore and aft, at a y position)',
  horizontal: 'Horizontal (a deck, at a height z)',
};

export function BoundaryEditor({ boundary, survey, apply, system }: { boundary: Boundary; survey: Survey; apply: Apply; system: UnitSystem }) {
  const frames = useFrameTable(survey.id);
  const form = useForm<BoundaryForm, unknown, Boundary>({
    mode: 'onChange',
    resolver: boundaryResolver(boundary, system, frames),
    defaultValues: boundaryToForm(boundary, system),
  });
  const edit = (v: Boundary): EditOp => ({ kind: 'upsert', collection: 'boundaries', entity: v });
  const state = useAutosave(form, (v, base) => apply(edit(v), base && edit(base)));
  const { register, formState, watch } = form;
  const e = formState.errors;
  const lu = measureLabel('length', system);
  const [custom, plane, shape, stiff, capKind, sideAValue, sideBValue] = watch(['custom', 'plane', 'shape', 'stiff', 'capKind', 'sideA', 'sideB']);
  const ax = PLANE_AXES[plane];
  const words = SIDE_WORDS[plane];
  const sides = sideOptions(survey);
  const parents = survey.boundaries.filter((b) => b.id !== boundary.id && !b.parentBoundaryId);
  const pointsId = useId();
  const stiffId = useId();
  const axisWord = { x: 'x (forward)', y: 'y (to port)', z: 'z (up)' };
  return (
    <form className="space-y-3" onSubmit={(ev) => ev.preventDefault()} noValidate aria-label={`Plate ${boundary.name}`}>
      <FormError errors={formState.errors} />
      <div className="grid gap-3 sm:grid-cols-3">
        <TextInput register={register} name="name" label="Name" errors={e} />
        <SelectInput register={register} name="kind" label="Kind" errors={e} options={BOUNDARY_KINDS.map((k) => ({ value: k, label: KIND_LABEL[k] }))} />
        <SelectInput
          register={register}
          name="parent"
          label="Set in (door or hatch)"
          errors={{ parent: errorAt(e, 'parentBoundaryId') }}
          options={[{ value: '', label: 'Not set in another boundary' }, ...parents.map((b) => ({ value: b.id, label: b.name }))]}
        />
      </div>
      <div className="grid grid-cols-2 gap-3">
        <SelectInput register={register} name="sideA" label="Side A space" errors={{}} options={sides} />
        <SelectInput register={register} name="sideB" label="Side B space" errors={{}} options={sides} hint="positive net force pushes towards side B" />
      </div>
      {custom ? (
        <>
          <p className="rounded-md border border-line bg-paper p-2 text-sm">This plate has an imported shape not on a ship-axis plane; it is kept as it is. Edit it in the survey file and import it again.</p>
          <FacetFix boundary={boundary} apply={apply} />
        </>
      ) : (
        <fieldset className="space-y-3 rounded-md border border-line p-2">
          <legend className="px-1 font-bold">Shape</legend>
          <div className="grid gap-3 sm:grid-cols-3">
            <SelectInput register={register} name="plane" label="Plane" errors={{}} options={Object.entries(PLANE_LABEL).map(([value, label]) => ({ value, label }))} />
            <NumberInput register={register} name="at" label={`Plane at ${ax.n}`} unit={lu} errors={e} allowFrames={plane === 'transverse'} hint={plane === 'transverse' ? 'number or Fr 45' : undefined} />
            <SelectInput
              register={register}
              name="sideAIs"
              label="Side A lies"
              errors={{}}
              options={[
                { value: 'low', label: `${words.low} the boundary` },
                { value: 'high', label: `${words.high} the boundary` },
              ]}
            />
          </div>
          <SelectInput
            register={register}
            name="shape"
            label="Outline"
            errors={{}}
            options={[
              { value: 'rectangle', label: 'Rectangle' },
              { value: 'circle', label: 'Circle' },
              { value: 'polygon', label: 'Polygon (corners)' },
            ]}
          />
          {shape === 'rectangle' && (
            <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
              <NumberInput register={register} name="a1" label={`From ${axisWord[ax.a]}`} unit={lu} errors={e} allowFrames={ax.a === 'x'} />
              <NumberInput register={register} name="a2" label={`To ${axisWord[ax.a]}`} unit={lu} errors={e} allowFrames={ax.a === 'x'} />
              <NumberInput register={register} name="b1" label={`From ${axisWord[ax.b]}`} unit={lu} errors={e} />
              <NumberInput register={register} name="b2" label={`To ${axisWord[ax.b]}`} unit={lu} errors={e} />
            </div>
          )}
          {shape === 'circle' && (
            <div className="grid grid-cols-3 gap-3">
              <NumberInput register={register} name="ca" label={`Centre ${ax.a}`} unit={lu} errors={e} allowFrames={ax.a === 'x'} />
              <NumberInput register={register} name="cb" label={`Centre ${ax.b}`} unit={lu} errors={e} />
              <NumberInput register={register} name="r" label="Radius" unit={lu} errors={e} />
            </div>
          )}
          {shape === 'polygon' && (
            <Field id={pointsId} label={`Corners: ${ax.a}, ${ax.b} on each line`} unit={lu} error={errorAt(e, 'points')?.message} hint="in order round the outline">
              <textarea id={pointsId} rows={5} className={`${inputCls} py-2 font-mono`} {...register('points')} />
            </Field>
          )}
        </fieldset>
      )}
      <div className="flex items-center gap-2">
        <input
          id={stiffId}
          type="checkbox"
          className="size-6"
          {...register('stiff', {
            // stiffening switched on starts from typical values: assumed until the surveyor confirms them
            onChange: (ev: { target: { checked: boolean } }) => {
              if (!ev.target.checked || boundary.stiffening) return;
              let m = withMark(form.getValues('marks'), 'stiffening.sectionModulusM3', 'assumed');
              m = withMark(m, 'stiffening.allowableStressPa', 'assumed');
              form.setValue('marks', m ?? {});
            },
          })}
        />
        <label htmlFor={stiffId} className="font-bold">
          Stiffened
        </label>
      </div>
      {stiff && (
        <fieldset className="grid grid-cols-2 gap-3 rounded-md border border-line p-2 sm:grid-cols-4">
          <legend className="px-1 font-bold">Stiffeners</legend>
          <SelectInput
            register={register}
            name="stDir"
            label="Run"
            errors={{}}
            options={[
              { value: 'vertical', label: 'Vertical' },
              { value: 'longitudinal', label: 'Fore and aft' },
              { value: 'transverse', label: 'Athwartships' },
            ]}
          />
          <NumberInput register={register} name="stSpacing" label="Spacing" unit={lu} errors={{ stSpacing: errorAt(e, 'stiffening.spacingM') }} />
          <NumberInput register={register} name="stFirst" label="First from edge" unit={lu} errors={{ stFirst: errorAt(e, 'stiffening.firstOffsetM') }} hint="empty: one spacing" />
          <NumberInput register={register} name="stSpan" label="Span" unit={lu} errors={{ stSpan: errorAt(e, 'stiffening.spanM') }} hint="empty: across the boundary" />
          <SelectInput
            register={register}
            name="stFix"
            label="Ends"
            errors={{}}
            options={[
              { value: 'simply-supported', label: 'Simply supported' },
              { value: 'fixed', label: 'Fixed (bracketed)' },
            ]}
          />
          <NumberInput
            register={register}
            name="stModulus"
            label="Section modulus (with plate)"
            unit={measureLabel('sectionModulus', system)}
            errors={{ stModulus: errorAt(e, 'stiffening.sectionModulusM3') }}
            extra={<PlateMark form={form} field="stiffening.sectionModulusM3" />}
          />
          <NumberInput
            register={register}
            name="stAllow"
            label="Allowable stress"
            unit={measureLabel('stress', system)}
            errors={{ stAllow: errorAt(e, 'stiffening.allowableStressPa') }}
            extra={<PlateMark form={form} field="stiffening.allowableStressPa" />}
          />
        </fieldset>
      )}
      <PlatingFields form={form} system={system} stiffened={stiff} />
      <ShoreFields form={form} system={system} />
      <fieldset className="space-y-3 rounded-md border border-line p-2">
        <legend className="px-1 font-bold">Ratings</legend>
        <div className="grid grid-cols-2 gap-3">
          <SelectInput
            register={register}
            name="capKind"
            label="Rated either way"
            errors={{}}
            options={[
              { value: 'none', label: 'None given' },
              { value: 'pressure', label: 'Pressure (test head / rating)' },
              { value: 'force', label: 'Total force' },
            ]}
          />
          {capKind !== 'none' && (
            <NumberInput
              register={register}
              name="capValue"
              label={capKind === 'pressure' ? 'Rated pressure' : 'Rated force'}
              unit={measureLabel(capKind === 'pressure' ? 'pressure' : 'force', system)}
              errors={{ capValue: errorAt(e, 'ratedCapacity.pressurePa') ?? errorAt(e, 'ratedCapacity.forceN') }}
              extra={<PlateMark form={form} field="ratedCapacity" />}
            />
          )}
        </div>
        <DirectionalRatingFields form={form} system={system} sideAName={sideLabel(sides, sideAValue)} sideBName={sideLabel(sides, sideBValue)} />
      </fieldset>
      <TextInput register={register} name="notes" label="Notes" errors={e} multiline />
      <SaveIndicator state={state} />
    </form>
  );
}

/** A side's space in a few words for a label: its compartment's name, "the sea" or "open air". */
const sideLabel = (options: { value: string; label: string }[], v: string) => (v === 'sea' ? 'the sea' : v === 'air' ? 'open air' : (options.find((o) => o.value === v)?.label ?? 'that side'));

/**
 * A rating with a direction: a hatch cover on its cleats, a door on its dogs, a patch on its bolts
 * hold differently each way. Each is checked against the net load pushing that way only.
 */
function DirectionalRatingFields({ form, system, sideAName, sideBName }: { form: UseFormReturn<BoundaryForm, unknown, Boundary>; system: UnitSystem; sideAName: string; sideBName: string }) {
  const { register, formState, watch } = form;
  const e = formState.errors;
  const kind = watch('dirKind');
  const unit = kind === 'none' ? '' : measureLabel(kind, system);
  const what = kind === 'force' ? 'force' : 'pressure';
  return (
    <div className="grid grid-cols-2 gap-3 sm:grid-cols-3" data-testid="directional-rating">
      <div className="col-span-2 sm:col-span-1">
        <SelectInput
          register={register}
          name="dirKind"
          label="Rated by direction"
          errors={{}}
          options={[
            { value: 'none', label: 'None given' },
            { value: 'pressure', label: 'Pressure, each way' },
            { value: 'force', label: 'Total force, each way' },
          ]}
          hint="e.g. a hatch cover on its cleats holds less upwards"
        />
      </div>
      {kind !== 'none' && (
        <>
          <NumberInput
            register={register}
            name="dirTowardsB"
            label={`Rated ${what} towards side B (${sideBName})`}
            unit={unit}
            errors={{ dirTowardsB: errorAt(e, 'directionalCapacity.towardsB') ?? errorAt(e, 'directionalCapacity') }}
            hint={`pushed from side A (${sideAName}); empty: not rated this way`}
            extra={<PlateMark form={form} field="directionalCapacity.towardsB" />}
          />
          <NumberInput
            register={register}
            name="dirTowardsA"
            label={`Rated ${what} towards side A (${sideAName})`}
            unit={unit}
            errors={{ dirTowardsA: errorAt(e, 'directionalCapacity.towardsA') }}
            hint={`pushed from side B (${sideBName}); empty: not rated this way`}
            extra={<PlateMark form={form} field="directionalCapacity.towardsA" />}
          />
        </>
      )}
    </div>
  );
}

/** The plating between stiffeners (or the whole plate without them), checked in bending panel by panel. */
function PlatingFields({ form, system, stiffened }: { form: UseFormReturn<BoundaryForm, unknown, Boundary>; system: UnitSystem; stiffened: boolean }) {
  const { register, formState, watch } = form;
  const e = formState.errors;
  const [on, thick, allow] = watch(['plating', 'plThick', 'plAllow']);
  const id = useId();
  // the typical figures a plating check starts from are assumed; a value typed over one is the surveyor's own
  const typical = useRef<{ thick: string; allow: string } | null>(null);
  useEffect(() => {
    const t = typical.current;
    if (!t) return;
    let m = form.getValues('marks');
    if (thick !== t.thick && m['plating.thicknessM'] === 'assumed') m = withMark(m, 'plating.thicknessM', undefined) ?? {};
    if (allow !== t.allow && m['plating.allowableStressPa'] === 'assumed') m = withMark(m, 'plating.allowableStressPa', undefined) ?? {};
    if (m !== form.getValues('marks')) form.setValue('marks', m, { shouldDirty: true });
  }, [thick, allow, form]);
  const tu = measureLabel('thickness', system);
  const su = measureLabel('stress', system);
  return (
    <fieldset className="space-y-2 rounded-md border border-line p-2" data-testid="plating-fields">
      <legend className="px-1 font-bold">Plating</legend>
      <div className="flex items-center gap-2">
        <input
          id={id}
          type="checkbox"
          className="size-6"
          {...register('plating', {
            // switched on with typical figures: assumed until the surveyor measures or confirms them
            onChange: (ev: { target: { checked: boolean } }) => {
              if (!ev.target.checked) return;
              typical.current = { thick: form.getValues('plThick'), allow: form.getValues('plAllow') };
              let m = withMark(form.getValues('marks'), 'plating.thicknessM', 'assumed');
              m = withMark(m, 'plating.allowableStressPa', 'assumed');
              form.setValue('marks', m ?? {});
            },
          })}
        />
        <label htmlFor={id} className="font-bold">
          Check the plating {stiffened ? 'between stiffeners' : '(the whole plate as one panel)'}
        </label>
      </div>
      {on && (
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-5">
          <NumberInput
            register={register}
            name="plThick"
            label="Plate thickness"
            unit={tu}
            errors={{ plThick: errorAt(e, 'plating.thicknessM') }}
            hint="as built or gauged"
            extra={<PlateMark form={form} field="plating.thicknessM" />}
          />
          <NumberInput
            register={register}
            name="plCorrosion"
            label="Corrosion allowance"
            unit={tu}
            errors={{ plCorrosion: errorAt(e, 'plating.corrosionAllowanceM') }}
            hint="taken off the thickness; empty: none"
          />
          <NumberInput register={register} name="plYield" label="Yield stress" unit={su} errors={{ plYield: errorAt(e, 'plating.yieldStressPa') }} hint="mild steel 235 MPa" />
          <NumberInput
            register={register}
            name="plAllow"
            label="Allowable bending stress"
            unit={su}
            errors={{ plAllow: errorAt(e, 'plating.allowableStressPa') }}
            hint="utilisation is against this"
            extra={<PlateMark form={form} field="plating.allowableStressPa" />}
          />
          <div className="col-span-2 sm:col-span-1">
            <SelectInput
              register={register}
              name="plEdges"
              label="Panel edges"
              errors={{}}
              options={[
                { value: 'simply-supported', label: 'Simply supported' },
                { value: 'fixed', label: 'Fixed (plating continuous over stiffeners)' },
              ]}
            />
          </div>
        </div>
      )}
    </fieldset>
  );
}

/** Names the facets that run the other way round from their neighbours, and turns them over in one tap. */
function FacetFix({ boundary, apply }: { boundary: Boundary; apply: Apply }) {
  const g = boundary.geometry;
  if (g.kind !== 'faceted') return null;
  const { reversed } = facetOrientation(g.facets);
  if (reversed.length === 0) return null;
  return (
    <div className="rounded-md border-2 border-danger p-2 text-sm" role="alert" data-testid="facet-fix">
      <p className="font-bold text-danger">
        <span aria-hidden="true">▲ </span>
        Facet{reversed.length > 1 ? 's' : ''} {reversed.map((i) => i + 1).join(', ')} run{reversed.length > 1 ? '' : 's'} the other way round from the rest, so their load counts the wrong way.
      </p>
      <button
        type="button"
        className={secondaryBtn}
        onClick={() => apply({ kind: 'upsert', collection: 'boundaries', entity: { ...boundary, geometry: { kind: 'faceted', facets: reverseFacets(g.facets, reversed) } } })}
      >
        Turn {reversed.length > 1 ? 'them' : 'it'} over
      </button>
    </div>
  );
}

function ShoreFields({ form, system }: { form: UseFormReturn<BoundaryForm, unknown, Boundary>; system: UnitSystem }) {
  const { fields, append, remove } = useFieldArray({ control: form.control, name: 'shores', keyName: 'key' });
  const { register, formState, watch } = form;
  const e = formState.errors;
  const lu = measureLabel('length', system);
  const su = measureLabel('stress', system);
  const S = (n: number) => showField(n, 'length', system);
  const stress = (pa: number) => showField(pa, 'stress', system);
  const v = watch();
  const centre = () => {
    const num = (t: string) => Number(t) || 0;
    if (v.plane === 'transverse') return { x: v.at, y: String((num(v.a1) + num(v.a2)) / 2), z: String((num(v.b1) + num(v.b2)) / 2) };
    if (v.plane === 'longitudinal') return { x: String((num(v.a1) + num(v.a2)) / 2), y: v.at, z: String((num(v.b1) + num(v.b2)) / 2) };
    return { x: String((num(v.a1) + num(v.a2)) / 2), y: String((num(v.b1) + num(v.b2)) / 2), z: v.at };
  };
  const err = (i: number, p: string) => errorAt(e, `shores.${i}.${p}`);
  return (
    <fieldset className="space-y-2 rounded-md border border-line p-2">
      <legend className="px-1 font-bold">Shores</legend>
      {fields.map((f, i) => (
        <div key={f.key} className="rounded-md border border-line bg-paper p-2" data-testid="shore">
          <div className="mb-1 flex items-center justify-between">
            <span className="font-bold">Shore {i + 1}</span>
            <button type="button" className={dangerBtn} onClick={() => remove(i)}>
              Remove
            </button>
          </div>
          <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
            <NumberInput register={register} name={`shores.${i}.x`} label="Head at x" unit={lu} errors={{ shores: { [i]: { x: err(i, 'position.x') } } }} allowFrames />
            <NumberInput register={register} name={`shores.${i}.y`} label="Head at y" unit={lu} errors={{ shores: { [i]: { y: err(i, 'position.y') } } }} />
            <NumberInput register={register} name={`shores.${i}.z`} label="Head at z" unit={lu} errors={{ shores: { [i]: { z: err(i, 'position.z') } } }} />
            <NumberInput register={register} name={`shores.${i}.length`} label="Length" unit={lu} errors={{ shores: { [i]: { length: err(i, 'lengthM') } } }} />
            <SelectInput
              register={register}
              name={`shores.${i}.secKind`}
              label="Section"
              errors={{}}
              options={[
                { value: 'rectangular', label: 'Rectangular (timber)' },
                { value: 'tube', label: 'Tube (steel)' },
              ]}
            />
            <NumberInput
              register={register}
              name={`shores.${i}.w`}
              label={v.shores?.[i]?.secKind === 'tube' ? 'Outer diameter' : 'Width'}
              unit={lu}
              errors={{ shores: { [i]: { w: err(i, 'section.widthM') ?? err(i, 'section.outerDiameterM') } } }}
              extra={<PlateMark form={form} field={`shores.${f.id}.section`} />}
            />
            <NumberInput
              register={register}
              name={`shores.${i}.d`}
              label={v.shores?.[i]?.secKind === 'tube' ? 'Wall thickness' : 'Depth'}
              unit={lu}
              errors={{ shores: { [i]: { d: err(i, 'section.depthM') ?? err(i, 'section.wallThicknessM') } } }}
            />
            <NumberInput register={register} name={`shores.${i}.e`} label="Elastic modulus" unit={su} errors={{ shores: { [i]: { e: err(i, 'elasticModulusPa') } } }} />
            <NumberInput register={register} name={`shores.${i}.allow`} label="Allowable stress" unit={su} errors={{ shores: { [i]: { allow: err(i, 'allowableStressPa') } } }} />
            <SelectInput
              register={register}
              name={`shores.${i}.end`}
              label="Ends"
              errors={{}}
              options={Object.entries(END_CONDITION_WORDS).map(([value, words]) => ({ value, label: words[0]!.toUpperCase() + words.slice(1) }))}
            />
            <SelectInput
              register={register}
              name={`shores.${i}.side`}
              label="Stands on side"
              errors={{}}
              options={[
                { value: 'B', label: 'B' },
                { value: 'A', label: 'A' },
              ]}
            />
            <NumberInput register={register} name={`shores.${i}.angle`} label="Angle from square" unit="°" errors={{ shores: { [i]: { angle: err(i, 'angleFromNormalDeg') } } }} hint="empty: square to the boundary" />
            <SelectInput
              register={register}
              name={`shores.${i}.method`}
              label="Checked as a column by"
              errors={{}}
              options={[
                { value: '', label: 'No method given (Euler ÷ 2, flagged)' },
                { value: 'aisc-360-e3', label: 'Steel: AISC 360 §E3, ASD (Ωc 1.67)' },
                { value: 'nds-3.7.1', label: 'Sawn timber: NDS §3.7.1 (Cp, c 0.8)' },
                { value: 'generic', label: 'Other: a design factor' },
              ]}
            />
            {v.shores?.[i]?.method === 'aisc-360-e3' && (
              <NumberInput register={register} name={`shores.${i}.fy`} label="Yield stress Fy" unit={su} errors={{ shores: { [i]: { fy: err(i, 'design.yieldStressPa') } } }} />
            )}
            {v.shores?.[i]?.method === 'nds-3.7.1' && (
              <>
                <NumberInput register={register} name={`shores.${i}.fc`} label="Fc* (Fc × factors but Cp)" unit={su} errors={{ shores: { [i]: { fc: err(i, 'design.adjustedCompressionPa') } } }} />
                <NumberInput register={register} name={`shores.${i}.emin`} label="E′min" unit={su} errors={{ shores: { [i]: { emin: err(i, 'design.adjustedEMinPa') } } }} />
              </>
            )}
            {v.shores?.[i]?.method === 'generic' && (
              <>
                <NumberInput register={register} name={`shores.${i}.fail`} label="Crushing stress" unit={su} errors={{ shores: { [i]: { fail: err(i, 'design.failureStressPa') } } }} />
                <NumberInput register={register} name={`shores.${i}.factor`} label="Design factor" unit="" errors={{ shores: { [i]: { factor: err(i, 'design.designFactor') } } }} />
              </>
            )}
          </div>
        </div>
      ))}
      <button
        type="button"
        className={secondaryBtn}
        onClick={() => {
          const c = centre();
          const id = newId();
          form.setValue('marks', withMark(form.getValues('marks'), `shores.${id}.section`, 'assumed') ?? {});
          append({
            id, ...c, length: S(3), secKind: 'rectangular', w: S(0.2), d: S(0.2), e: stress(11e9), allow: stress(8e6), end: 'pinned-pinned', side: 'B', angle: '',
            method: 'nds-3.7.1', fy: stress(235e6), fc: stress(6.3e6), emin: stress(3.6e9), fail: stress(16e6), factor: '2',
          });
        }}
      >
        + Add shore
      </button>
      {fields.length > 0 && <p className="text-xs text-ink-soft">New shores start with typical timber values (200 × 200 mm, E 11 GPa, 8 MPa allowable; NDS check with Fc* 6.3 MPa and E′min 3.6 GPa, wet Douglas fir-larch No. 1 posts), marked assumed: enter those of the shore actually fitted, or confirm them.</p>}
    </fieldset>
  );
}
