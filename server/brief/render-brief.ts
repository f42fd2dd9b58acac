/**
 * The master's brief as one self-contained HTML page: no script, no web font, no image, one small
 * inline style sheet. Readable on a 360 px phone and printable on one or two A4 pages.
 */
import type { Survey } from '@shared/schemas/survey';
import { type BoundaryResult, type SurveyResults } from '@shared/engine';
import type { Verdict } from '@shared/api/review';
import { CAUTIONS, FORECAST_CAUTION, STABILITY_CAUTION, hmm } from '@shared/api/cautions';
import { downfloodingFreeboards, forecastFlooding, measuredAttitude, readingsVersusModel, shipResponseOf } from '@shared/engine';
import { STATUS_LABELS } from '@shared/review/status';
import { formatNumber, formatQuantity, type UnitSystem } from '@shared/units/units';
import {
  boundaryVerdictLabel,
  boundaryVerdictMeaning,
  describeLimit,
  namesFromSurvey,
  surveyVerdictLabel,
  verdictSeverity,
} from '@shared/review/words';
import { formatShipAndUtc } from '@shared/review/time-words';
import { downfloodingSentences, forecastAttitudeWords, volumeBalanceSentence } from '@shared/review/forecast-words';
import { boundaryKindWords } from '@shared/review/plain-words';
import { figureNotes, figureNoteSentence } from '@shared/review/assumptions';
import { measurableLimit } from '@shared/review/measurable-limits';
import { structureCheckRows } from '@shared/review/structure-rows';
import { governingCheckWords } from '@shared/review/rating-words';
import { html, type SafeHtml } from './html';
import { briefSeenToken } from './brief-seen';
import type { BriefPageData } from './brief-data';


/** How many boundaries the brief lists at most, so it stays on one or two pages. */
const MAX_BOUNDARIES = 8;


const SEVERITY_CLASS = ['ok', 'care', 'warn', 'bad'] as const;

/** The boundary's structural checks as a compact table: what, load, allowed, use (sources are in the report). */
function checksTable(b: BoundaryResult, doc: Survey, units: UnitSystem, sides: { A: string; B: string }): SafeHtml | '' {
  // ratings by direction (which way a cover may be pushed matters on deck) and the most used shore
  // always show; other checks under half used are left to the report, so the brief keeps to its pages
  const rows = structureCheckRows(b, units, sides, doc.boundaries.find((x) => x.id === b.id), { compact: true }).filter(
    (r) => (r.kind === 'rating' && r.direction !== 'either') || r.kind === 'shore' || r.utilisation === null || r.utilisation >= 0.5,
  );
  // one rating either way is already said in the line above the table
  if (rows.length === 0 || (rows.length === 1 && rows[0].direction === 'either')) return '';
  const use = (u: number | null) => (u === null ? html`<span class="muted">—</span>` : html`<span class="${u > 1 ? 'over' : ''}">${u > 1 ? '▲ ' : ''}${formatNumber(u * 100, 3)} %</span>`);
  return html`<table class="checks"><thead><tr><th scope="col">Check</th><th scope="col">Load</th><th scope="col">Allowed</th><th scope="col">Use</th></tr></thead><tbody>${rows.map(
    (r) => html`<tr><th scope="row">${r.check}${r.note ? html`<div class="note">${r.note}</div>` : ''}</th><td>${r.load}</td><td>${r.capacity}</td><td>${use(r.utilisation)}</td></tr>`,
  )}</tbody></table>`;
}

function boundariesThatMatter(results: SurveyResults, verdicts: Verdict[]): BoundaryResult[] {
  const withVerdict = new Set(verdicts.filter((v) => v.scope === 'boundary').map((v) => v.boundaryId));
  const score = (b: BoundaryResult) =>
    (withVerdict.has(b.id) ? 10 : 0) + (b.maxUtilisation ?? 0) + (Math.abs(b.net.forceN) > 0 ? 0.01 : 0);
  return results.boundaries
    .filter((b) => withVerdict.has(b.id) || (b.maxUtilisation ?? 0) >= 0.5 || Math.abs(b.net.resultantN) > 0)
    .sort((a, b) => score(b) - score(a) || Math.abs(b.net.resultantN) - Math.abs(a.net.resultantN))
    .slice(0, MAX_BOUNDARIES);
}

