/**
 * A flooding forecast, read-only: how old its readings are, the timeline chart, the table of
 * boundaries reaching their limits, each space's outlook and the pumping plan's steps. The
 * workspace and the review desk show the same view.
 */
import { lazy, Suspense, useEffect, useRef, useState } from 'react';
import type { FloodForecast } from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { FORECAST_CAUTION, STABILITY_CAUTION, hmm } from '@shared/api/cautions';
import { fmt, num, percent, unitLabel } from '@client/lib/unit-system';
import { downfloodingSentences, durationWords, flowWords, forecastAttitudeWords, limitGovernsWords, pumpsWords, volumeBalanceSentence } from '@shared/review/forecast-words';
import { ageWords, formatShipTime, formatUtc, utcOffsetWords } from '@shared/review/time-words';

const ForecastChart = lazy(() => import('./forecast-chart'));

/** The plain names of the spaces either side of a boundary, for the side a rating holds towards. */
function sidesOf(survey: Survey, boundaryId: string): { A: string; B: string } {
  const b = survey.boundaries.find((x) => x.id === boundaryId);
  const side = (s: Survey['boundaries'][number]['sideA'] | undefined) =>
    !s ? 'unknown' : s.kind === 'sea' ? 'sea' : s.kind === 'air' ? 'open air' : (survey.compartments.find((c) => c.id === s.compartmentId)?.name ?? 'unknown space');
  return { A: side(b?.sideA), B: side(b?.sideB) };
}

const heelWords = (deg: number) => `${Math.abs(deg).toFixed(1)}° ${deg > 0.05 ? 'stbd' : deg < -0.05 ? 'port' : ''}`.trim();

/**
 * Which attitude the levels and loads use, and how it goes: draft, trim, heel and GM at the
 * readings, at every plan step's stop and at the end; then when each downflooding point goes under.
 */
