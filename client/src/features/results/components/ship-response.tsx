/**
 * The ship's response at a glance (read-only; workspace, review desk): drafts, trim and heel as
 * the readings show them, as the intact ship had them and as the modelled contents predict, GM
 * solid and fluid, the nearest downflooding point, the readings set against the model, and a small
 * side and end view of the heel and trim. Everything is computed by shared/engine.
 */
import { useMemo } from 'react';
import {
  downfloodingFreeboards,
  measuredAttitude,
  readingsVersusModel,
  responseFromWeights,
  shipResponseOf,
  type ShipAttitude,
  type ShipResponse,
  type SurveyResults,
} from '@shared/engine';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { STABILITY_CAUTION } from '@shared/api/cautions';
import { fmt, num, unitLabel } from '@client/lib/unit-system';

const heelText = (deg: number) => `${Math.abs(deg).toFixed(1)}° ${deg > 0.05 ? 'stbd' : deg < -0.05 ? 'port' : ''}`.trim();

export interface ShipResponseView {
  response: ShipResponse | null;
  intact: ShipResponse | null;
}

/** The response of the survey's computed condition and of its intact ship (null without particulars). */
export function useShipResponse(survey: Survey, results: Omit<SurveyResults, 'boundaries'> | null): ShipResponseView {
  return useMemo(() => {
    const condition = results ? survey.conditions.find((c) => c.id === results.conditionId) : undefined;
    if (!results || !condition) return { response: null, intact: null };
    return { response: shipResponseOf(survey, results), intact: responseFromWeights(survey, condition, []) };
  }, [survey, results]);
}