function sideLabel(results: SurveyResults, side: BoundaryResult['sideA']): string {
  if (side.kind === 'sea') return 'the sea';
  if (side.kind === 'air') return 'open air';
  return results.compartments.find((c) => c.id === side.compartmentId)?.name ?? 'a space';
}

/** The nearest time-to-limit in plain words, with what it assumes (null when no forecast can be run). */
export function nearestLimitWords(doc: Survey, units: UnitSystem = 'si'): { sentence: string; assumptions: string; downflooding: string[]; attitude: string; balance: string } | null {
  const utc = (iso: string | null) => formatShipAndUtc(iso, doc.vessel.shipTimeOffsetMin);
  let f;
  try {
    f = forecastFlooding(doc);
  } catch {
    return null;
  }
  const first = f.limits[0];
  const hours = (f.horizonS / 3600).toFixed(0);
  const sentence = !first
    ? `No boundary reaches its limit within the next ${hours} hours.`
    : first.atS === 0
      ? `${first.name} is already past its limit.`
      : `${first.name} is expected to reach its limit at ${utc(new Date(Date.parse(f.readingsTime) + first.atS * 1000).toISOString())}, ${hmm(first.atS)} (h:mm) after the soundings.`;
  // a plan step whose pump or space was deleted is left out of the run: the brief says so rather than assume it ran
  const leftOut = f.warnings.filter((w) => w.code === 'plan-step').map((w) => ` ${w.message}`).join('');
  const assumptions = `This assumes the breaches, openings, pumps and pumping plan stay as entered, and ${f.attitude.note.charAt(0).toLowerCase()}${f.attitude.note.slice(1)}${leftOut} ${FORECAST_CAUTION} It rests on readings of ${utc(f.latestReadingTime)}.`;
  return { sentence, assumptions, downflooding: downfloodingSentences(f, doc.vessel.shipTimeOffsetMin), attitude: forecastAttitudeWords(f), balance: volumeBalanceSentence(f, units) };
}

/** What every part of the brief needs: what is shown, unit and time formatting, the condition. */
function briefContext(d: BriefPageData) {
  const withheld = d.figuresWithheld === true;
  return {
    d,
    withheld,
    shownRevision: d.shownRevision ?? d.revision,
    q: (v: number, dim: Parameters<typeof formatQuantity>[1], digits = 3) => formatQuantity(v, dim, d.units, digits).text,
    utc: (iso: string | null) => formatShipAndUtc(iso, d.doc.vessel.shipTimeOffsetMin),
    condition: d.doc.conditions.find((c) => c.id === d.doc.activeConditionId) ?? d.doc.conditions[0],
    r: withheld ? null : d.results,
    noFigures: withheld
      ? html`<p class="muted">Not shown: the figures the engineer accepted are not kept on the server, and the newer ones are not reviewed.</p>`
      : html`<p class="muted">The server has not worked out the loads for this survey yet.</p>`,
  };
}
type BriefContext = ReturnType<typeof briefContext>;

