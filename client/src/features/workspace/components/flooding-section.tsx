/**
 * "Flooding": what lets water in and out of each space (breaches to the sea, openings between
 * spaces), the pumps, the sounding log, the pumping plan, and the forecast that follows from them
 * (with a composed "what if" beside it). The forms keep what was typed and say what is wrong under the
 * field; nothing is saved until it is right. Everything is computed on the device.
 */
import { useMemo, useState } from 'react';
import { forecastFlooding } from '@shared/engine';
import type { Compartment, Condition } from '@shared/schemas/survey';
import { OPENING_FACES, type OpeningFace, type PlanStep } from '@shared/schemas/flooding';
import type { UnitSystem } from '@shared/units/units';
import { openingWords } from '@shared/review/plain-words';
import { pointWords } from '@shared/units/point-words';
import { primaryBtn, dangerBtn } from '@client/components/ui/fields';
import { heightOf, Input, need, Select, SpaceSelect, type Errors } from './flooding-fields';
import { SoundingLog } from './sounding-log';
import { WhatIf } from './what-if';
import { fmt } from '@client/lib/unit-system';
import { ForecastView, shipTime } from '@client/features/flooding/components/forecast-view';
import { measureLabel } from '../utils/form-units';
import { activeCondition, newId } from '../utils/new-entities';
import { planStepErrors } from '../utils/plan-steps';
import type { Apply, SectionProps } from '../utils/types';

function OpeningForm({ comp, survey, system, apply, internal }: { comp: Compartment; survey: SectionProps['survey']; system: UnitSystem; apply: Apply; internal: boolean }) {
  const h = heightOf(comp);
  const [v, setV] = useState({ face: 'starboard' as OpeningFace, x: String(h.centre.x), y: String(h.centre.y), z: String(h.bottom + 1), kind: 'round', d: '', w: '', hgt: '', to: '' });
  const [errors, setErrors] = useState<Errors>({});
  const lu = measureLabel('length', system);
  const set = (k: keyof typeof v) => (t: string) => setV({ ...v, [k]: t });
  const prefix = `${internal ? 'opening' : 'breach'}-${comp.id}`;
  const others = useMemo(() => survey.compartments.filter((c) => c.id !== comp.id), [survey.compartments, comp.id]);
  const save = async () => {
    const e: Errors = {};
    const x = need(e, 'x', v.x, 'length', system), y = need(e, 'y', v.y, 'length', system), z = need(e, 'z', v.z, 'length', system);
    const d = v.kind === 'round' ? need(e, 'd', v.d, 'length', system, { positive: true }) : undefined;
    const w = v.kind === 'rectangular' ? need(e, 'w', v.w, 'length', system, { positive: true }) : undefined;
    const hh = v.kind === 'rectangular' ? need(e, 'hgt', v.hgt, 'length', system, { positive: true }) : undefined;
    if (internal && !survey.compartments.some((c) => c.id === v.to && c.id !== comp.id)) e.to = 'Choose the space it leads to.';
    setErrors(e);
    if (Object.keys(e).length > 0) return;
    const size = v.kind === 'round' ? { kind: 'round' as const, diameterM: d! } : { kind: 'rectangular' as const, widthM: w!, heightM: hh! };
    const areaM2 = size.kind === 'round' ? (Math.PI * size.diameterM ** 2) / 4 : size.widthM * size.heightM;
    const base = { id: newId(), position: { x: x!, y: y!, z: z! }, areaM2, face: v.face, size };
    const next = internal ? { ...comp, openings: [...(comp.openings ?? []), { ...base, toCompartmentId: v.to }] } : { ...comp, breaches: [...(comp.breaches ?? []), base] };
    await apply({ kind: 'upsert', collection: 'compartments', entity: next });
  };
  return (
    <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-4" onSubmit={(e) => (e.preventDefault(), void save())} noValidate aria-label={internal ? 'Add an opening to another space' : 'Add a breach'}>
      {internal && (
        <SpaceSelect id={`${prefix}-to`} label="Leads to" compartments={others} value={v.to} onChange={set('to')} error={errors.to} />
      )}
      <Select id={`${prefix}-face`} label="Face" value={v.face} onChange={(t) => setV({ ...v, face: t as OpeningFace })}>
        {OPENING_FACES.map((f) => (
          <option key={f} value={f}>
            {f}
          </option>
        ))}
      </Select>
      <Input id={`${prefix}-x`} label="Centre x" unit={lu} value={v.x} onChange={set('x')} error={errors.x} />
      <Input id={`${prefix}-y`} label="Centre y" unit={lu} value={v.y} onChange={set('y')} error={errors.y} />
      <Input id={`${prefix}-z`} label="Centre z" unit={lu} value={v.z} onChange={set('z')} error={errors.z} />
      <Select id={`${prefix}-kind`} label="Shape" value={v.kind} onChange={set('kind')}>
        <option value="round">round</option>
        <option value="rectangular">width × height</option>
      </Select>
      {v.kind === 'round' ? (
        <Input id={`${prefix}-d`} label="Diameter" unit={lu} value={v.d} onChange={set('d')} error={errors.d} />
      ) : (
        <>
          <Input id={`${prefix}-w`} label="Width" unit={lu} value={v.w} onChange={set('w')} error={errors.w} />
          <Input id={`${prefix}-h`} label="Height" unit={lu} value={v.hgt} onChange={set('hgt')} error={errors.hgt} />
        </>
      )}
      <div className="col-span-full">
        <button type="submit" className={primaryBtn}>
          {internal ? '+ Add opening' : '+ Add breach'}
        </button>
      </div>
    </form>
  );
}

