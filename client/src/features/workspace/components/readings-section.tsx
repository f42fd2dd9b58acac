/** "Readings": each time-stamped condition (drafts, heel, sea density) and which one the loads use. */
import { useForm } from 'react-hook-form';
import { ConditionSchema, type Condition } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { DEFAULT_SEA_DENSITY_KG_M3, HEEL_AGREEMENT_TOLERANCE_DEG } from '@shared/engine';
import { settleMarks, withMark, type FigureMark, type Marks } from '@shared/schemas/marks';
import { MarkChip } from './mark-chip';
import { byKey, measureLabel, parseField, showField, unitResolver } from '../utils/form-units';
import { NumberInput, TextInput, FormError, inputCls, primaryBtn, secondaryBtn, dangerBtn, Field, describedBy } from '@client/components/ui/fields';
import { deviceOffsetAt, parseShipTimeEntry, shipTimeEntry, SHIP_TIME_FORMAT } from '../utils/ship-time-entry';
import { useAutosave } from '../hooks/use-autosave';
import { SaveIndicator } from './save-indicator';
import type { Apply, EditOp, SectionProps } from '../utils/types';
import { activeCondition, newCondition } from '../utils/new-entities';
import { formatNumber } from '@shared/units/units';
import { display, unitLabel } from '@client/lib/unit-system';
import { formatShipAndUtc, utcOffsetWords } from '@shared/review/time-words';

interface ConditionForm {
  name: string;
  time: string;
  drafts: { forwardM: string; aftM: string; midPortM: string; midStarboardM: string };
  heelDeg: string;
  seaDensityKgM3: string;
  /** Not an input: the marks on this condition's figures, set by the chips under the fields. */
  marks: Marks;
}

const MEASURES = byKey({ forwardM: 'length', aftM: 'length', midPortM: 'length', midStarboardM: 'length', heelDeg: 'ratio', seaDensityKgM3: 'density' });

/**
 * The clock the time of readings is typed in: the ship's when her clock is set (the surveyor copies
 * times from the ship's log), else this device's own, at about the time typed (summer time counts).
 */
const clockOffset = (shipOffsetMin: number | undefined, at: { iso?: string; text?: string }): number =>
  shipOffsetMin ?? (at.text !== undefined ? deviceOffsetAt(at.text) : -new Date(at.iso ?? Date.now()).getTimezoneOffset());

function toModel(v: ConditionForm, base: Condition, system: UnitSystem, shipOffsetMin: number | undefined): unknown {
  const L = (t: string) => parseField(t, 'length', system);
  const t = parseShipTimeEntry(v.time, clockOffset(shipOffsetMin, { text: v.time }));
  const next = {
    ...base,
    name: v.name.trim() === '' ? undefined : v.name.trim(),
    time: t ?? v.time,
    drafts: { forwardM: L(v.drafts.forwardM), aftM: L(v.drafts.aftM), midPortM: L(v.drafts.midPortM), midStarboardM: L(v.drafts.midStarboardM) },
    heelDeg: parseField(v.heelDeg, 'ratio', system),
    seaDensityKgM3: parseField(v.seaDensityKgM3, 'density', system),
  };
  return { ...next, marks: settleMarks(v.marks, base, next) };
}

