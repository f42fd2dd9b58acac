/**
 * A space's sounding log: where its pipe stands (editable), each reading in ship's time with the
 * pumps that ran before it (editable per reading), and a form for the next reading. A reading must
 * come after the last one; the forms keep what was typed and say what is wrong under the field.
 * The first reading is saved at once: alone it gives the level and its time (said under the log);
 * a rate of inflow needs a second reading.
 */
import { useState } from 'react';
import type { Compartment } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { formatShipAndUtc, utcOffsetWords } from '@shared/review/time-words';
import { primaryBtn, dangerBtn, secondaryBtn } from '@client/components/ui/fields';
import { display, fmt } from '@client/lib/unit-system';
import { measureLabel } from '../utils/form-units';
import type { Apply } from '../utils/types';
import { heightOf, Input, need, type Errors } from './flooding-fields';
import { parseShipTimeEntry, SHIP_TIME_FORMAT } from '../utils/ship-time-entry';

type Reading = { time: string; soundingM: number; pumpIds?: string[] };
type Log = NonNullable<Compartment['soundingLog']>;

function PipeForm({ comp, pipe, system, onSave }: { comp: Compartment; pipe: Log['pipe']; system: UnitSystem; onSave: (pipe: Log['pipe']) => Promise<void> | void }) {
  const show = (m: number) => String(Number(display(m, 'length', system).toFixed(4)));
  const [v, setV] = useState({ x: show(pipe.x), y: show(pipe.y), z: show(pipe.bottomZM) });
  const [errors, setErrors] = useState<Errors>({});
  const [saved, setSaved] = useState(false);
  const h = heightOf(comp);
  const lu = measureLabel('length', system);
  const p = `pipe-${comp.id}`;
  const save = async () => {
    const e: Errors = {};
    const x = need(e, 'x', v.x, 'length', system), y = need(e, 'y', v.y, 'length', system), z = need(e, 'z', v.z, 'length', system);
    if (z !== undefined && !e.z && (z < h.bottom - 1e-9 || z > h.top + 1e-9)) e.z = `Outside the space: between ${fmt(h.bottom, 'length', system, 3)} and ${fmt(h.top, 'length', system, 3)}.`;
    setErrors(e);
    setSaved(false);
    if (Object.keys(e).length > 0) return;
    await onSave({ x: x!, y: y!, bottomZM: z! });
    setSaved(true);
  };
  return (
    <form className="grid grid-cols-3 gap-2 rounded-md border-2 border-line p-2" onSubmit={(e) => (e.preventDefault(), void save())} noValidate aria-label="Sounding pipe">
      <Input id={`${p}-x`} label="Pipe x" unit={lu} value={v.x} onChange={(t) => setV({ ...v, x: t })} error={errors.x} />
      <Input id={`${p}-y`} label="Pipe y" unit={lu} value={v.y} onChange={(t) => setV({ ...v, y: t })} error={errors.y} />
      <Input id={`${p}-z`} label="Pipe bottom z" unit={lu} value={v.z} onChange={(t) => setV({ ...v, z: t })} error={errors.z} />
      <div className="col-span-full flex items-center gap-2">
        <button type="submit" className={secondaryBtn}>
          Save pipe
        </button>
        {saved && <span className="text-sm text-ink-soft">Pipe saved.</span>}
      </div>
    </form>
  );
}