function PumpForm({ comp, system, apply }: { comp: Compartment; system: UnitSystem; apply: Apply }) {
  const [v, setV] = useState({ name: '', capacity: '', suction: '' });
  const [errors, setErrors] = useState<Errors>({});
  const h = heightOf(comp);
  const save = async () => {
    const e: Errors = {};
    if (v.name.trim() === '') e.name = 'Give the pump a name.';
    const cap = need(e, 'capacity', v.capacity, 'flow', system, { positive: true });
    const suction = need(e, 'suction', v.suction, 'length', system, { optional: true, min: 0 });
    if (suction !== undefined && suction > h.top - h.bottom) e.suction = `Above the space: it is ${fmt(h.top - h.bottom, 'length', system, 3)} high.`;
    setErrors(e);
    if (Object.keys(e).length > 0) return;
    await apply({ kind: 'upsert', collection: 'compartments', entity: { ...comp, pumps: [...(comp.pumps ?? []), { id: newId(), name: v.name.trim(), capacityM3S: cap!, suctionHeightM: suction }] } });
    setV({ name: '', capacity: '', suction: '' });
  };
  const p = `pump-${comp.id}`;
  return (
    <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-4" onSubmit={(e) => (e.preventDefault(), void save())} noValidate aria-label="Add a pump">
      <Input id={`${p}-name`} label="Pump" value={v.name} onChange={(t) => setV({ ...v, name: t })} error={errors.name} inputMode="text" />
      <Input id={`${p}-cap`} label="Capacity" unit={measureLabel('flow', system)} value={v.capacity} onChange={(t) => setV({ ...v, capacity: t })} error={errors.capacity} />
      <Input id={`${p}-suction`} label="Suction above the bottom" unit={measureLabel('length', system)} value={v.suction} onChange={(t) => setV({ ...v, suction: t })} error={errors.suction} />
      <div className="col-span-full">
        <button type="submit" className={primaryBtn}>
          + Add pump
        </button>
      </div>
    </form>
  );
}

/** The survey's pumps to choose from, "—" first. */
function PumpOptions({ pumps }: { pumps: { id: string; name: string }[] }) {
  return (
    <>
      <option value="">—</option>
      {pumps.map((p) => (
        <option key={p.id} value={p.id}>
          {p.name}
        </option>
      ))}
    </>
  );
}

/**
 * One stored step of the plan. A step whose pump or space was deleted since stays in the plan: its
 * field says so (an error that keeps the step) and offers the survey's pumps or spaces to choose again.
 */
function PlanStepRow({ step, n, survey, pumps, condition, system, onChange, onRemove }: { step: PlanStep; n: number; survey: SectionProps['survey']; pumps: { id: string; name: string }[]; condition: Condition; system: UnitSystem; onChange: (next: PlanStep) => void; onRemove: () => void }) {
  const errors = planStepErrors(survey, step);
  const offsetMin = survey.vessel.shipTimeOffsetMin;
  const pumpName = pumps.find((p) => p.id === step.pumpId)?.name;
  const spaceName = survey.compartments.find((c) => c.id === step.compartmentId)?.name;
  const id = `plan-step-${step.id}`;
  return (
    <li className={errors.pump || errors.space || errors.stop ? 'rounded-md border-2 border-danger p-2' : ''} data-testid="plan-step">
      <span className="flex flex-wrap items-center gap-2">
        <span>
          {pumpName ?? <b className="text-danger">deleted pump</b>} on {spaceName ?? <b className="text-danger">deleted space</b>} from {step.startH} h ({shipTime(condition.time, step.startH * 3600, offsetMin)})
          {step.stopH !== undefined ? ` to ${step.stopH} h (${shipTime(condition.time, step.stopH * 3600, offsetMin)})` : ''}
          {step.untilLevelM !== undefined ? ` or until ${fmt(step.untilLevelM, 'length', system, 3)}` : ''}
        </span>
        <button type="button" className={dangerBtn} onClick={onRemove}>
          Remove
        </button>
      </span>
      {(errors.pump || errors.space) && (
        <span className="mt-1 grid grid-cols-2 gap-2">
          {errors.pump && (
            <Select id={`${id}-pump`} label={`Pump of step ${n}`} value="" onChange={(t) => t && onChange({ ...step, pumpId: t })} error={errors.pump}>
              <PumpOptions pumps={pumps} />
            </Select>
          )}
          {errors.space && <SpaceSelect id={`${id}-space`} label={`Space of step ${n}`} compartments={survey.compartments} value="" onChange={(t) => t && onChange({ ...step, compartmentId: t })} error={errors.space} />}
        </span>
      )}
      {errors.stop && (
        <b className="block text-danger" role="alert">
          {errors.stop}
        </b>
      )}
    </li>
  );
}

