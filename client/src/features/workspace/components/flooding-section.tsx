/**
 * "Flooding": what lets water in and out of each space (breaches to the sea, openings between
 * spaces), the pumps, the sounding log, the pumping plan, and the forecast that follows from them
 * (with one "what if" beside it). The forms keep what was typed and say what is wrong under the
 * field; nothing is saved until it is right. Everything is computed on the device.
 */
import { useMemo, useState, type ReactNode } from 'react';
import { forecastFlooding, type FloodForecast, type FloodVariant } from '@shared/engine';
import type { Compartment, Condition } from '@shared/schemas/survey';
import { OPENING_FACES, type OpeningFace, type PlanStep } from '@shared/schemas/flooding';
import type { UnitSystem } from '@shared/units/units';
import { hmm } from '@shared/api/cautions';
import { describedBy, Field, inputCls, primaryBtn, dangerBtn } from '@client/components/ui/fields';
import { fmt } from '@client/lib/unit-system';
import { ForecastView } from '@client/features/flooding/components/forecast-view';
import { measureLabel, parseField } from '../utils/form-units';
import { activeCondition } from '../utils/new-entities';
import { newId } from '../utils/new-entities';
import type { Apply, SectionProps } from '../utils/types';
import { formatUtc } from '@shared/review/time-words';

type Errors = Record<string, string>;

function Input({ id, label, unit, value, onChange, error, type = 'text', inputMode = 'decimal' }: { id: string; label: string; unit?: string; value: string; onChange: (v: string) => void; error?: string; type?: string; inputMode?: 'decimal' | 'text' }) {
  return (
    <Field id={id} label={label} unit={unit} error={error}>
      <input id={id} type={type} inputMode={type === 'text' ? inputMode : undefined} className={inputCls} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={!!error} aria-describedby={describedBy(id, undefined, error)} />
    </Field>
  );
}

function Select({ id, label, value, onChange, children, error }: { id: string; label: string; value: string; onChange: (v: string) => void; children: ReactNode; error?: string }) {
  return (
    <Field id={id} label={label} error={error} wide>
      <select id={id} className={inputCls} value={value} onChange={(e) => onChange(e.target.value)} aria-invalid={!!error} aria-describedby={describedBy(id, undefined, error)}>
        {children}
      </select>
    </Field>
  );
}

/** A number typed in the user's units, in SI; errors say what is wrong in words. */
function need(errors: Errors, key: string, text: string, measure: Parameters<typeof parseField>[1], system: UnitSystem, opts: { positive?: boolean; optional?: boolean; min?: number } = {}): number | undefined {
  if (text.trim() === '') {
    if (!opts.optional) errors[key] = 'Enter a number.';
    return undefined;
  }
  const v = parseField(text, measure, system);
  if (v === undefined || !Number.isFinite(v)) errors[key] = 'Not a number.';
  else if (opts.positive && v <= 0) errors[key] = 'Must be more than 0.';
  else if (opts.min !== undefined && v < opts.min) errors[key] = 'Must not be negative.';
  return v;
}

function heightOf(c: Compartment): { bottom: number; top: number; centre: { x: number; y: number } } {
  const g = c.geometry;
  if (g.kind === 'box') return { bottom: g.min.z, top: g.max.z, centre: { x: (g.min.x + g.max.x) / 2, y: (g.min.y + g.max.y) / 2 } };
  const zs = g.section.map((p) => p.z), ys = g.section.map((p) => p.y);
  return { bottom: Math.min(...zs), top: Math.max(...zs), centre: { x: (g.xAftM + g.xForeM) / 2, y: (Math.min(...ys) + Math.max(...ys)) / 2 } };
}