function ForecastAttitude({ forecast, survey, system }: { forecast: FloodForecast; survey: Survey; system: UnitSystem }) {
  const { attitude } = forecast;
  const follows = attitude.mode === 'follows-response';
  const moments = new Set<number>([0, forecast.times.length - 1]);
  for (const st of forecast.plan) if (st.problems.length === 0) moments.add(forecast.times.findIndex((t) => t >= st.stopS - 1e-6));
  // aground: the reaction at each moment shown, and the moment she comes off
  const reaction = attitude.groundReactionKg;
  const aground = reaction.some((r) => r !== null && r > 0);
  if (aground) moments.add(reaction.findIndex((r, k) => k > 0 && r === 0 && (reaction[k - 1] ?? 0) > 0));
  const rows = [...moments].filter((k) => k >= 0 && attitude.series[k]).sort((a, b) => a - b);
  const sentences = downfloodingSentences(forecast, survey.vessel.shipTimeOffsetMin);
  const goesUnder = forecast.downflooding.some((d) => d.underAtS !== null);
  return (
    <section aria-labelledby="attitude-h" className={`space-y-2 rounded-lg border-2 p-3 ${follows ? 'border-hull' : 'border-line'} bg-card`} data-testid="forecast-attitude">
      <h3 id="attitude-h" className="text-lg">
        {forecastAttitudeWords(forecast)}
      </h3>
      <p className="text-sm" data-testid="forecast-attitude-note">
        {attitude.note}
      </p>
      {follows && rows.length > 0 && (
        // on a phone the table wraps its cells to fit, so it does not scroll (a scrolling region inside the
        // workspace's disabled fieldset cannot take keyboard focus); it scrolls only if it still cannot fit
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Attitude over the forecast">
          <table className="w-full text-left text-xs tabular-nums sm:text-sm [&_td]:pr-2 [&_th]:pr-2 sm:[&_td]:pr-3 sm:[&_th]:pr-3" data-testid="forecast-attitude-table">
            <thead>
              <tr className="text-xs font-bold text-ink-soft">
                <th scope="col">After (h:mm)</th>
                <th scope="col">Mean draft ({unitLabel('length', system)})</th>
                <th scope="col">Trim ({unitLabel('length', system)})</th>
                <th scope="col">Heel</th>
                <th scope="col">GM fluid ({unitLabel('length', system)})</th>
                {aground && <th scope="col">Ground reaction ({unitLabel('mass', system)})</th>}
              </tr>
            </thead>
            <tbody>
              {rows.map((k) => {
                const a = attitude.series[k]!;
                const gm = attitude.gmFluidM[k];
                return (
                  <tr key={k} className="border-t border-line">
                    <th scope="row">{k === 0 ? 'readings' : hmm(forecast.times[k])}</th>
                    <td>{num(a.meanDraftM, 'length', system, 4)}</td>
                    <td className="sm:whitespace-nowrap">
                      {num(Math.abs(a.trimM), 'length', system, 2)} {a.trimM > 0.005 ? 'by stern' : a.trimM < -0.005 ? 'by head' : ''}
                    </td>
                    <td className="sm:whitespace-nowrap">{heelWords(a.heelDeg)}</td>
                    <td className={gm !== null && gm <= 0 ? 'font-bold text-danger' : ''}>{gm === null ? '—' : num(gm, 'length', system, 3)}</td>
                    {aground && <td data-testid="forecast-ground-reaction">{reaction[k] === 0 ? 'afloat' : num(reaction[k], 'mass', system, 4)}</td>}
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
      {sentences.length > 0 && (
        <ul className={`space-y-1 text-sm ${goesUnder ? 'font-bold' : ''}`} aria-label="Downflooding points" data-testid="forecast-downflooding">
          {sentences.map((t) => (
            <li key={t} className={goesUnder ? 'text-danger' : ''}>
              {goesUnder && <span aria-hidden="true">▲ </span>}
              {t}
            </li>
          ))}
        </ul>
      )}
      {follows && <p className="rounded-md border border-caution bg-caution-soft p-2 text-xs">{STABILITY_CAUTION}</p>}
    </section>
  );
}

/** A moment `s` seconds after the readings in ship's time with its UTC offset (UTC alone when the ship's clock offset is not set). */
export function shipTime(readingsTime: string, s: number, offsetMin: number | undefined): string {
  const iso = new Date(Date.parse(readingsTime) + s * 1000).toISOString();
  return offsetMin === undefined ? formatUtc(iso) : formatShipTime(iso, offsetMin);
}

/** The clock the forecast's times are said in: "ship's time, UTC+03:00", or "UTC". */
export function clockWords(offsetMin: number | undefined): string {
  return offsetMin === undefined ? 'UTC (ship’s clock offset not set)' : `ship’s time, ${utcOffsetWords(offsetMin)}`;
}

/** A forecast's timeline chart, lazily loaded, at the width of its box. */
export function ForecastTimeline({ forecast, offsetMin, system }: { forecast: FloodForecast; offsetMin: number | undefined; system: UnitSystem }) {
  const { ref, w } = useWidth();
  return (
    <div ref={ref} className="min-w-0 overflow-hidden rounded-lg border-2 border-line bg-card p-2">
      <Suspense fallback={<p className="p-4 text-ink-soft">Drawing the timeline…</p>}>
        <ForecastChart forecast={forecast} width={w - 16} offsetMin={offsetMin} system={system} />
      </Suspense>
    </div>
  );
}

function useWidth() {
  const ref = useRef<HTMLDivElement>(null);
  const [w, setW] = useState(340);
  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    const ro = new ResizeObserver(() => setW(Math.max(280, Math.floor(el.clientWidth))));
    ro.observe(el);
    return () => ro.disconnect();
  }, []);
  return { ref, w };
}

export function ForecastView({ forecast, survey, system, now = Date.now() }: { forecast: FloodForecast; survey: Survey; system: UnitSystem; now?: number }) {
  const offsetMin = survey.vessel.shipTimeOffsetMin;
  const at = (sec: number) => shipTime(forecast.readingsTime, sec, offsetMin);
  const name = (id: string) => survey.compartments.find((c) => c.id === id)?.name ?? id;
  const pumpName = (id: string) => survey.compartments.flatMap((c) => c.pumps ?? []).find((p) => p.id === id)?.name ?? 'Deleted pump';
  const planLeftOut = forecast.warnings.filter((w) => w.code === 'plan-step');
  const age = now - Date.parse(forecast.latestReadingTime);
  const worst = forecast.worstMoment;
  return (
    <div className="space-y-4" data-testid="forecast">
      <p className="rounded-lg border-2 border-caution bg-caution-soft p-3 text-sm" data-testid="forecast-caution">
        <b>{FORECAST_CAUTION}</b> It rests on readings taken {shipTime(forecast.latestReadingTime, 0, offsetMin)}
        {age > 0 ? `, ${ageWords(age)} ago` : ''}.
      </p>
      {planLeftOut.length > 0 && (
        <div className="rounded-lg border-2 border-danger bg-card p-3 text-sm" role="alert" data-testid="forecast-plan-warning">
          <b>▲ The pumping plan did not run as entered.</b>
          <ul className="list-disc pl-5">
            {planLeftOut.map((w) => (
              <li key={`${w.entityId}`}>{w.message}</li>
            ))}
          </ul>
        </div>
      )}
      <ForecastAttitude forecast={forecast} survey={survey} system={system} />
      <ForecastTimeline forecast={forecast} offsetMin={offsetMin} system={system} />
      <section aria-labelledby="limits-h">
        <h3 id="limits-h" className="text-lg">
          When boundaries reach their limit ({(forecast.horizonS / 3600).toFixed(0)} h ahead)
        </h3>
        {forecast.limits.length === 0 ? (
          <p data-testid="no-limits">No boundary reaches 100 % within the forecast.</p>
        ) : (
          <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Time to limit (scrolls sideways)">
            <table className="w-full text-left text-sm" data-testid="limits-table">
              <thead>
                <tr>
                  <th scope="col">Boundary</th>
                  <th scope="col">Reaches its limit at ({clockWords(offsetMin)})</th>
                  <th scope="col">In h:mm</th>
                  <th scope="col">What governs</th>
                </tr>
              </thead>
              <tbody>
                {forecast.limits.map((l) => (
                  <tr key={l.boundaryId} className="border-t border-line" data-boundary-id={l.boundaryId}>
                    <th scope="row">{l.name}</th>
                    <td>{l.atS === 0 ? 'already over' : at(l.atS)}</td>
                    <td className="tabular-nums" data-testid="limit-hmm">
                      {hmm(l.atS)}
                    </td>
                    <td data-testid="limit-governs">{limitGovernsWords(l, system, sidesOf(survey, l.boundaryId))}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
      <section aria-labelledby="spaces-h">
        <h3 id="spaces-h" className="text-lg">
          Spaces
        </h3>
        <ul className="space-y-2">
          {forecast.spaces
            .filter((s) => s.active || s.soundings || s.firstSounding)
            .map((s) => {
              const last = s.levelM.length - 1;
              return (
                <li key={s.id} className="rounded-md border-2 border-line bg-card p-2 text-sm" data-testid="forecast-space">
                  <b>{s.name}</b>: level {fmt(s.levelM[0], 'length', system, 3)} above its bottom now, {fmt(s.levelM[last], 'length', system, 3)} at the end; flow now{' '}
                  {flowWords(s.netFlowM3S[0], system)}. {s.equalisedAtS === null ? 'Still moving at the end.' : s.equalisedAtS === 0 ? 'Steady now.' : `Settles in ${durationWords(s.equalisedAtS)}.`}
                  {s.pumps && (
                    <span className="block">
                      {pumpsWords(s.pumps, system)}
                    </span>
                  )}
                  {s.firstSounding && (
                    <span className="block" data-testid="first-sounding-outcome">
                      Soundings: one reading so far, {fmt(s.firstSounding.soundingM, 'length', system, 3)} on the pipe at {shipTime(s.firstSounding.time, 0, offsetMin)}: the level {fmt(s.firstSounding.levelM, 'length', system, 3)} above the
                      space&apos;s lowest point, {fmt(s.firstSounding.volumeM3, 'volume', system, 3)} of liquid. A rate of inflow needs a second reading.
                    </span>
                  )}
                  {s.soundings && (
                    <span className="block" data-testid="soundings-fit">
                      Soundings: {fmt(s.soundings.grossInflowM3S, 'flow', system, 3)} coming in (pumps that ran added back; net rise {fmt(s.soundings.netRiseM3S, 'flow', system, 3)}), r² {s.soundings.r2.toFixed(3)}, residuals{' '}
                      {s.soundings.readings.map((r) => fmt(r.residualM3, 'volume', system, 2)).join(', ')}; the openings entered explain {fmt(s.soundings.orificeInflowM3S, 'flow', system, 3)}.
                      {s.soundings.disagree && (
                        <b className="block text-danger" role="alert">
                          ▲ Measured and orifice inflow differ by more than {s.soundings.factor}×: an unknown breach, or a wrong area.
                        </b>
                      )}
                    </span>
                  )}
                </li>
              );
            })}
        </ul>
      </section>
      {forecast.plan.length > 0 && (
        <section aria-labelledby="plan-out-h">
          <h3 id="plan-out-h" className="text-lg">
            Pumping plan, step by step
          </h3>
          <ol className="list-decimal space-y-1 pl-5 text-sm" data-testid="plan-outcome">
            {forecast.plan.map((st) => (
              <li key={st.stepId}>
                {pumpName(st.pumpId)} on {name(st.compartmentId)}:{' '}
                {st.problems.length > 0 ? (
                  <b className="text-danger">▲ left out of this forecast: {st.problems.join('; ')}.</b>
                ) : (
                  `${at(st.startS)} → ${at(st.stopS)}, ${hmm(st.startS)} → ${hmm(st.stopS)} after the readings (${st.stoppedBy === 'level' ? 'stopped at its level' : st.stoppedBy === 'time' ? 'stopped at its time' : 'to the end'}); level above its bottom ${fmt(st.atStart?.levelM, 'length', system, 3)} → ${fmt(st.atStop?.levelM, 'length', system, 3)}; worst load ${percent(st.atStart?.worstUtilisation)} → ${percent(st.atStop?.worstUtilisation)}`
                )}
              </li>
            ))}
          </ol>
        </section>
      )}
      {worst && (
        <p className="text-sm" data-testid="worst-moment">
          <b>Worst moment:</b> {at(worst.atS)}, {worst.atS === 0 ? 'at the readings' : `${durationWords(worst.atS)} after the readings`}, {survey.boundaries.find((b) => b.id === worst.boundaryId)?.name ?? ''} at {percent(worst.utilisation)}.
        </p>
      )}
      <p className="text-xs text-ink-soft">
        <span data-testid="volume-balance">{volumeBalanceSentence(forecast, system)}</span> {forecast.stats.steps} integration steps.
      </p>
    </div>
  );
}