function PlanEditor({ survey, condition, system, apply }: { survey: SectionProps['survey']; condition: Condition; system: UnitSystem; apply: Apply }) {
  const pumps = survey.compartments.flatMap((c) => (c.pumps ?? []).map((p) => ({ ...p, home: c.id })));
  const [v, setV] = useState({ pump: '', space: '', start: '0', stop: '', until: '' });
  const [errors, setErrors] = useState<Errors>({});
  const plan = condition.flooding?.plan ?? [];
  const save = async (steps: PlanStep[]) => apply({ kind: 'upsert', collection: 'conditions', entity: { ...condition, flooding: { ...condition.flooding, plan: steps } } });
  const add = async () => {
    const e: Errors = {};
    if (!pumps.some((p) => p.id === v.pump)) e.pump = pumps.length === 0 ? 'No pump yet: add one to a space first.' : 'Choose a pump of this survey.';
    if (!survey.compartments.some((c) => c.id === v.space)) e.space = 'Choose the space it pumps.';
    const start = need(e, 'start', v.start, 'ratio', system, { min: 0 });
    const stop = need(e, 'stop', v.stop, 'ratio', system, { optional: true, min: 0 });
    const until = need(e, 'until', v.until, 'length', system, { optional: true, min: 0 });
    if (start !== undefined && stop !== undefined && stop <= start) e.stop = 'Stops before it starts.';
    setErrors(e);
    if (Object.keys(e).length > 0) return;
    await save([...plan, { id: newId(), pumpId: v.pump, compartmentId: v.space, startH: start!, stopH: stop, untilLevelM: until }]);
  };
  return (
    <section aria-labelledby="plan-h" className="space-y-2">
      <h3 id="plan-h" className="text-lg">
        Pumping plan
      </h3>
      <ol className="list-decimal space-y-1 pl-5 text-sm" aria-label="Steps of the pumping plan">
        {plan.map((st, i) => (
          <PlanStepRow
            key={st.id}
            step={st}
            n={i + 1}
            survey={survey}
            pumps={pumps}
            condition={condition}
            system={system}
            onChange={(next) => void save(plan.map((x, j) => (j === i ? next : x)))}
            onRemove={() => void save(plan.filter((_, j) => j !== i))}
          />
        ))}
      </ol>
      <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-5" onSubmit={(e) => (e.preventDefault(), void add())} noValidate aria-label="Add a plan step">
        <Select id="plan-pump" label="Pump" value={v.pump} onChange={(t) => setV({ ...v, pump: t })} error={errors.pump}>
          <PumpOptions pumps={pumps} />
        </Select>
        <SpaceSelect id="plan-space" compartments={survey.compartments} value={v.space} onChange={(t) => setV({ ...v, space: t })} error={errors.space} />
        <Input id="plan-start" label="Start" unit="h from readings" value={v.start} onChange={(t) => setV({ ...v, start: t })} error={errors.start} />
        <Input id="plan-stop" label="Stop" unit="h, optional" value={v.stop} onChange={(t) => setV({ ...v, stop: t })} error={errors.stop} />
        <Input id="plan-until" label="Or until level" unit={measureLabel('length', system)} value={v.until} onChange={(t) => setV({ ...v, until: t })} error={errors.until} />
        <div className="col-span-full">
          <button type="submit" className={primaryBtn}>
            + Add step
          </button>
        </div>
      </form>
    </section>
  );
}

