/**
 * "What if": the surveyor composes a variant of the present condition from any number of changes
 * (a pump added or stopped, a breach plugged or reduced to an area, a space vented), and sees its
 * forecast beside the forecast as entered: the nearest limit in ship's time, the limits reached,
 * each pumped space's outlook, and the two timelines side by side. Nothing of it is saved to the
 * survey; each change is checked like any other input and the form keeps what was typed.
 */
import { useMemo, useState } from 'react';
import { forecastFlooding, type FloodForecast, type FloodVariant } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import { formatOpeningArea, type UnitSystem } from '@shared/units/units';
import { openingWords } from '@shared/review/plain-words';
import { durationWords } from '@shared/review/forecast-words';
import { dangerBtn, primaryBtn } from '@client/components/ui/fields';
import { fmt, percent } from '@client/lib/unit-system';
import { ForecastTimeline, shipTime } from '@client/features/flooding/components/forecast-view';
import { measureLabel } from '../utils/form-units';
import { heightOf, Input, need, Select, SpaceSelect, type Errors } from './flooding-fields';

type Kind = FloodVariant['kind'];
const KINDS: { kind: Kind; words: string }[] = [
  { kind: 'pump-added', words: 'a pump added' },
  { kind: 'pump-stopped', words: 'a pump stopped' },
  { kind: 'breach-reduced', words: 'a breach plugged or reduced' },
  { kind: 'space-vented', words: 'a space vented' },
];

/** A change in words, for the list of the variant's changes. */
function changeWords(v: FloodVariant, survey: Survey, system: UnitSystem): string {
  const space = (id: string) => survey.compartments.find((c) => c.id === id)?.name ?? 'a missing space';
  switch (v.kind) {
    case 'pump-added':
      return `${v.name ?? 'a pump'} of ${fmt(v.capacityM3S, 'flow', system, 3)} added in ${space(v.compartmentId)}${v.suctionHeightM ? `, suction ${fmt(v.suctionHeightM, 'length', system, 3)} up` : ''}`;
    case 'pump-stopped':
      return `${survey.compartments.flatMap((c) => c.pumps ?? []).find((p) => p.id === v.pumpId)?.name ?? 'a missing pump'} stopped`;
    case 'breach-reduced': {
      const c = survey.compartments.find((x) => x.breaches?.some((b) => b.id === v.breachId));
      const b = c?.breaches?.find((x) => x.id === v.breachId);
      const name = c && b ? `breach ${c.breaches!.indexOf(b) + 1} of ${c.name}` : 'a missing breach';
      return v.remainingFraction === 0 ? `${name} plugged` : `${name} reduced to ${formatOpeningArea((b?.areaM2 ?? 0) * v.remainingFraction, system)}`;
    }
    case 'space-vented':
      return `${space(v.compartmentId)} vented`;
  }
}