export function ShipResponsePanel({ survey, results, system }: { survey: Survey; results: Omit<SurveyResults, 'boundaries'> | null; system: UnitSystem }) {
  const { response, intact } = useShipResponse(survey, results);
  const condition = results ? survey.conditions.find((c) => c.id === results.conditionId) : undefined;
  if (!results || !condition) return null;
  if (!response || !intact) {
    return (
      <section aria-label="Ship's response" className="rounded-lg border-2 border-line bg-card p-3" data-testid="ship-response">
        <h3 className="text-lg">Ship’s response</h3>
        <p className="mt-1 text-ink-soft" data-testid="response-not-computed">
          Not computed: these readings have no hydrostatic particulars. Enter them under Stability to see the predicted drafts, heel and GM.
        </p>
      </section>
    );
  }
  const measured = measuredAttitude(survey, condition);
  const check = readingsVersusModel(survey, condition, response);
  const nearest = downfloodingFreeboards(survey, condition, response)[0];
  const L = (v: number | null | undefined, d = 3) => fmt(v, 'length', system, d);
  const rows: { label: string; get: (a: ShipAttitude) => string }[] = [
    { label: 'Draft aft', get: (a) => num(a.draftAftM, 'length', system, 4) },
    { label: 'Draft fwd', get: (a) => num(a.draftForeM, 'length', system, 4) },
    { label: 'Mean draft', get: (a) => num(a.meanDraftM, 'length', system, 4) },
    { label: 'Trim', get: (a) => `${num(Math.abs(a.trimM), 'length', system, 2)} ${a.trimM > 0.005 ? 'stern' : a.trimM < -0.005 ? 'head' : ''}` },
    { label: 'Heel', get: (a) => heelText(a.heelDeg) },
  ];
  const danger = response.warnings.some((w) => w.severity === 'danger');
  return (
    <section aria-label="Ship's response" className={`space-y-2 rounded-lg border-2 p-3 ${danger ? 'border-danger bg-danger-soft' : 'border-hull bg-card'}`} data-testid="ship-response">
      <h3 className="text-lg">Ship’s response</h3>
      <div className="grid gap-3 sm:grid-cols-[minmax(16rem,1fr)_auto]">
        <table className="w-full text-sm tabular-nums">
          <caption className="sr-only">Attitude: intact, predicted from the modelled contents, and as read</caption>
          <thead>
            <tr className="text-left text-xs font-bold text-ink-soft">
              <th scope="col">{unitLabel('length', system)}</th>
              <th scope="col">Intact</th>
              <th scope="col">Predicted</th>
              <th scope="col">Readings</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.label} className="border-t border-line">
                <th scope="row" className="pr-1 text-left font-bold">
                  {r.label}
                </th>
                <td>{r.get(intact.attitude)}</td>
                <td className="font-bold" data-testid={`predicted-${r.label.toLowerCase().replace(/ /g, '-')}`}>
                  {r.get(response.attitude)}
                </td>
                <td>{measured ? r.get(measured) : '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
        <AttitudeSketch survey={survey} attitude={response.attitude} measured={measured} />
      </div>
      <dl className="grid grid-cols-2 gap-x-3 gap-y-1 text-sm sm:grid-cols-3">
        <div>
          <dt className="text-xs font-bold text-ink-soft">{response.ground && !response.ground.afloat ? 'GM fluid aground' : 'GM fluid'}</dt>
          <dd className="text-lg font-bold tabular-nums" data-testid="gm-fluid">
            {L(response.gmFluidM, 4)}
          </dd>
        </div>
        <div>
          <dt className="text-xs font-bold text-ink-soft">GM solid</dt>
          <dd className="tabular-nums" data-testid="gm-solid">
            {L(response.gmSolidM, 4)}
          </dd>
        </div>
        <div>
          <dt className="text-xs font-bold text-ink-soft">Free surface</dt>
          <dd className="tabular-nums">−{L(response.freeSurfaceCorrectionM)}</dd>
        </div>
        {response.ground && !response.ground.afloat && (
          <>
            <div>
              <dt className="text-xs font-bold text-ink-soft">Ground reaction</dt>
              <dd className="font-bold tabular-nums" data-testid="ground-reaction">
                {fmt(response.ground.reactionKg, 'mass', system, 4)}
              </dd>
            </div>
            <div>
              <dt className="text-xs font-bold text-ink-soft">GM fluid afloat</dt>
              <dd className="tabular-nums" data-testid="gm-afloat">
                {L(response.ground.free.gmFluidM, 4)}
              </dd>
            </div>
          </>
        )}
        <div>
          <dt className="text-xs font-bold text-ink-soft">Displacement</dt>
          <dd className="tabular-nums">{fmt(response.displacementKg, 'mass', system, 5)}</dd>
        </div>
        <div>
          <dt className="text-xs font-bold text-ink-soft">{system === 'us' ? 'TPI' : 'TPC'}</dt>
          <dd className="tabular-nums" data-testid="response-tpc">
            {fmt(results.frame.seaDensityKgM3 * response.waterplaneAreaM2, 'immersion', system, 4)}
          </dd>
        </div>
        <div>
          <dt className="text-xs font-bold text-ink-soft">{system === 'us' ? 'MTI' : 'MCT 1 cm'}</dt>
          <dd className="tabular-nums" data-testid="response-mct">
            {fmt(response.mctKgM, 'trimMoment', system, 4)}
          </dd>
        </div>
      </dl>
      <p className="text-xs text-ink-soft">
        {methodsText(survey, response)} Small-angle theory{response.heelBy === 'loll' ? '; heel shown is a rough angle of loll' : ''}.
      </p>
      {nearest && (
        <p className="text-sm" data-testid="nearest-downflooding">
          <b>Nearest downflooding point:</b> {nearest.name}, {L(nearest.predictedM, 2)} above the water predicted
          {nearest.presentM !== null ? ` (${L(nearest.presentM, 2)} now)` : ''}
          {nearest.predictedM !== null && nearest.predictedM < 0 ? ' — UNDER WATER' : ''}.
        </p>
      )}
      {check && (
        <p className={`text-sm ${check.agrees ? '' : 'font-bold'}`} data-testid="readings-vs-model">
          {check.message}
        </p>
      )}
      {response.warnings.length > 0 && (
        <ul className="space-y-1 text-sm" aria-label="Stability warnings">
          {response.warnings.map((w) => (
            <li key={w.code} className={w.severity === 'danger' ? 'font-bold text-danger' : 'font-bold'}>
              <span aria-hidden="true">▲ </span>
              {w.message}
            </li>
          ))}
        </ul>
      )}
      <p className="rounded-md border border-caution bg-caution-soft p-2 text-xs" data-testid="stability-caution">
        {STABILITY_CAUTION}
      </p>
    </section>
  );
}

