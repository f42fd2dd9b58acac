/** "Ship": the survey's title and casualty, the vessel's particulars, and the frame table for frame-number entry. */
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { VesselSchema } from '@shared/schemas/survey';
import { imoCheckDigitOk } from '@shared/schemas/marks';
import type { UnitSystem } from '@shared/units/units';
import { byKey, measureLabel, parseField, showField, unitResolver } from '../utils/form-units';
import { NumberInput, TextInput, FormError, inputCls, secondaryBtn } from '@client/components/ui/fields';
import { useAutosave } from '../hooks/use-autosave';
import { SaveIndicator } from './save-indicator';
import type { SectionProps } from '../utils/types';
import { frameToX, saveFrameTable, useFrameTable, type FrameTable } from '../utils/frames';
import { formatNumber } from '@shared/units/units';
import { deepEqual } from '@shared/sync/apply';

const ShipFormSchema = z.object({
  title: z.string().trim().min(1),
  casualtyDescription: z.string(),
  // the check digit is asked of new entries only: a stored document with a bad number still opens
  vessel: VesselSchema.refine((v) => v.imo === undefined || imoCheckDigitOk(v.imo), {
    path: ['imo'],
    message: 'This IMO number fails its check digit: check the seven digits.',
  }),
});

interface ShipForm {
  title: string;
  casualtyDescription: string;
  vessel: { name: string; imo: string; lbpM: string; breadthM: string; depthM: string; draughtMarks: { forwardXM: string; aftXM: string; midshipXM: string } };
}

const MEASURES = byKey({ lbpM: 'length', breadthM: 'length', depthM: 'length', forwardXM: 'length', aftXM: 'length', midshipXM: 'length' });

function toModel(v: ShipForm, system: UnitSystem) {
  const L = (t: string) => parseField(t, 'length', system);
  return {
    title: v.title,
    casualtyDescription: v.casualtyDescription,
    vessel: {
      name: v.vessel.name,
      imo: v.vessel.imo.trim() === '' ? undefined : v.vessel.imo.trim(),
      lbpM: L(v.vessel.lbpM),
      breadthM: L(v.vessel.breadthM),
      depthM: L(v.vessel.depthM),
      draughtMarks: { forwardXM: L(v.vessel.draughtMarks.forwardXM), aftXM: L(v.vessel.draughtMarks.aftXM), midshipXM: L(v.vessel.draughtMarks.midshipXM) },
    },
  };
}

export function ShipSection({ survey, apply, system }: SectionProps) {
  const S = (n: number | undefined) => showField(n, 'length', system);
  const form = useForm<ShipForm, unknown, z.infer<typeof ShipFormSchema>>({
    mode: 'onChange',
    resolver: unitResolver(ShipFormSchema, (v: ShipForm) => toModel(v, system), system, MEASURES),
    defaultValues: {
      title: survey.title,
      casualtyDescription: survey.casualtyDescription,
      vessel: {
        name: survey.vessel.name,
        imo: survey.vessel.imo ?? '',
        lbpM: S(survey.vessel.lbpM),
        breadthM: S(survey.vessel.breadthM),
        depthM: S(survey.vessel.depthM),
        draughtMarks: { forwardXM: S(survey.vessel.draughtMarks.forwardXM), aftXM: S(survey.vessel.draughtMarks.aftXM), midshipXM: S(survey.vessel.draughtMarks.midshipXM) },
      },
    },
  });
  // each part the person changed since the form opened (or last saved), over the device's copy as it is by then
  const state = useAutosave(form, async (v, base) => {
    const was = base ?? survey;
    if (v.title !== was.title) await apply({ kind: 'set', path: 'title', value: v.title }, base && { kind: 'set', path: 'title', value: base.title });
    if (v.casualtyDescription !== was.casualtyDescription) {
      await apply({ kind: 'set', path: 'casualtyDescription', value: v.casualtyDescription }, base && { kind: 'set', path: 'casualtyDescription', value: base.casualtyDescription });
    }
    if (!deepEqual(v.vessel, was.vessel)) await apply({ kind: 'set', path: 'vessel', value: v.vessel }, base && { kind: 'set', path: 'vessel', value: base.vessel });
  });
  const { register, formState } = form;
  const lu = measureLabel('length', system);
  return (
    <section aria-labelledby="ship-h" className="space-y-4">
      <h2 id="ship-h" className="text-2xl">
        Ship
      </h2>
      <form className="space-y-3" onSubmit={(e) => e.preventDefault()} noValidate aria-label="Ship and survey">
        <FormError errors={formState.errors} />
        <div className="grid gap-3 sm:grid-cols-2">
          <TextInput register={register} name="title" label="Survey title" errors={formState.errors} />
          <TextInput register={register} name="vessel.name" label="Vessel name" errors={formState.errors} />
          <TextInput register={register} name="vessel.imo" label="IMO number" errors={formState.errors} hint="7 digits, the last a check digit; leave empty if unknown" />
        </div>
        <TextInput register={register} name="casualtyDescription" label="What happened" errors={formState.errors} multiline />
        <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <legend className="mb-1 font-bold">Main dimensions</legend>
          <NumberInput register={register} name="vessel.lbpM" label="Length between perpendiculars" unit={lu} errors={formState.errors} />
          <NumberInput register={register} name="vessel.breadthM" label="Breadth" unit={lu} errors={formState.errors} />
          <NumberInput register={register} name="vessel.depthM" label="Depth" unit={lu} errors={formState.errors} />
        </fieldset>
        <fieldset className="grid grid-cols-2 gap-3 sm:grid-cols-3">
          <legend className="mb-1 font-bold">Draught marks (x from the aft perpendicular)</legend>
          <NumberInput register={register} name="vessel.draughtMarks.aftXM" label="Aft marks" unit={lu} errors={formState.errors} />
          <NumberInput register={register} name="vessel.draughtMarks.forwardXM" label="Forward marks" unit={lu} errors={formState.errors} />
          <NumberInput register={register} name="vessel.draughtMarks.midshipXM" label="Midship marks" unit={lu} errors={formState.errors} hint="optional" />
        </fieldset>
        <SaveIndicator state={state} />
      </form>
      <FrameTableEditor surveyId={survey.id} system={system} />
    </section>
  );
}