function ConditionEditor({ condition, apply, system, shipOffsetMin }: { condition: Condition; apply: Apply; system: UnitSystem; shipOffsetMin: number | undefined }) {
  const S = (n: number | undefined) => showField(n, 'length', system);
  const form = useForm<ConditionForm, unknown, Condition>({
    mode: 'onChange',
    resolver: unitResolver(ConditionSchema, (v: ConditionForm) => toModel(v, condition, system, shipOffsetMin), system, MEASURES),
    defaultValues: {
      name: condition.name ?? '',
      time: shipTimeEntry(condition.time, clockOffset(shipOffsetMin, { iso: condition.time })),
      drafts: { forwardM: S(condition.drafts.forwardM), aftM: S(condition.drafts.aftM), midPortM: S(condition.drafts.midPortM), midStarboardM: S(condition.drafts.midStarboardM) },
      heelDeg: condition.heelDeg === undefined ? '' : String(condition.heelDeg),
      seaDensityKgM3: showField(condition.seaDensityKgM3, 'density', system),
      marks: condition.marks ?? {},
    },
  });
  // contents are edited under Contents; keep the latest ones when saving this form
  const edit = (v: Condition): EditOp => ({ kind: 'upsert', collection: 'conditions', entity: { ...v, contents: condition.contents } });
  const state = useAutosave(form, (v, base) => apply(edit(v), base && edit(base)));
  const { register, formState, watch, setValue } = form;
  const lu = measureLabel('length', system);
  const du = unitLabel('density', system);
  const timeId = `time-${condition.id}`;
  const [marks, drafts, heel, sea] = watch(['marks', 'drafts', 'heelDeg', 'seaDensityKgM3']);
  const setMark = (field: string, mark: FigureMark | undefined) => setValue('marks', withMark(marks, field, mark) ?? {}, { shouldDirty: true });
  const chip = (field: string, text: string | undefined) => <MarkChip mark={marks[field]} onChange={(m) => setMark(field, m)} canEstimate={(text ?? '').trim() !== ''} />;
  const defaultSea = formatNumber(display(DEFAULT_SEA_DENSITY_KG_M3, 'density', system), 5);
  return (
    <form className="space-y-3" onSubmit={(e) => e.preventDefault()} noValidate aria-label="Condition readings">
      <FormError errors={formState.errors} />
      <div className="grid gap-3 sm:grid-cols-2">
        <TextInput register={register} name="name" label="Name" errors={formState.errors} placeholder="e.g. Morning soundings" />
        <Field
          label={`Time of readings (${shipOffsetMin === undefined ? `this device’s clock, ${utcOffsetWords(-new Date().getTimezoneOffset())}` : `ship’s time, ${utcOffsetWords(shipOffsetMin)}`})`}
          id={timeId}
          error={formState.errors.time?.message}
          hint={SHIP_TIME_FORMAT}
        >
          <input
            id={timeId}
            type="text"
            autoComplete="off"
            spellCheck={false}
            placeholder="YYYY-MM-DD HH:MM"
            className={inputCls}
            aria-invalid={formState.errors.time ? true : undefined}
            aria-describedby={describedBy(timeId, SHIP_TIME_FORMAT, formState.errors.time)}
            {...register('time')}
          />
          <button
            type="button"
            className={secondaryBtn}
            aria-label={`Now, in ${shipOffsetMin === undefined ? 'this device’s clock' : 'ship’s time'}`}
            onClick={() => setValue('time', shipTimeEntry(new Date().toISOString(), clockOffset(shipOffsetMin, {})), { shouldDirty: true, shouldValidate: true })}
          >
            Now
          </button>
        </Field>
      </div>
      <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <legend className="mb-1 font-bold">Drafts (above the baseline)</legend>
        <NumberInput register={register} name="drafts.aftM" label="Aft" unit={lu} errors={formState.errors} hint="needed for loads" extra={chip('drafts.aftM', drafts.aftM)} />
        <NumberInput register={register} name="drafts.forwardM" label="Forward" unit={lu} errors={formState.errors} hint="needed for loads" extra={chip('drafts.forwardM', drafts.forwardM)} />
        <NumberInput register={register} name="drafts.midPortM" label="Midship port" unit={lu} errors={formState.errors} hint="optional" extra={chip('drafts.midPortM', drafts.midPortM)} />
        <NumberInput register={register} name="drafts.midStarboardM" label="Midship stbd" unit={lu} errors={formState.errors} hint="optional" extra={chip('drafts.midStarboardM', drafts.midStarboardM)} />
      </fieldset>
      <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
        <NumberInput
          register={register}
          name="heelDeg"
          label="Heel (inclinometer)"
          unit="°"
          errors={formState.errors}
          hint={`+ starboard down; needed for loads unless both midship drafts are read; checked against them (warning beyond ${HEEL_AGREEMENT_TOLERANCE_DEG}°)`}
          extra={chip('heelDeg', heel)}
        />
        <NumberInput
          register={register}
          name="seaDensityKgM3"
          label="Sea water density"
          unit={du}
          errors={formState.errors}
          placeholder={defaultSea}
          hint="hydrometer reading"
          extra={
            sea.trim() === '' ? (
              <MarkChip mark="assumed" assumedValue={`${defaultSea} ${du}, typical open sea`} onChange={() => undefined} onConfirm={() => setValue('seaDensityKgM3', defaultSea, { shouldDirty: true })} />
            ) : (
              chip('seaDensityKgM3', sea)
            )
          }
        />
      </div>
      <SaveIndicator state={state} />
    </form>
  );
}

export function ReadingsSection({ survey, apply, system }: SectionProps) {
  const active = activeCondition(survey);
  const sorted = [...survey.conditions].sort((a, b) => a.time.localeCompare(b.time));
  const addReading = async () => {
    const c = newCondition(active, `Readings ${survey.conditions.length + 1}`);
    await apply({ kind: 'upsert', collection: 'conditions', entity: c });
    await apply({ kind: 'set', path: 'activeConditionId', value: c.id });
  };
  return (
    <section aria-labelledby="readings-h" className="space-y-4">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id="readings-h" className="text-2xl">
          Readings
        </h2>
        <button type="button" className={primaryBtn} onClick={() => void addReading()}>
          + New set of readings
        </button>
      </div>
      <ul className="space-y-1" aria-label="Sets of readings">
        {sorted.map((c) => (
          <li key={c.id} className={`flex flex-wrap items-center gap-2 rounded-md border-2 p-2 ${c.id === active.id ? 'border-hull bg-sea-soft' : 'border-line bg-card'}`}>
            <span className="font-bold">{c.name ?? 'Readings (no name)'}</span>
            <span className="text-sm text-ink-soft">{formatShipAndUtc(c.time, survey.vessel.shipTimeOffsetMin)}</span>
            {c.id === active.id ? (
              <span className="ml-auto rounded bg-hull px-2 py-0.5 text-sm font-bold text-paper">used for loads</span>
            ) : (
              <span className="ml-auto flex gap-2">
                <button type="button" className={secondaryBtn} onClick={() => void apply({ kind: 'set', path: 'activeConditionId', value: c.id })}>
                  Use for loads
                </button>
                <button type="button" className={dangerBtn} onClick={() => void apply({ kind: 'delete', collection: 'conditions', entityId: c.id })}>
                  Delete
                </button>
              </span>
            )}
          </li>
        ))}
      </ul>
      <ConditionEditor key={`${active.id}-${system}-${survey.vessel.shipTimeOffsetMin}`} condition={active} apply={apply} system={system} shipOffsetMin={survey.vessel.shipTimeOffsetMin} />
    </section>
  );
}