function methodsText(survey: Survey, r: ShipResponse): string {
  const name = (id: string) => survey.compartments.find((c) => c.id === id)?.name ?? id;
  const parts: string[] = [];
  if (r.methods.addedWeight.length) parts.push(`Added weight: ${r.methods.addedWeight.map(name).join(', ')}.`);
  if (r.methods.lostBuoyancy.length) parts.push(`Lost buoyancy: ${r.methods.lostBuoyancy.map(name).join(', ')}.`);
  if (r.methods.ownLiquidKept.length) {
    parts.push(
      `Open to the sea with liquid of its own: ${r.methods.ownLiquidKept.map(name).join(', ')}. Its own liquid left aboard, floating on the sea water that came in, stays a weight of the ship (sea water replaced only what flowed out); only the sea water below it is taken by the method above.`,
    );
  }
  return parts.length ? parts.join(' ') : 'No liquids modelled: the intact condition.';
}

/**
 * Side and end view of the hull with the predicted waterline (solid) and the readings' (dashed).
 * Heel and trim are drawn exaggerated five times so a few tenths of a metre show on a phone.
 */
export function AttitudeSketch({ survey, attitude, measured }: { survey: Survey; attitude: ShipAttitude; measured: ShipAttitude | null }) {
  const { lbpM: L, breadthM: B, depthM: D } = survey.vessel;
  const EX = 5;
  const W = 160, H = 60;
  // side view: x → [10, 150], z → [55, 5]
  const sx = (x: number) => 10 + (140 * x) / L;
  const sz = (z: number) => 55 - (50 * z) / Math.max(D, 1e-6);
  const side = (a: ShipAttitude) => {
    const mid = a.meanDraftM, t = a.trimM * EX;
    return { y0: sz(mid + t / 2), y1: sz(mid - t / 2) };
  };
  // end view: y → centred at 80 + 60 px
  const ex = (y: number) => 80 - (40 * y) / Math.max(B / 2, 1e-6);
  const end = (a: ShipAttitude) => {
    const tan = Math.tan((Math.min(Math.abs(a.heelDeg * EX), 80) * Math.sign(a.heelDeg) * Math.PI) / 180);
    // starboard (y < 0, drawn right) goes down for positive heel
    return { yPort: sz(a.meanDraftM - (B / 2) * tan), yStbd: sz(a.meanDraftM + (B / 2) * tan) };
  };
  const p = side(attitude), e = end(attitude);
  const pm = measured ? side(measured) : null, em = measured ? end(measured) : null;
  return (
    // no wider than its two drawings: a long caption must not widen the figure over the table beside it
    <figure className="flex max-w-[20.5rem] flex-wrap gap-2">
      <svg viewBox={`0 0 ${W} ${H}`} width="160" height="60" role="img" aria-label={`Side view: trim ${attitude.trimM.toFixed(2)} m`}>
        <rect x={sx(0)} y={sz(D)} width={sx(L) - sx(0)} height={sz(0) - sz(D)} fill="none" stroke="currentColor" strokeWidth="1.5" />
        <line x1={sx(0)} y1={p.y0} x2={sx(L)} y2={p.y1} stroke="#0369a1" strokeWidth="2" />
        {pm && <line x1={sx(0)} y1={pm.y0} x2={sx(L)} y2={pm.y1} stroke="#0369a1" strokeWidth="1" strokeDasharray="3 2" />}
        <text x={4} y={10} fontSize="8">
          AFT
        </text>
        <text x={W - 22} y={10} fontSize="8">
          FWD
        </text>
      </svg>
      <svg viewBox={`0 0 ${W} ${H}`} width="160" height="60" role="img" aria-label={`End view, looking forward: heel ${heelText(attitude.heelDeg)}`}>
        <rect x={ex(B / 2)} y={sz(D)} width={ex(-B / 2) - ex(B / 2)} height={sz(0) - sz(D)} fill="none" stroke="currentColor" strokeWidth="1.5" />
        <line x1={ex(B / 2)} y1={e.yPort} x2={ex(-B / 2)} y2={e.yStbd} stroke="#0369a1" strokeWidth="2" />
        {em && <line x1={ex(B / 2)} y1={em.yPort} x2={ex(-B / 2)} y2={em.yStbd} stroke="#0369a1" strokeWidth="1" strokeDasharray="3 2" />}
        <text x={4} y={10} fontSize="8">
          PORT
        </text>
        <text x={W - 30} y={10} fontSize="8">
          STBD
        </text>
      </svg>
      <figcaption className="basis-full text-xs text-ink-soft">Predicted waterline solid, readings dashed; heel and trim drawn ×5.</figcaption>
    </figure>
  );
}