function FrameTableEditor({ surveyId, system }: { surveyId: string; system: UnitSystem }) {
  const table = useFrameTable(surveyId);
  const lu = measureLabel('length', system);
  const update = (t: FrameTable) => saveFrameTable(surveyId, t);
  const setRun = (i: number, patch: Partial<{ fromFrame: number; spacingM: number }>) =>
    update({ ...table, runs: table.runs.map((r, j) => (j === i ? { ...r, ...patch } : r)) });
  const sample = table.runs.length ? table.runs[table.runs.length - 1].fromFrame + 10 : 10;
  return (
    <details className="rounded-lg border border-line bg-card p-3">
      <summary className="min-h-touch cursor-pointer content-center font-bold">Frame table (for entering positions as frame numbers)</summary>
      <p className="text-sm text-ink-soft">
        Type positions as <b>Fr 45</b> in any x field. Frame spacing runs from the frame given up to the next run. Kept on this device.
      </p>
      <label className="mt-2 block text-sm font-bold">
        Frame at the aft perpendicular (x = 0)
        <input
          className={`${inputCls} mt-0.5 max-w-40`}
          inputMode="decimal"
          defaultValue={table.zeroFrame}
          onChange={(e) => Number.isFinite(Number(e.target.value)) && update({ ...table, zeroFrame: Number(e.target.value) })}
        />
      </label>
      <table className="mt-2 text-sm">
        <thead>
          <tr>
            <th className="pr-2 text-left">From frame</th>
            <th className="text-left">Spacing ({lu})</th>
          </tr>
        </thead>
        <tbody>
          {table.runs.map((r, i) => (
            <tr key={i}>
              <td className="pr-2">
                <input className={`${inputCls} max-w-28`} inputMode="decimal" aria-label={`Run ${i + 1} from frame`} defaultValue={r.fromFrame} onChange={(e) => Number.isFinite(Number(e.target.value)) && setRun(i, { fromFrame: Number(e.target.value) })} />
              </td>
              <td>
                <input
                  className={`${inputCls} max-w-28`}
                  inputMode="decimal"
                  aria-label={`Run ${i + 1} spacing`}
                  defaultValue={showField(r.spacingM, 'length', system)}
                  onChange={(e) => {
                    const v = parseField(e.target.value, 'length', system);
                    if (v !== undefined && v > 0) setRun(i, { spacingM: v });
                  }}
                />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <button type="button" className={secondaryBtn} onClick={() => update({ ...table, runs: [...table.runs, { fromFrame: sample, spacingM: table.runs.at(-1)?.spacingM ?? 0.8 }] })}>
          Add a run
        </button>
        {table.runs.length > 1 && (
          <button type="button" className={secondaryBtn} onClick={() => update({ ...table, runs: table.runs.slice(0, -1) })}>
            Remove last run
          </button>
        )}
        <span className="text-sm text-ink-soft">
          Fr {sample} = {formatNumber(Number(showField(frameToX(sample, table), 'length', system)), 4)} {lu}
        </span>
      </div>
    </details>
  );
}