function OpeningForm({ comp, survey, system, apply, internal }: { comp: Compartment; survey: SectionProps['survey']; system: UnitSystem; apply: Apply; internal: boolean }) {
  const h = heightOf(comp);
  const [v, setV] = useState({ face: 'starboard' as OpeningFace, x: String(h.centre.x), y: String(h.centre.y), z: String(h.bottom + 1), kind: 'round', d: '', w: '', hgt: '', to: '' });
  const [errors, setErrors] = useState<Errors>({});
  const lu = measureLabel('length', system);
  const set = (k: keyof typeof v) => (t: string) => setV({ ...v, [k]: t });
  const prefix = `${internal ? 'opening' : 'breach'}-${comp.id}`;
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
        <Select id={`${prefix}-to`} label="Leads to" value={v.to} onChange={set('to')} error={errors.to}>
          <option value="">—</option>
          {survey.compartments.filter((c) => c.id !== comp.id).map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </Select>
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

function SoundingForm({ comp, system, apply }: { comp: Compartment; system: UnitSystem; apply: Apply }) {
  const [v, setV] = useState({ time: '', sounding: '', pumps: [] as string[] });
  const [pending, setPending] = useState<{ time: string; soundingM: number; pumpIds: string[] } | null>(null);
  const [errors, setErrors] = useState<Errors>({});
  const readings = comp.soundingLog?.readings ?? (pending ? [pending] : []);
  const save = async () => {
    const e: Errors = {};
    const t = new Date(v.time);
    if (Number.isNaN(t.getTime())) e.time = 'Enter the ship’s time of the reading.';
    else if (readings.length > 0 && t.getTime() <= Date.parse(readings[readings.length - 1].time)) e.time = 'Out of time order: after the last reading, please.';
    const s = need(e, 'sounding', v.sounding, 'length', system, { min: 0 });
    setErrors(e);
    if (Object.keys(e).length > 0) return;
    const reading = { time: t.toISOString(), soundingM: s!, pumpIds: v.pumps };
    if (readings.length === 0) {
      setPending(reading);
    } else {
      const h = heightOf(comp);
      const log = comp.soundingLog ?? { pipe: { x: h.centre.x, y: h.centre.y, bottomZM: h.bottom }, readings: [] };
      await apply({ kind: 'upsert', collection: 'compartments', entity: { ...comp, soundingLog: { ...log, readings: [...readings, reading] } } });
      setPending(null);
    }
    setV({ time: '', sounding: '', pumps: [] });
  };
  const p = `sounding-${comp.id}`;
  return (
    <div className="space-y-1">
      <ul className="text-sm" aria-label="Sounding log">
        {readings.map((r) => (
          <li key={r.time}>
            {formatUtc(r.time)}: {fmt(r.soundingM, 'length', system, 3)}
            {r.pumpIds?.length ? ` · pumps ran: ${r.pumpIds.map((id) => comp.pumps?.find((q) => q.id === id)?.name ?? '?').join(', ')}` : ''}
          </li>
        ))}
        {pending && <li className="text-ink-soft">One more reading starts the log.</li>}
      </ul>
      <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-4" onSubmit={(e) => (e.preventDefault(), void save())} noValidate aria-label="Add a sounding">
        <Input id={`${p}-time`} label="Ship’s time" type="datetime-local" value={v.time} onChange={(t) => setV({ ...v, time: t })} error={errors.time} />
        <Input id={`${p}-s`} label="Sounding" unit={measureLabel('length', system)} value={v.sounding} onChange={(t) => setV({ ...v, sounding: t })} error={errors.sounding} />
        <fieldset className="col-span-2 text-sm">
          <legend className="font-bold">Pumps that ran since the last reading</legend>
          {(comp.pumps ?? []).map((q) => (
            <label key={q.id} className="mr-3 inline-flex min-h-touch items-center gap-1">
              <input type="checkbox" className="size-6" checked={v.pumps.includes(q.id)} onChange={(e) => setV({ ...v, pumps: e.target.checked ? [...v.pumps, q.id] : v.pumps.filter((x) => x !== q.id) })} />
              {q.name}
            </label>
          ))}
        </fieldset>
        <div className="col-span-full">
          <button type="submit" className={primaryBtn}>
            + Add sounding
          </button>
        </div>
      </form>
    </div>
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
  const name = (id: string) => survey.compartments.find((c) => c.id === id)?.name ?? 'missing space';
  return (
    <section aria-labelledby="plan-h" className="space-y-2">
      <h3 id="plan-h" className="text-lg">
        Pumping plan
      </h3>
      <ol className="list-decimal pl-5 text-sm">
        {plan.map((st, i) => (
          <li key={st.id} className="flex flex-wrap items-center gap-2">
            {pumps.find((p) => p.id === st.pumpId)?.name ?? <b className="text-danger">missing pump</b>} on {name(st.compartmentId)} from {st.startH} h
            {st.stopH !== undefined ? ` to ${st.stopH} h` : ''}
            {st.untilLevelM !== undefined ? ` or until ${fmt(st.untilLevelM, 'length', system, 3)}` : ''}
            <button type="button" className={dangerBtn} onClick={() => void save(plan.filter((_, j) => j !== i))}>
              Remove
            </button>
          </li>
        ))}
      </ol>
      <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-5" onSubmit={(e) => (e.preventDefault(), void add())} noValidate aria-label="Add a plan step">
        <Select id="plan-pump" label="Pump" value={v.pump} onChange={(t) => setV({ ...v, pump: t })} error={errors.pump}>
          <option value="">—</option>
          {pumps.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name}
            </option>
          ))}
        </Select>
        <Select id="plan-space" label="Space" value={v.space} onChange={(t) => setV({ ...v, space: t })} error={errors.space}>
          <option value="">—</option>
          {survey.compartments.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </Select>
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

function variantOf(text: string, survey: SectionProps['survey']): FloodVariant | undefined {
  const [kind, id] = text.split(':');
  if (kind === 'stop') return { kind: 'pump-stopped', pumpId: id };
  if (kind === 'plug') return { kind: 'breach-reduced', breachId: id, remainingFraction: 0 };
  if (kind === 'half') return { kind: 'breach-reduced', breachId: id, remainingFraction: 0.5 };
  if (kind === 'vent') return { kind: 'space-vented', compartmentId: id };
  if (kind === 'add') {
    const c = survey.compartments.find((x) => x.id === id);
    return c ? { kind: 'pump-added', compartmentId: id, capacityM3S: 150 / 3600 } : undefined;
  }
  return undefined;
}

function nearest(f: FloodForecast | null): string {
  if (!f) return '—';
  const l = f.limits[0];
  return l ? `${l.name} in ${hmm(l.atS)}` : 'no boundary reaches its limit';
}

export function FloodingSection({ survey, apply, system }: SectionProps) {
  const condition = activeCondition(survey);
  const [spaceId, setSpaceId] = useState(survey.compartments[0]?.id ?? '');
  const [whatIf, setWhatIf] = useState('');
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
  const variant = useMemo(() => {
    const v = variantOf(whatIf, survey);
    if (!v) return null;
    try {
      return forecastFlooding(survey, { variant: v });
    } catch {
      return null;
    }
  }, [survey, whatIf]);
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
      <Select id="flood-space" label="Space" value={spaceId} onChange={setSpaceId}>
        {survey.compartments.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name}
          </option>
        ))}
      </Select>
      {comp && (
        <div className="space-y-3" key={comp.id}>
          <h3 className="text-lg">Breaches to the sea</h3>
          <ul className="text-sm">
            {(comp.breaches ?? []).map((b) => (
              <li key={b.id} className="flex items-center gap-2">
                {fmt(b.areaM2, 'area', system, 3)} at z {fmt(b.position.z, 'length', system, 3)} {b.face ? `(${b.face})` : ''}
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
                {fmt(o.areaM2, 'area', system, 3)} to {survey.compartments.find((c) => c.id === o.toCompartmentId)?.name ?? 'a missing space'}
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
          <SoundingForm comp={comp} system={system} apply={apply} />
        </div>
      )}
      <PlanEditor survey={survey} condition={condition} system={system} apply={apply} />
      <section aria-labelledby="forecast-h" className="space-y-2">
        <h3 id="forecast-h" className="text-xl">
          Forecast
        </h3>
        <div className="grid grid-cols-2 gap-2">
          <Input id="flood-horizon" label="Hours ahead" value={horizon} onChange={(t) => void saveHorizon(t)} error={horizonError ?? undefined} />
          <Select id="flood-whatif" label="What if…" value={whatIf} onChange={setWhatIf}>
            <option value="">— as entered —</option>
            {survey.compartments.flatMap((c) => [
              <option key={`add-${c.id}`} value={`add:${c.id}`}>
                a 150 m³/h pump added in {c.name}
              </option>,
              ...(c.pumps ?? []).map((p) => (
                <option key={`stop-${p.id}`} value={`stop:${p.id}`}>
                  {p.name} stopped
                </option>
              )),
              ...(c.breaches ?? []).flatMap((b, i) => [
                <option key={`plug-${b.id}`} value={`plug:${b.id}`}>
                  breach {i + 1} of {c.name} plugged
                </option>,
                <option key={`half-${b.id}`} value={`half:${b.id}`}>
                  breach {i + 1} of {c.name} halved
                </option>,
              ]),
              ...(c.airTight ? [<option key={`vent-${c.id}`} value={`vent:${c.id}`}>{c.name} vented</option>] : []),
            ])}
          </Select>
        </div>
        {base.error && (
          <p className="font-bold text-danger" role="alert">
            Forecast not run: {base.error}
          </p>
        )}
        {variant && base.f && (
          <table className="w-full text-left text-sm" data-testid="what-if">
            <thead>
              <tr>
                <th scope="col" />
                <th scope="col">As entered</th>
                <th scope="col">What if</th>
              </tr>
            </thead>
            <tbody>
              <tr>
                <th scope="row">Nearest limit</th>
                <td>{nearest(base.f)}</td>
                <td>{nearest(variant)}</td>
              </tr>
              {base.f.spaces
                .filter((s) => s.pumps || variant.spaces.find((x) => x.id === s.id)?.pumps)
                .map((s) => {
                  const o = variant.spaces.find((x) => x.id === s.id)!;
                  const words = (p: typeof s.pumps) => (!p ? 'no pumps' : p.verdict === 'dry' ? `dry in ${hmm(p.dryAtS ?? 0)}` : p.verdict);
                  return (
                    <tr key={s.id}>
                      <th scope="row">{s.name}</th>
                      <td>{words(s.pumps)}</td>
                      <td>{words(o.pumps)}</td>
                    </tr>
                  );
                })}
            </tbody>
          </table>
        )}
        {base.f && <ForecastView forecast={base.f} survey={survey} system={system} />}
      </section>
    </section>
  );
}