/** Which attitude a set of loads uses: the readings', or the one the ship's response predicts. */
export type LoadsAttitude = 'measured' | 'predicted';

/** Which attitude the loads use, beside the other one. */
export function AttitudeInUse({
  survey,
  results,
  system,
  mode = 'measured',
  response: given,
}: {
  survey: Survey;
  results: Omit<SurveyResults, 'boundaries'>;
  system: UnitSystem;
  mode?: LoadsAttitude;
  response?: ShipResponse | null;
}) {
  const own = useShipResponse(survey, given === undefined ? results : null).response;
  const response = given === undefined ? own : given;
  const f = results.frame;
  const trim = (m: number) => `${fmt(Math.abs(m), 'length', system, 2)} ${m > 0.005 ? 'by the stern' : m < -0.005 ? 'by the head' : ''}`.trim();
  const measured = `heel ${heelText(f.heelDeg)}, trim ${trim(f.trimM)}`;
  if (mode === 'predicted' && response) {
    const a = response.attitude;
    return (
      <div className="space-y-1 rounded-md border-2 border-hull bg-card p-2 text-sm" data-testid="attitude-in-use" data-attitude="predicted">
        <p>
          <b>These loads use the PREDICTED attitude</b> (the ship’s response to the modelled contents): drafts aft {fmt(a.draftAftM, 'length', system, 3)}, forward{' '}
          {fmt(a.draftForeM, 'length', system, 3)}, heel {heelText(a.heelDeg)}, trim {trim(a.trimM)}, GM fluid {fmt(response.gmFluidM, 'length', system, 3)}. Every liquid keeps its volume; spaces open to the sea
          stand at the predicted waterline. The readings show {measured}.
        </p>
        <p className="rounded-md border border-caution bg-caution-soft p-2 text-xs">{STABILITY_CAUTION}</p>
      </div>
    );
  }
  return (
    <p className="rounded-md border-2 border-line bg-card p-2 text-sm" data-testid="attitude-in-use" data-attitude="measured">
      <b>These loads use the measured attitude</b> (the readings): {measured}.{' '}
      {response
        ? `The model predicts heel ${heelText(response.attitude.heelDeg)}, trim ${trim(response.attitude.trimM)}, GM fluid ${fmt(response.gmFluidM, 'length', system, 3)}.`
        : 'Predicted attitude not computed: no hydrostatic particulars.'}
    </p>
  );
}