export function SoundingLog({ comp, system, apply, offsetMin }: { comp: Compartment; system: UnitSystem; apply: Apply; offsetMin: number | undefined }) {
  const h = heightOf(comp);
  const [v, setV] = useState({ time: '', sounding: '', pumps: [] as string[] });
  // the pipe chosen before the log has its first reading
  const [pendingPipe, setPendingPipe] = useState<Log['pipe']>(comp.soundingLog?.pipe ?? { x: h.centre.x, y: h.centre.y, bottomZM: h.bottom });
  const [errors, setErrors] = useState<Errors>({});
  const log = comp.soundingLog;
  const readings: Reading[] = log?.readings ?? [];
  const pipe = log?.pipe ?? pendingPipe;
  const clock = offsetMin === undefined ? 'UTC; the ship’s clock offset is not set' : `ship’s time, ${utcOffsetWords(offsetMin)}`;
  const saveLog = (next: Log | undefined) => apply({ kind: 'upsert', collection: 'compartments', entity: { ...comp, soundingLog: next } });
  const add = async () => {
    const e: Errors = {};
    const iso = parseShipTimeEntry(v.time, offsetMin ?? 0);
    if (iso === null) e.time = `Enter the ship’s time of the reading as ${SHIP_TIME_FORMAT}.`;
    else if (readings.length > 0 && Date.parse(iso) <= Date.parse(readings[readings.length - 1].time))
      e.time = `Out of time order: the last reading was at ${formatShipAndUtc(readings[readings.length - 1].time, offsetMin)}; enter a later time.`;
    const s = need(e, 'sounding', v.sounding, 'length', system, { min: 0 });
    if (s !== undefined && !e.sounding && pipe.bottomZM + s > h.top + 1e-9) e.sounding = `Above the top of the space (${fmt(h.top - pipe.bottomZM, 'length', system, 3)} up the pipe).`;
    setErrors(e);
    if (Object.keys(e).length > 0) return;
    await saveLog({ pipe, readings: [...readings, { time: iso!, soundingM: s!, pumpIds: v.pumps }] });
    setV({ time: '', sounding: '', pumps: [] });
  };
  const setPumpsOf = (i: number, pumpIds: string[]) => log && void saveLog({ ...log, readings: log.readings.map((r, j) => (j === i ? { ...r, pumpIds } : r)) });
  // removing the only reading removes the log (its pipe is kept on this screen for the next one)
  const remove = (i: number) => {
    if (!log) return;
    if (log.readings.length === 1) setPendingPipe(log.pipe);
    void saveLog(log.readings.length > 1 ? { ...log, readings: log.readings.filter((_, j) => j !== i) } : undefined);
  };
  const pumps = comp.pumps ?? [];
  const p = `sounding-${comp.id}`;
  return (
    <div className="space-y-2" data-testid="sounding-log">
      <PipeForm key={`${pipe.x}:${pipe.y}:${pipe.bottomZM}`} comp={comp} pipe={pipe} system={system} onSave={(next) => (log ? saveLog({ ...log, pipe: next }) : setPendingPipe(next))} />
      <ol className="space-y-1 text-sm" aria-label="Sounding log">
        {readings.map((r, i) => (
          <li key={r.time} className="rounded-md border border-line p-2" data-testid="sounding-reading">
            <span className="font-bold">{formatShipAndUtc(r.time, offsetMin)}</span>: {fmt(r.soundingM, 'length', system, 3)}
            {pumps.length > 0 && (
              <fieldset className="mt-1">
                <legend className="text-xs text-ink-soft">Pumps that ran since the reading before</legend>
                {pumps.map((q) => (
                  <label key={q.id} className="mr-3 inline-flex min-h-touch items-center gap-1">
                    <input
                      type="checkbox"
                      className="size-6"
                      checked={r.pumpIds?.includes(q.id) ?? false}
                      onChange={(e) => setPumpsOf(i, e.target.checked ? [...(r.pumpIds ?? []), q.id] : (r.pumpIds ?? []).filter((x) => x !== q.id))}
                    />
                    {q.name}
                  </label>
                ))}
              </fieldset>
            )}
            <button type="button" className={dangerBtn} onClick={() => remove(i)}>
              Remove reading
            </button>
          </li>
        ))}
      </ol>
      {readings.length === 1 && (
        <p className="rounded-md border-2 border-line bg-card p-2 text-sm" data-testid="first-sounding">
          One reading so far: the level stood at {fmt(readings[0].soundingM, 'length', system, 3)} on the pipe at {formatShipAndUtc(readings[0].time, offsetMin)}. A rate of inflow needs a second
          reading; the forecast below gives the space&apos;s level and volume from it.
        </p>
      )}
      <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-4" onSubmit={(e) => (e.preventDefault(), void add())} noValidate aria-label="Add a sounding">
        <Input id={`${p}-time`} label="Time of the reading" unit={clock} inputMode="text" placeholder="YYYY-MM-DD HH:MM" value={v.time} onChange={(t) => setV({ ...v, time: t })} error={errors.time} />
        <Input id={`${p}-s`} label="Sounding" unit={measureLabel('length', system)} value={v.sounding} onChange={(t) => setV({ ...v, sounding: t })} error={errors.sounding} />
        {pumps.length > 0 && (
          <fieldset className="col-span-2 text-sm">
            <legend className="font-bold">Pumps that ran since the last reading</legend>
            {pumps.map((q) => (
              <label key={q.id} className="mr-3 inline-flex min-h-touch items-center gap-1">
                <input type="checkbox" className="size-6" checked={v.pumps.includes(q.id)} onChange={(e) => setV({ ...v, pumps: e.target.checked ? [...v.pumps, q.id] : v.pumps.filter((x) => x !== q.id) })} />
                {q.name}
              </label>
            ))}
          </fieldset>
        )}
        <div className="col-span-full">
          <button type="submit" className={primaryBtn}>
            + Add sounding
          </button>
        </div>
      </form>
    </div>
  );
}