function ChangeForm({ survey, system, count, onAdd }: { survey: Survey; system: UnitSystem; count: number; onAdd: (v: FloodVariant) => void }) {
  const [v, setV] = useState({ kind: 'pump-added' as Kind, space: '', capacity: '', suction: '', pump: '', breach: '', area: '' });
  const [errors, setErrors] = useState<Errors>({});
  const pumps = survey.compartments.flatMap((c) => (c.pumps ?? []).map((p) => ({ ...p, space: c.name })));
  const breaches = survey.compartments.flatMap((c) => (c.breaches ?? []).map((b, i) => ({ ...b, words: `breach ${i + 1} of ${c.name} (${openingWords(b, system)})` })));
  const set = (k: keyof typeof v) => (t: string) => setV({ ...v, [k]: t });
  const add = () => {
    const e: Errors = {};
    let change: FloodVariant | null = null;
    if (v.kind === 'pump-added') {
      const c = survey.compartments.find((x) => x.id === v.space);
      if (!c) e.space = 'Choose the space the pump draws from.';
      const cap = need(e, 'capacity', v.capacity, 'flow', system, { positive: true });
      const suction = need(e, 'suction', v.suction, 'length', system, { optional: true, min: 0 });
      if (c && suction !== undefined && !e.suction) {
        const h = heightOf(c);
        if (suction > h.top - h.bottom) e.suction = `Above the space: it is ${fmt(h.top - h.bottom, 'length', system, 3)} high.`;
      }
      if (c && cap !== undefined) change = { kind: 'pump-added', compartmentId: c.id, capacityM3S: cap, suctionHeightM: suction, pumpId: `what-if-pump-${count + 1}`, name: `Added pump ${count + 1} (what if)` };
    } else if (v.kind === 'pump-stopped') {
      if (!pumps.some((p) => p.id === v.pump)) e.pump = pumps.length === 0 ? 'No pump in the survey to stop.' : 'Choose a pump of this survey.';
      else change = { kind: 'pump-stopped', pumpId: v.pump };
    } else if (v.kind === 'breach-reduced') {
      const b = breaches.find((x) => x.id === v.breach);
      if (!b) e.breach = breaches.length === 0 ? 'No breach in the survey.' : 'Choose a breach.';
      const area = need(e, 'area', v.area, 'area', system, { min: 0 });
      if (b && area !== undefined && !e.area && area > b.areaM2 * (1 + 1e-9)) e.area = `More than the breach: it is ${formatOpeningArea(b.areaM2, system)}.`;
      if (b && area !== undefined && !e.area) change = { kind: 'breach-reduced', breachId: b.id, remainingFraction: area / b.areaM2 };
    } else {
      if (!survey.compartments.some((c) => c.id === v.space)) e.space = 'Choose the space to vent.';
      else change = { kind: 'space-vented', compartmentId: v.space };
    }
    setErrors(e);
    if (Object.keys(e).length > 0 || !change) return;
    onAdd(change);
    setV({ ...v, capacity: '', suction: '', area: '' });
  };
  return (
    <form className="grid grid-cols-2 gap-2 rounded-md border-2 border-line p-2 sm:grid-cols-4" onSubmit={(e) => (e.preventDefault(), add())} noValidate aria-label="Add a change to the what if">
      <Select id="whatif-kind" label="Change" value={v.kind} onChange={(t) => (setV({ ...v, kind: t as Kind }), setErrors({}))}>
        {KINDS.map((k) => (
          <option key={k.kind} value={k.kind}>
            {k.words}
          </option>
        ))}
      </Select>
      {(v.kind === 'pump-added' || v.kind === 'space-vented') && (
        <SpaceSelect id="whatif-space" compartments={survey.compartments} value={v.space} onChange={set('space')} error={errors.space} />
      )}
      {v.kind === 'pump-added' && (
        <>
          <Input id="whatif-capacity" label="Capacity" unit={measureLabel('flow', system)} value={v.capacity} onChange={set('capacity')} error={errors.capacity} />
          <Input id="whatif-suction" label="Suction above the bottom" unit={measureLabel('length', system)} value={v.suction} onChange={set('suction')} error={errors.suction} />
        </>
      )}
      {v.kind === 'pump-stopped' && (
        <Select id="whatif-pump" label="Pump" value={v.pump} onChange={set('pump')} error={errors.pump}>
          <option value="">—</option>
          {pumps.map((p) => (
            <option key={p.id} value={p.id}>
              {p.name} ({p.space})
            </option>
          ))}
        </Select>
      )}
      {v.kind === 'breach-reduced' && (
        <>
          <Select id="whatif-breach" label="Breach" value={v.breach} onChange={set('breach')} error={errors.breach}>
            <option value="">—</option>
            {breaches.map((b) => (
              <option key={b.id} value={b.id}>
                {b.words}
              </option>
            ))}
          </Select>
          <Input id="whatif-area" label="Area left open (0: plugged)" unit={measureLabel('area', system)} value={v.area} onChange={set('area')} error={errors.area} />
        </>
      )}
      <div className="col-span-full">
        <button type="submit" className={primaryBtn}>
          + Add to the what if
        </button>
      </div>
    </form>
  );
}

function nearestWords(f: FloodForecast, offsetMin: number | undefined): string {
  const l = f.limits[0];
  if (!l) return 'no boundary reaches its limit';
  return l.atS === 0 ? `${l.name}: already over` : `${l.name} at ${shipTime(f.readingsTime, l.atS, offsetMin)} (in ${durationWords(l.atS)})`;
}