function floodedRows({ r, q }: BriefContext): SafeHtml[] {
  const flooded = r ? r.compartments.filter((c) => c.liquid.volumeM3 > 1e-9) : [];
  return flooded.map(
    (c) => html`<tr><th scope="row">${c.name}${c.openToSea ? html` <span class="tag">open to sea</span>` : ''}</th>
<td>${c.layers.filter((l) => l.volumeM3 > 1e-9).map((l) => html`<div>${l.fluidName}: ${q(l.massKg, 'mass')}${c.tank && l.ownVolumeM3 > 0 ? html` <span class="muted">(${l.ownVolumeM3 >= l.volumeM3 * (1 - 1e-9) ? "the tank's own" : html`${q(l.ownVolumeM3, 'volume')} the tank's own`})</span>` : ''}</div>`)}</td>
<td>${formatNumber(c.fillFraction * 100, 2)} %</td></tr>`,
  );
}

function boundaryItems({ d, r, q }: BriefContext): SafeHtml[] {
  const boundaryVerdicts = new Map(d.verdicts.filter((v) => v.scope === 'boundary').map((v) => [v.boundaryId, v]));
  const important = r ? boundariesThatMatter(r, d.verdicts) : [];
  return important.map((b) => {
    const v = boundaryVerdicts.get(b.id);
    const sev = v ? verdictSeverity(v.verdict) : null;
    const sides = { A: sideLabel(r!, b.sideA), B: sideLabel(r!, b.sideB) };
    const gov = governingCheckWords(b, d.units, sides);
    return html`<li class="boundary">
<div class="bhead"><strong>${b.name}</strong> <span class="muted">(${boundaryKindWords(b.kind)}, between ${sideLabel(r!, b.sideA)} and ${sideLabel(r!, b.sideB)})</span></div>
${v ? html`<div class="verdict ${SEVERITY_CLASS[sev!]}"><strong>${boundaryVerdictLabel(v.verdict)}</strong>: ${boundaryVerdictMeaning(v.verdict)}.${v.note ? html` ${v.note}` : ''}</div>` : html`<div class="muted">No verdict given.</div>`}
<div class="figs">Net load ${q(Math.abs(b.net.resultantN), 'force')} pushing towards ${sideLabel(r!, b.net.forceN >= 0 ? b.sideB : b.sideA)} · highest net pressure ${q(Math.abs(b.net.peak.pressurePa), 'pressure')} towards ${sideLabel(r!, b.net.peak.pressurePa >= 0 ? b.sideB : b.sideA)}${
      gov ? html` · <span class="${gov.utilisation > 1 ? 'over' : ''}">${gov.utilisation > 1 ? '▲ OVER CAPACITY: ' : ''}${formatNumber(gov.utilisation * 100, 3)} % of ${gov.what}</span>` : ''
    }</div>
${checksTable(b, d.doc, d.units, sides)}
</li>`;
  });
}

/** The ship's response: the attitude read beside the one predicted, GM, the nearest downflooding point. */
function stabilityHtml({ d, r, q, condition, withheld, noFigures }: BriefContext): SafeHtml {
  const response = r ? shipResponseOf(d.doc, r) : null;
  if (!response) return withheld ? noFigures : html`<p class="muted">Not computed: the survey has no hydrostatic particulars for these readings.</p>`;
  const nearest = condition ? downfloodingFreeboards(d.doc, condition, response)[0] : undefined;
  // the attitude the ship actually shows, beside the model's: a master must never read a predicted heel as the present one
  const measured = condition ? measuredAttitude(d.doc, condition) : null;
  const check = condition ? readingsVersusModel(d.doc, condition, response) : null;
  // aground, the figures are those of the ship resting on the ground (the same response as the device's Stability panel)
  const ground = response.ground && !response.ground.afloat ? response.ground : null;
  const trimWords = (m: number) => `${q(Math.abs(m), 'length')} ${m > 0 ? 'by the stern' : m < 0 ? 'by the head' : ''}`.trim();
  const heelWords = (deg: number) => `${formatNumber(Math.abs(deg), 2)}° ${deg > 0.05 ? 'to starboard' : deg < -0.05 ? 'to port' : ''}`;
  return html`${measured ? html`<p>The readings show: drafts aft <strong>${q(measured.draftAftM, 'length')}</strong>, forward <strong>${q(measured.draftForeM, 'length')}</strong>, heel <strong>${heelWords(measured.heelDeg)}</strong>, trim <strong>${trimWords(measured.trimM)}</strong>.</p>` : ''}
<p>Predicted from the modelled flooding: drafts aft <strong>${q(response.attitude.draftAftM, 'length')}</strong>, forward <strong>${q(response.attitude.draftForeM, 'length')}</strong>, heel <strong>${heelWords(response.attitude.heelDeg)}</strong>, trim <strong>${trimWords(response.attitude.trimM)}</strong>.</p>
${check && !check.agrees ? html`<p class="over">${check.message} Until that is explained, the readings, not the prediction, show how the ship lies.</p>` : ''}
<p>GM after free surface${ground ? ', resting on the ground' : ''}: <strong class="${response.gmFluidM <= 0 ? 'over' : ''}">${q(response.gmFluidM, 'length')}</strong>${ground ? html` (ground reaction <strong>${q(ground.reactionKg, 'mass')}</strong>; afloat, if she came off: ${q(ground.free.gmFluidM, 'length')})` : ''}${nearest && nearest.predictedM !== null ? html` · nearest opening that would let water in: <strong>${nearest.name}</strong>, ${q(nearest.predictedM, 'length')} above the water` : ''}.</p>
${response.warnings.length ? html`<ul>${response.warnings.map((w) => html`<li class="${w.severity === 'danger' ? 'over' : ''}">${w.message}</li>`)}</ul>` : ''}
<p class="muted">${STABILITY_CAUTION}</p>`;
}

/** The master's "received and understood" form, with the latest acknowledgement (only on the link's own page). */
function ackSection({ d, utc }: BriefContext, opts: BriefPageOptions): SafeHtml | '' {
  const ack = d.acknowledgement;
  return d.token
    ? html`<section aria-labelledby="h-ack" id="acknowledged" class="ack">
  <h2 id="h-ack">Received and understood</h2>
  ${ack ? html`<p class="done">Acknowledged by <strong>${ack.name}</strong>, ${utc(ack.at)} (survey revision ${ack.revision}).</p>` : ''}
  ${opts.ackNotice ? html`<p class="err" id="ack-notice" role="alert">${opts.ackNotice}</p>` : ''}
  <form method="post" action="/brief/${d.token}/acknowledge">
    <input type="hidden" name="seen" value="${briefSeenToken(d)}">
    <label for="ack-name">Your name and rank</label>
    <input id="ack-name" name="name" autocomplete="name" maxlength="120" required${opts.ackName ? html` value="${opts.ackName}"` : ''}${opts.ackError ? html` aria-invalid="true" aria-describedby="ack-error"` : ''}>
    ${opts.ackError ? html`<p class="err" id="ack-error">${opts.ackError}</p>` : ''}
    <button type="submit">${ack ? 'Acknowledge again' : 'Received and understood'}</button>
  </form>
  <p class="muted">The engineer sees your name and the time. It records that you have read this brief, nothing more.</p>
</section>`
    : '';
}

/** Whether the figures shown were reviewed, and what changed since the link was sent. */
function reviewNotice({ d, withheld, shownRevision }: BriefContext): SafeHtml | '' {
  const changedSince = d.revision > d.issuedRevision;
  const newer = d.newerRevision ?? null;
  const unreviewed = !newer && d.status !== 'accepted' && d.status !== 'in_review';
  return newer
    ? html`<p class="notice" data-notice="newer-figures">Newer figures exist. The survey was changed after the engineer accepted revision ${shownRevision}; it is now at revision ${newer} (“${STATUS_LABELS[d.status]}”). Nobody has reviewed those changes yet, so they are not shown here. ${
        withheld ? 'The accepted figures cannot be shown either: ask the engineer.' : html`Everything below is revision ${shownRevision}, as accepted.`
      } Ask the engineer before you act on any change made since.</p>`
    : unreviewed
      ? html`<p class="notice" data-notice="unreviewed">No engineer has reviewed these figures${d.status === 'changed_since_review' ? ': the survey changed after it was sent for review' : ''}. Treat every figure as unchecked.</p>`
      : changedSince
        ? html`<p class="notice">The survey has changed since this brief was sent. Ask the engineer for a fresh one before you act on it.</p>`
        : '';
}

function reviewedLine({ d, utc, shownRevision }: BriefContext): SafeHtml {
  const newer = d.newerRevision ?? null;
  return d.reviewedBy && (d.status === 'accepted' || newer)
    ? html`Accepted by <strong>${d.reviewedBy}</strong>${d.reviewedAt ? html` on ${utc(d.reviewedAt)}` : ''}: survey revision ${shownRevision}`
    : d.reviewedBy && d.status === 'in_review'
      ? html`Under review by <strong>${d.reviewedBy}</strong>${d.reviewedAt ? html` since ${utc(d.reviewedAt)}` : ''}: survey revision ${shownRevision}`
      : html`Not reviewed: survey revision ${shownRevision}`;
}

/** The top of the brief: the vessel, when the soundings were taken, the review notice, the verdict and the limits. */
function briefTop(ctx: BriefContext): SafeHtml {
  const { d, utc, condition } = ctx;
  const names = namesFromSurvey(d.doc);
  const surveyVerdict = d.verdicts.find((v) => v.scope === 'survey');
  const sev = surveyVerdict ? verdictSeverity(surveyVerdict.verdict) : null;
  const limitItems = d.limits.map((l) => {
    const measure = measurableLimit(l.rule, d.doc, d.units);
    return html`<li>${describeLimit(l, names, d.units)}${measure ? html`<div class="measure">${measure}</div>` : ''}</li>`;
  });
  return html`
<header>
  <p class="kicker">Flooding brief · read only</p>
  <h1>${d.doc.vessel.name}${d.doc.vessel.imo ? html` <span class="muted">IMO ${d.doc.vessel.imo}</span>` : ''}</h1>
  <p class="sub">${d.doc.title}</p>
  <p class="when">Soundings taken <strong>${utc(condition?.time ?? null)}</strong> · review status: <strong>${STATUS_LABELS[d.status]}</strong></p>
  ${reviewNotice(ctx)}
</header>
<section aria-labelledby="h-verdict">
  <h2 id="h-verdict">The engineer’s verdict</h2>
  ${surveyVerdict
    ? html`<p class="verdict big ${SEVERITY_CLASS[sev!]}"><strong>${surveyVerdictLabel(surveyVerdict.verdict)}</strong>${surveyVerdict.note ? html`<br>${surveyVerdict.note}` : ''}</p>`
    : html`<p class="verdict big care"><strong>No overall verdict yet.</strong> Treat every figure below as unchecked.</p>`}
</section>
<section aria-labelledby="h-limits">
  <h2 id="h-limits">Operating limits</h2>
  ${limitItems.length ? html`<ol class="limits">${limitItems}</ol>` : html`<p class="muted">The engineer set no limits.</p>`}
</section>`;
}

/** The figures: time to the nearest limit, what is flooded, the ship's response, the boundaries that matter. */
function briefFigures(ctx: BriefContext): SafeHtml {
  const { d, r, q, withheld, noFigures } = ctx;
  const nearestLimit = withheld ? null : nearestLimitWords(d.doc, d.units);
  const flooded = floodedRows(ctx);
  const items = boundaryItems(ctx);
  return html`${nearestLimit ? html`<section aria-labelledby="h-nearest">
  <h2 id="h-nearest">Time to the nearest limit</h2>
  <p><strong>${nearestLimit.sentence}</strong></p>
  ${nearestLimit.downflooding.length ? html`<ul>${nearestLimit.downflooding.map((t) => html`<li><strong>${t}</strong></li>`)}</ul>` : ''}
  <p class="muted">${nearestLimit.attitude}: ${nearestLimit.assumptions}</p>
  <p class="muted">${nearestLimit.balance}</p>
</section>` : ''}
<section aria-labelledby="h-flooded">
  <h2 id="h-flooded">What is flooded</h2>
  ${r
    ? html`<p>Flood water aboard: <strong>${q(r.ship.floodWater.massKg, 'mass')}</strong> · oil: <strong>${q(r.ship.oil.massKg, 'mass')}</strong>${r.ship.tankContents.massKg > 0 ? html` · tanks' own liquid (not flood water): <strong>${q(r.ship.tankContents.massKg, 'mass')}</strong>` : ''}${
        r.summary.totalInflowM3S > 0 ? html` · inflow about <strong>${q(r.summary.totalInflowM3S, 'flow')}</strong>` : ''
      }</p>
${flooded.length ? html`<table><thead><tr><th scope="col">Space</th><th scope="col">Holds</th><th scope="col">Full</th></tr></thead><tbody>${flooded}</tbody></table>` : html`<p>No space holds liquid in this survey.</p>`}`
    : noFigures}
</section>
<section aria-labelledby="h-stability">
  <h2 id="h-stability">The ship’s response</h2>
  ${stabilityHtml(ctx)}
</section>
<section aria-labelledby="h-boundaries">
  <h2 id="h-boundaries">Boundaries that matter</h2>
  ${items.length ? html`<ul class="boundaries">${items}</ul>` : r ? html`<p class="muted">No boundary carries a net load.</p>` : noFigures}
</section>`;
}

export interface BriefPageOptions {
  /** The acknowledgement form's field error. */
  ackError?: string;
  /** Said above the form when the brief changed after the master opened it. */
  ackNotice?: string;
  /** The name the master typed, kept when the form comes back. */
  ackName?: string;
}

export function renderBriefPage(d: BriefPageData, opts: BriefPageOptions = {}): string {
  const ctx = briefContext(d);
  const newer = d.newerRevision ?? null;
  const notes = ctx.withheld ? [] : figureNotes(d.doc);
  const body: SafeHtml = html`${briefTop(ctx)}
${briefFigures(ctx)}
${notes.length ? html`<section aria-labelledby="h-notes">
  <h2 id="h-notes">Figures not measured</h2>
  <ul>${notes.map((n) => html`<li>${figureNoteSentence(n)}</li>`)}</ul>
</section>` : ''}
<section aria-labelledby="h-cautions" class="cautions">
  <h2 id="h-cautions">Cautions</h2>
  <ul>${[...CAUTIONS, STABILITY_CAUTION].map((c) => html`<li>${c}</li>`)}</ul>
</section>
<section aria-labelledby="h-contact">
  <h2 id="h-contact">Your engineer</h2>
  ${d.engineer ? html`<p><strong>${d.engineer.name}</strong>, ${d.organisationName}: <a href="mailto:${d.engineer.email}">${d.engineer.email}</a></p>` : html`<p class="muted">Ask ${d.organisationName} for the engineer on duty.</p>`}
</section>
${ackSection(ctx, opts)}
<footer>
  <p data-testid="reviewed-line">${reviewedLine(ctx)}${newer ? html` (the survey is now at revision ${newer}, not reviewed)` : ''} · ${d.organisationName}.</p>
  <p>This link stops working ${ctx.utc(d.expiresAt)} and may be withdrawn earlier. Do not forward it. Figures in ${d.units === 'us' ? 'US customary units' : 'SI units'}.</p>
</footer>`;

  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex, nofollow">
<meta name="referrer" content="no-referrer">
<title>Flooding brief: ${html`${d.doc.vessel.name}`}</title>
<style>${STYLE}</style>
</head>
<body>
<main>${body}</main>
</body>
</html>`;
}

/** The 404 page for unknown, expired and revoked links alike: it says nothing about which. */
export function renderBriefNotFound(): string {
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex, nofollow"><meta name="referrer" content="no-referrer">
<title>Brief not available</title><style>${STYLE}</style></head>
<body><main><h1>This brief is not available</h1>
<p>The link may be mistyped, out of date or withdrawn. Ask the engineer who sent it for a new one.</p></main></body></html>`;
}

const STYLE = `
:root{color-scheme:light;--ink:#0d1217;--soft:#3a4652;--line:#b9c0c7;--paper:#f7f5ef;--hull:#0b2239;
--ok:#0f6b3a;--ok-soft:#d9f0e2;--care:#8a5a00;--care-soft:#fff0c2;--bad:#b0004f;--bad-soft:#fde0ec}
*{box-sizing:border-box}
html{-webkit-text-size-adjust:100%}
body{margin:0;background:var(--paper);color:var(--ink);font:17px/1.45 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif}
main{max-width:46rem;margin:0 auto;padding:16px 14px 32px}
h1{font-size:1.6rem;margin:.1em 0;line-height:1.2;overflow-wrap:anywhere}
h2{font-size:1.15rem;margin:1.3em 0 .4em;padding-bottom:.15em;border-bottom:2px solid var(--hull)}
p{margin:.4em 0}
.kicker{margin:0;font-size:.85rem;font-weight:700;letter-spacing:.06em;text-transform:uppercase;color:var(--soft)}
.sub{font-size:1.05rem;color:var(--soft)}
.muted{color:var(--soft);font-weight:normal}
.notice{border:2px solid var(--bad);background:var(--bad-soft);padding:8px 10px;border-radius:6px;font-weight:700}
.verdict{border-left:6px solid var(--care);background:var(--care-soft);padding:6px 10px;border-radius:4px;margin:.3em 0}
.verdict.big{font-size:1.1rem;padding:10px 12px}
.verdict.ok{border-color:var(--ok);background:var(--ok-soft)}
.verdict.care{border-color:var(--care);background:var(--care-soft)}
.verdict.warn,.verdict.bad{border-color:var(--bad);background:var(--bad-soft)}
.limits{padding-left:1.4em;margin:.3em 0}
.limits li{margin:.35em 0;font-weight:700}
table{width:100%;border-collapse:collapse;font-variant-numeric:tabular-nums;font-size:.95rem}
th,td{text-align:left;vertical-align:top;padding:6px 4px;border-bottom:1px solid var(--line)}
thead th{font-size:.8rem;text-transform:uppercase;letter-spacing:.04em;color:var(--soft)}
td:last-child,th:last-child{text-align:right;white-space:nowrap}
.tag{display:inline-block;font-size:.75rem;font-weight:700;border:1px solid var(--hull);border-radius:3px;padding:0 4px}
.boundaries{list-style:none;padding:0;margin:0}
.boundary{border-bottom:1px solid var(--line);padding:8px 0}
.bhead{overflow-wrap:anywhere}
.figs{font-size:.95rem;font-variant-numeric:tabular-nums}
.checks{font-size:.85rem;margin-top:4px}
.checks th,.checks td{padding:3px 4px}
.checks tbody th{font-weight:600}
.checks td{white-space:nowrap}
.note{font-weight:400;font-size:.8rem;color:var(--soft)}
@media (max-width:560px){.checks td{white-space:normal}}
.over{color:var(--bad);font-weight:700}
.measure{font-weight:400;font-size:.95rem;margin-top:2px}
.ack{border:2px solid var(--hull);border-radius:8px;padding:2px 12px 10px;margin-top:1.3em}
.ack h2{border:0}
.ack label{display:block;font-weight:700}
.ack input{font:inherit;width:100%;max-width:24rem;min-height:44px;padding:6px 8px;border:2px solid var(--line);border-radius:6px}
.ack button{font:inherit;font-weight:700;min-height:44px;margin-top:8px;padding:6px 16px;border:0;border-radius:8px;background:var(--hull);color:#fff}
.done{border-left:6px solid var(--ok);background:var(--ok-soft);padding:6px 10px;border-radius:4px}
.err{color:var(--bad);font-weight:700}
.cautions{border:2px solid var(--care);background:var(--care-soft);padding:2px 12px 8px;border-radius:8px;margin-top:1.3em}
.cautions h2{border:0;margin-top:.5em}
.cautions ul{padding-left:1.2em;margin:0}
footer{margin-top:1.2em;font-size:.9rem;color:var(--soft)}
@media print{
  @page{size:A4;margin:14mm 14mm 16mm}
  body{background:#fff;font-size:10.5pt}
  main{max-width:none;padding:0}
  h1{font-size:17pt} h2{font-size:12pt;margin-top:10pt}
  .ack form{display:none}
  .verdict,.notice,.cautions{-webkit-print-color-adjust:exact;print-color-adjust:exact}
  .boundary,tr,.limits li,.cautions{break-inside:avoid}
  .checks{font-size:8.5pt;margin-top:2pt} .checks .note{font-size:7.5pt} .checks th,.checks td{padding:1px 3px}
  .boundary{padding:3pt 0} .figs{font-size:9.5pt} .checks thead{display:none}
  h2{break-after:avoid}
}
`;