export function FloodingSection({ survey, apply, system }: SectionProps) {
  const condition = activeCondition(survey);
  const [spaceId, setSpaceId] = useState(survey.compartments[0]?.id ?? '');
  const [horizon, setHorizon] = useState(String(condition.flooding?.horizonH ?? 24));
  const [horizonError, setHorizonError] = useState<string | null>(null);
  const comp = survey.compartments.find((c) => c.id === spaceId);
  const base = useMemo(() => {
    try {
      return { f: forecastFlooding(survey), error: null };
    } catch (err) {
      return { f: null, error: err instanceof Error ? err.message : 'The forecast could not be run.' };
    }
  }, [survey]);
  const saveHorizon = async (t: string) => {
    setHorizon(t);
    const h = Number(t);
    if (!(h > 0 && h <= 240)) {
      setHorizonError('Between 0 and 240 hours.');
      return;
    }
    setHorizonError(null);
    await apply({ kind: 'upsert', collection: 'conditions', entity: { ...condition, flooding: { ...condition.flooding, horizonH: h } } });
  };
  const remove = (patch: Partial<Compartment>) => comp && apply({ kind: 'upsert', collection: 'compartments', entity: { ...comp, ...patch } });
  return (
    <section aria-labelledby="flooding-h" className="space-y-4" data-testid="flooding-section">
      <h2 id="flooding-h" className="text-2xl">
        Flooding
      </h2>
      <SpaceSelect id="flood-space" compartments={survey.compartments} value={spaceId} onChange={setSpaceId} placeholder={null} />
      {comp && (
        <div className="space-y-3" key={comp.id}>
          <h3 className="text-lg">Breaches to the sea</h3>
          <ul className="text-sm">
            {(comp.breaches ?? []).map((b) => (
              <li key={b.id} className="flex items-center gap-2">
                {openingWords(b, system)} at {pointWords(b.position, system)}{b.face ? ` (${b.face} side)` : ''}
                <button type="button" className={dangerBtn} onClick={() => void remove({ breaches: comp.breaches!.filter((x) => x.id !== b.id) })}>
                  Remove
                </button>
              </li>
            ))}
          </ul>
          <OpeningForm comp={comp} survey={survey} system={system} apply={apply} internal={false} />
          <h3 className="text-lg">Openings to other spaces</h3>
          <ul className="text-sm">
            {(comp.openings ?? []).map((o) => (
              <li key={o.id} className="flex items-center gap-2">
                {openingWords(o, system)} to {survey.compartments.find((c) => c.id === o.toCompartmentId)?.name ?? 'a missing space'}
                <button type="button" className={dangerBtn} onClick={() => void remove({ openings: comp.openings!.filter((x) => x.id !== o.id) })}>
                  Remove
                </button>
              </li>
            ))}
          </ul>
          <OpeningForm comp={comp} survey={survey} system={system} apply={apply} internal />
          <h3 className="text-lg">Pumps</h3>
          <ul className="text-sm">
            {(comp.pumps ?? []).map((p) => (
              <li key={p.id} className="flex flex-wrap items-center gap-2">
                {p.name}: {fmt(p.capacityM3S, 'flow', system, 3)}, suction {fmt(p.suctionHeightM ?? 0, 'length', system, 3)} above the bottom
                <label className="inline-flex min-h-touch items-center gap-1">
                  <input type="checkbox" className="size-6" checked={p.running !== false} onChange={(e) => void remove({ pumps: comp.pumps!.map((q) => (q.id === p.id ? { ...q, running: e.target.checked } : q)) })} />
                  running
                </label>
                <button type="button" className={dangerBtn} onClick={() => void remove({ pumps: comp.pumps!.filter((x) => x.id !== p.id) })}>
                  Remove
                </button>
              </li>
            ))}
          </ul>
          <PumpForm comp={comp} system={system} apply={apply} />
          <label className="inline-flex min-h-touch items-center gap-2 font-bold">
            <input type="checkbox" className="size-6" checked={!!comp.airTight} onChange={(e) => void remove({ airTight: e.target.checked || undefined })} />
            Air-tight, not vented (trapped air is compressed)
          </label>
          <h3 className="text-lg">Sounding log</h3>
          <SoundingLog comp={comp} system={system} apply={apply} offsetMin={survey.vessel.shipTimeOffsetMin} />
        </div>
      )}
      <PlanEditor survey={survey} condition={condition} system={system} apply={apply} />
      <section aria-labelledby="forecast-h" className="space-y-2">
        <h3 id="forecast-h" className="text-xl">
          Forecast
        </h3>
        <div className="grid grid-cols-2 gap-2">
          <Input id="flood-horizon" label="Hours ahead" value={horizon} onChange={(t) => void saveHorizon(t)} error={horizonError ?? undefined} />
        </div>
        {base.error && (
          <p className="font-bold text-danger" role="alert">
            Forecast not run: {base.error}
          </p>
        )}
        {base.f && <ForecastView forecast={base.f} survey={survey} system={system} />}
        {base.f && <WhatIf survey={survey} base={base.f} system={system} />}
      </section>
    </section>
  );
}