function outlook(p: FloodForecast['spaces'][number]['pumps']): string {
  if (!p) return 'no pumps';
  if (p.verdict === 'dry') return `pumped dry in ${durationWords(p.dryAtS ?? 0)}`;
  return p.verdict === 'gaining' ? 'the pumps gain on the inflow, not dry within the forecast' : p.verdict === 'holding' ? 'the pumps only match the inflow: the level holds' : 'the pumps do not keep up: the level rises';
}

export function WhatIf({ survey, base, system }: { survey: Survey; base: FloodForecast; system: UnitSystem }) {
  const [changes, setChanges] = useState<FloodVariant[]>([]);
  const offsetMin = survey.vessel.shipTimeOffsetMin;
  const variant = useMemo(() => {
    if (changes.length === 0) return { f: null, error: null };
    try {
      return { f: forecastFlooding(survey, { variant: changes }), error: null };
    } catch (err) {
      return { f: null, error: err instanceof Error ? err.message : 'The what if could not be run.' };
    }
  }, [survey, changes]);
  const v = variant.f;
  const lastWorst = (f: FloodForecast) => f.worst[f.worst.length - 1]?.utilisation ?? null;
  return (
    <section aria-labelledby="whatif-h" className="space-y-2" data-testid="what-if-composer">
      <h4 id="whatif-h" className="text-lg">
        What if…
      </h4>
      {changes.length > 0 && (
        <ul className="space-y-1 text-sm" aria-label="Changes in the what if">
          {changes.map((c, i) => (
            <li key={i} className="flex flex-wrap items-center gap-2">
              {changeWords(c, survey, system)}
              <button type="button" className={dangerBtn} onClick={() => setChanges(changes.filter((_, j) => j !== i))}>
                Remove
              </button>
            </li>
          ))}
        </ul>
      )}
      <ChangeForm survey={survey} system={system} count={changes.filter((c) => c.kind === 'pump-added').length} onAdd={(c) => setChanges([...changes, c])} />
      {variant.error && (
        <p className="font-bold text-danger" role="alert">
          What if not run: {variant.error}
        </p>
      )}
      {v && (
        <>
          <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="As entered against the what if (scrolls sideways)">
            <table className="w-full text-left text-sm" data-testid="what-if">
              <thead>
                <tr>
                  <th scope="col" />
                  <th scope="col">As entered</th>
                  <th scope="col">What if</th>
                </tr>
              </thead>
              <tbody>
                <tr className="border-t border-line">
                  <th scope="row">Nearest limit</th>
                  <td data-testid="what-if-base-nearest">{nearestWords(base, offsetMin)}</td>
                  <td data-testid="what-if-nearest">{nearestWords(v, offsetMin)}</td>
                </tr>
                <tr className="border-t border-line">
                  <th scope="row">Boundaries reaching their limit</th>
                  <td>{base.limits.length}</td>
                  <td>{v.limits.length}</td>
                </tr>
                <tr className="border-t border-line">
                  <th scope="row">Worst load at the end</th>
                  <td>{percent(lastWorst(base))}</td>
                  <td>{percent(lastWorst(v))}</td>
                </tr>
                {v.spaces
                  .filter((s) => s.pumps || base.spaces.find((x) => x.id === s.id)?.pumps)
                  .map((s) => (
                    <tr key={s.id} className="border-t border-line">
                      <th scope="row">{s.name}</th>
                      <td>{outlook(base.spaces.find((x) => x.id === s.id)?.pumps ?? null)}</td>
                      <td>{outlook(s.pumps)}</td>
                    </tr>
                  ))}
              </tbody>
            </table>
          </div>
          <div className="grid gap-2 lg:grid-cols-2">
            <figure className="min-w-0">
              <figcaption className="text-sm font-bold">As entered</figcaption>
              <ForecastTimeline forecast={base} offsetMin={offsetMin} system={system} />
            </figure>
            <figure className="min-w-0">
              <figcaption className="text-sm font-bold">What if</figcaption>
              <ForecastTimeline forecast={v} offsetMin={offsetMin} system={system} />
            </figure>
          </div>
        </>
      )}
    </section>
  );
}
