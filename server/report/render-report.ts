/**
 * The calculation report: the printable record of a whole survey that a practitioner signs and
 * files. Server-rendered like the master's brief (no script, one inline style sheet), print-styled
 * for A4 and US Letter (the page size is left to the printer: margins fit both).
 */
import type { Boundary, Compartment, LevelSource, Survey } from '@shared/schemas/survey';
import { withheldSentence, type BoundaryResult, type SurveyResults } from '@shared/engine';
import type { OperatingLimit, Verdict } from '@shared/api/review';
import { CAUTIONS } from '@shared/api/cautions';
import { catalogueFluid } from '@shared/fluids/catalogue';
import { defaultPermeability } from '@shared/schemas/space-types';
import { STATUS_LABELS, type SurveyStatus } from '@shared/review/status';
import { formatNumber, formatQuantity, formatStress, type Dimension, type UnitSystem } from '@shared/units/units';
import { boundaryVerdictLabel, boundaryVerdictMeaning, describeLimit, namesFromSurvey, surveyVerdictLabel } from '@shared/review/words';
import { figureNotes, figureNoteSentence } from '@shared/review/assumptions';
import { boundaryKindWords, END_CONDITION_WORDS, openingWords, SPACE_TYPE_WORDS } from '@shared/review/plain-words';
import { formatShipAndUtc, formatUtc } from '@shared/review/time-words';
import { structureCheckRows } from '@shared/review/structure-rows';
import { tankWords } from '@shared/review/tank-words';
import { pointWords } from '@shared/units/point-words';
import { html, type SafeHtml } from '../brief/html';
import { nearestLimitWords } from '../brief/render-brief';

export interface ReportData {
  doc: Survey;
  results: SurveyResults | null;
  status: SurveyStatus;
  revision: number;
  units: UnitSystem;
  verdicts: Verdict[];
  limits: OperatingLimit[];
  organisationName: string;
  surveyorName: string | null;
  reviewedBy: string | null;
  reviewedAt: string | null;
  generatedAt: Date;
}

/** The methods the engine uses and where each comes from (see the doc comments in shared/engine/). */
const METHODS: { what: string; source: string }[] = [
  { what: 'Hydrostatic pressure: p = p_gas + Σ ρ g h over the layers above the point, h measured along earth vertical', source: 'Pascal’s law of fluid statics; standard gravity 9.80665 m/s² (3rd CGPM, 1901)' },
  { what: 'Attitude: trim from the forward and aft drafts over the distance between the marks; heel from the inclinometer, or from the midship drafts over the breadth', source: 'Ship geometry (small-angle free of approximation: slopes of the waterline traces)' },
  { what: 'Level of a liquid: a plane level in the earth frame through the sounding pipe bottom plus the sounding (or the reference point less the ullage)', source: 'Definition of sounding and ullage' },
  { what: 'Load on a flat plate: the net pressure is linear between level planes, so the plate is cut at them and each piece integrated exactly (area, first and second moments of a polygon)', source: 'Closed-form polygon moments (Green’s theorem); centre of pressure as the centroid of the load volume' },
  { what: 'Liquid volumes and centroids: each space clipped by the level planes, times permeability and density', source: 'Divergence theorem over the clipped polyhedron' },
  { what: 'Default permeabilities by space type', source: 'SOLAS Chapter II-1, Regulation 7-3' },
  { what: "A tank's own liquid told apart from flood water: flood water takes only the room its own liquid leaves (none when full, 0.95 of the tank when empty)", source: 'SOLAS Chapter II-1, Regulation 7-3, spaces intended for liquids: 0 or 0.95' },
  { what: 'Stiffeners: each as a beam under its strip of the plate load, bending stress against the allowable', source: 'Beam theory; fixed-end and simply supported cases per AISC Steel Construction Manual, Table 3-23' },
  { what: 'Shores: as columns, steel by flexural buckling, timber by the column stability factor; the Euler load is shown as a secondary figure, never as the capacity', source: 'ANSI/AISC 360-16 Chapter E (E3); ANSI/AWC NDS-2018 §3.7.1' },
  { what: 'Shores and stiffeners together: a shore bearing on a stiffener is an intermediate support of that beam (indeterminate beam solved exactly); a shore between stiffeners passes its load to both', source: 'Force method of structural analysis (virtual work)' },
  { what: 'Plating between stiffeners: each panel in bending under its linear net pressure, σ = β q b² / t², net of corrosion allowance', source: 'Roark’s Formulas for Stress and Strain, 8th ed., Table 11.4 (cases 1a, 1d, 1e, 8a)' },
  { what: 'Ratings with a direction: a rating towards side A or side B is checked against the net load pushing that way only', source: 'Definition of the rating' },
  { what: 'Ullage by plumb tape: measured along earth vertical from the reference point (heel and trim corrected); along a pipe: along the ship’s upright', source: 'Ship geometry' },
  { what: 'Inflow through a breach: orifice flow Q = C_d A √(2 Δp / ρ)', source: 'Torricelli / orifice equation; C_d 0.6 for a sharp-edged opening' },
];

const STYLE = `
:root{--ink:#0d1217;--soft:#3a4652;--line:#b9c0c7;--bad:#b0004f;--care:#8a5a00}
*{box-sizing:border-box}
body{margin:0;color:var(--ink);background:#fff;font:11pt/1.4 system-ui,-apple-system,"Segoe UI",Roboto,sans-serif}
main{max-width:52rem;margin:0 auto;padding:16px}
h1{font-size:18pt;margin:0 0 4px}
h2{font-size:13pt;margin:18px 0 6px;border-bottom:2px solid var(--ink);padding-bottom:2px;break-after:avoid}
h3{font-size:11.5pt;margin:12px 0 4px;break-after:avoid}
p{margin:4px 0}
table{width:100%;border-collapse:collapse;font-variant-numeric:tabular-nums;font-size:9.5pt;margin:4px 0}
th,td{text-align:left;vertical-align:top;padding:3px 4px;border-bottom:1px solid var(--line)}
thead th{font-size:8.5pt;text-transform:uppercase;color:var(--soft)}
.num{text-align:right;white-space:nowrap}
.muted{color:var(--soft)}
.over{color:var(--bad);font-weight:700}
.mark{font-size:8pt;font-weight:700;text-transform:uppercase;border:1px solid var(--care);color:var(--care);padding:0 3px;border-radius:3px}
.boundary{border:1px solid var(--line);border-radius:4px;padding:6px 8px;margin:8px 0;break-inside:avoid}
.grid{display:grid;grid-template-columns:1fr 1fr;gap:0 16px}
.sign{display:grid;grid-template-columns:1fr 1fr;gap:24px;margin-top:12px;break-inside:avoid}
.sign div{border-top:1px solid var(--ink);padding-top:4px;margin-top:40px}
.cautions{border:2px solid var(--care);padding:4px 10px;border-radius:6px;break-inside:avoid}
.meta td{border:0;padding:1px 4px}
@media (max-width:600px){.grid,.sign{grid-template-columns:1fr}}
@media screen{.num{white-space:normal}td{overflow-wrap:anywhere}}
@media screen and (max-width:600px){.num{white-space:normal}th,td{padding:3px 2px}thead th{font-size:7.5pt;hyphens:auto;overflow-wrap:anywhere}
  /* a wide table on a phone: one block per row, each figure under its column's name (no digit broken off) */
  table.stack thead{position:absolute;width:1px;height:1px;overflow:hidden;clip:rect(0 0 0 0)}
  table.stack tr{display:block;border-bottom:2px solid var(--line);padding:4px 0}
  table.stack th,table.stack td{display:block;border:0;text-align:left;padding:2px 0;overflow-wrap:break-word}
  table.stack td[data-label]::before{content:attr(data-label) ": ";font-weight:700;color:var(--soft)}
}
@media print{
  @page{margin:15mm 14mm 16mm}
  main{max-width:none;padding:0}
  a{color:inherit;text-decoration:none}
  tr{break-inside:avoid}
}`;

function levelWords(level: LevelSource, q: (v: number, d: Dimension) => string): string {
  switch (level.kind) {
    case 'sounding':
    case 'interfaceSounding': {
      const what = level.kind === 'sounding' ? 'Sounding' : 'Interface sounding';
      const at = `pipe at x ${q(level.pipe.x, 'length')}, y ${q(level.pipe.y, 'length')}, bottom z ${q(level.pipe.bottomZM, 'length')}`;
      return level.soundingM === undefined ? `${what} not read (${at})` : `${what} ${q(level.soundingM, 'length')} (${at})`;
    }
    case 'ullage': {
      const at = `from x ${q(level.reference.x, 'length')}, y ${q(level.reference.y, 'length')}, z ${q(level.reference.z, 'length')}`;
      const tape = level.tape === 'plumb' ? 'plumb tape, heel corrected' : 'along the pipe';
      return level.ullageM === undefined ? `Ullage not read (${at})` : `Ullage ${q(level.ullageM, 'length')} ${at}, ${tape}`;
    }
    case 'openToSea':
      return 'Open to the sea: at the outside waterline';
    case 'point':
      return `Surface through x ${q(level.point.x, 'length')}, y ${q(level.point.y, 'length')}, z ${q(level.point.z, 'length')}`;
  }
}

/**
 * A compartment's extent with every coordinate in words, from where it is measured and which side:
 * "box from 108 m to 118 m fwd of AP, from 6.00 m to stbd to 6.00 m to port, 0 m to 11.0 m above base".
 */
export function extentWords(c: Compartment, q: (v: number, d: Dimension) => string): string {
  const g = c.geometry;
  const x = (v: number) => (v < 0 ? `${q(-v, 'length')} aft of AP` : `${q(v, 'length')} fwd of AP`);
  const y = (v: number) => (Math.abs(v) < 0.005 ? 'the centreline' : `${q(Math.abs(v), 'length')} to ${v > 0 ? 'port' : 'stbd'}`);
  const xs = (a: number, b: number) => (a < 0 === b < 0 ? `from ${q(Math.abs(a), 'length')} to ${x(b)}` : `from ${x(a)} to ${x(b)}`);
  if (g.kind === 'box') return `box ${xs(g.min.x, g.max.x)}, from ${y(g.min.y)} to ${y(g.max.y)}, ${q(g.min.z, 'length')} to ${q(g.max.z, 'length')} above base`;
  return `section of ${g.section.length} corners ${xs(g.xAftM, g.xForeM)}`;
}

const SHAPE_WORDS: Record<Boundary['geometry']['kind'], string> = { polygon: 'flat outline', rectangle: 'rectangle', circle: 'circle', faceted: 'curved, in flat facets' };

type Q = (v: number, dim: Dimension, digits?: number) => string;

/** What every part of the report needs: unit formatting, names, marks, the condition, verdicts and results by id. */
function reportContext(d: ReportData) {
  const q: Q = (v, dim, digits = 4) => formatQuantity(v, dim, d.units, digits).text;
  const doc = d.doc;
  const r = d.results;
  const names = namesFromSurvey(doc);
  const notes = figureNotes(doc);
  const markOn = (entityId: string, field: string) => notes.find((n) => n.entityId === entityId && n.field === field);
  const chip = (entityId: string, field: string) => {
    const n = markOn(entityId, field);
    return n ? html` <span class="mark">${n.mark}</span>` : '';
  };
  // A verdict given on an older revision of a survey not accepted or under review since: say so beside it.
  const reviewedNow = d.status === 'accepted' || d.status === 'in_review';
  const staleVerdict = (v: Verdict) =>
    !reviewedNow && v.revision < d.revision ? html` <strong class="over">Given on revision ${v.revision}; the figures above (revision ${d.revision}) are not reviewed.</strong>` : '';
  return {
    d,
    q,
    // stresses in the unit the forms take them in (MPa or ksi), not as a pressure in kPa
    stress: (pa: number) => formatStress(pa, d.units),
    doc,
    r,
    names,
    notes,
    chip,
    staleVerdict,
    condition: doc.conditions.find((c) => c.id === doc.activeConditionId) ?? doc.conditions[0]!,
    sideWords: (s: Boundary['sideA']) => (s.kind === 'sea' ? 'the sea' : s.kind === 'air' ? 'open air' : names.compartment(s.compartmentId)),
    verdictOf: new Map(d.verdicts.filter((v) => v.scope === 'boundary').map((v) => [v.boundaryId, v])),
    held: new Map((r?.withheld ?? []).map((w) => [w.entityId, w])),
  };
}
type ReportContext = ReturnType<typeof reportContext>;

/** What lets water in and out of a space: breaches, openings to other spaces, pumps (inputs of the flooding forecast). */
function floodingInputs({ d, doc, q }: ReportContext, c: Compartment): SafeHtml | string {
  const lines = [
    ...(c.breaches ?? []).map((b) => `Breach to the sea: ${openingWords(b, d.units)} at ${pointWords(b.position, d.units)}`),
    ...(c.openings ?? []).map((o) => `Opening to ${doc.compartments.find((x) => x.id === o.toCompartmentId)?.name ?? 'a space since removed'}: ${openingWords(o, d.units)} at ${pointWords(o.position, d.units)}`),
    ...(c.pumps ?? []).map((p) => `Pump ${p.name}: ${q(p.capacityM3S, 'flow')}${p.running === false ? ', stopped' : ''}`),
  ];
  return lines.length ? html`${lines.map((l) => html`<div class="muted">${l}</div>`)}` : '';
}

function spaceRow(ctx: ReportContext, c: Compartment): SafeHtml {
  const { d, doc, r, q, chip, condition, held } = ctx;
  const res = r?.compartments.find((x) => x.id === c.id);
  const k = condition.contents.find((x) => x.compartmentId === c.id);
  const layers = k?.layers ?? [];
  return html`<tr>
<th scope="row">${c.name}<div class="muted">${SPACE_TYPE_WORDS[c.spaceType]}${c.openToSea ? ', open to the sea' : ''}</div></th>
<td data-label="Extent">${extentWords(c, q)}${floodingInputs(ctx, c)}</td>
<td class="num" data-label="Permeability">${formatNumber(res?.permeability ?? c.permeability ?? defaultPermeability(c.spaceType, c.cargoState).value, 3)}${chip(c.id, 'permeability')}${c.permeability === undefined ? html`<div class="muted">${res?.permeabilitySource ?? defaultPermeability(c.spaceType, c.cargoState).source}</div>` : ''}</td>
<td data-label="Contents">${layers.length === 0 ? html`<span class="muted">${c.openToSea ? 'floods to the waterline' : 'dry'}</span>` : layers.map((l) => {
    const fluid = doc.fluids.find((f) => f.id === l.fluidId)?.name ?? catalogueFluid(l.fluidId)?.name ?? l.fluidId;
    return html`<div>${fluid}: ${levelWords(l.level, q)}${chip(l.id, 'level')}${l.densityKgM3 !== undefined ? html`, density ${q(l.densityKgM3, 'density')}` : chip(l.id, 'densityKgM3')}</div>`;
  })}</td>
<td class="num" data-label="Liquid">${res ? html`${q(res.liquid.volumeM3, 'volume')}<br>${q(res.liquid.massKg, 'mass')}${res.tank ? html`<div class="muted">${tankWords(res.tank, d.units)}</div>` : ''}` : held.has(c.id) ? html`<span class="muted">not shown</span>` : '—'}</td>
</tr>`;
}

/** A shore's section and design method in words. */
function shoreWords({ q, stress }: ReportContext, s: NonNullable<Boundary['shores']>[number]): { sec: string; design: string } {
  const sec = s.section.kind === 'rectangular' ? `${q(s.section.widthM, 'length')} × ${q(s.section.depthM, 'length')}` : s.section.kind === 'tube' ? `tube ${q(s.section.outerDiameterM, 'length')} × ${q(s.section.wallThicknessM, 'length')}` : `area ${q(s.section.areaM2, 'area')}`;
  const design = s.design?.method === 'aisc-360-e3' ? `AISC 360 §E3, Fy ${stress(s.design.yieldStressPa)}` : s.design?.method === 'nds-3.7.1' ? `NDS §3.7.1, Fc* ${stress(s.design.adjustedCompressionPa)}, E′min ${stress(s.design.adjustedEMinPa)}` : s.design?.method === 'generic' ? `crushing ${stress(s.design.failureStressPa)} ÷ ${formatNumber(s.design.designFactor, 3)}` : 'no design method (Euler ÷ 2)';
  return { sec, design };
}

/** The boundary's inputs as table rows: sides, shape, stiffeners, shores, plating, ratings. */
function boundaryInputs(ctx: ReportContext, b: Boundary): SafeHtml[] {
  const { d, q, stress, chip, names, sideWords } = ctx;
  const st = b.stiffening;
  const inputs: SafeHtml[] = [
    html`<tr><th scope="row">Between</th><td>side A: ${sideWords(b.sideA)}; side B: ${sideWords(b.sideB)}</td></tr>`,
    html`<tr><th scope="row">Shape</th><td>${SHAPE_WORDS[b.geometry.kind]}${b.parentBoundaryId ? html`, set in ${names.boundary(b.parentBoundaryId)}` : ''}</td></tr>`,
  ];
  if (st) {
    inputs.push(
      html`<tr><th scope="row">Stiffeners</th><td>${q(st.spacingM, 'length')} apart, ${st.endFixity === 'fixed' ? 'fixed ends' : 'simply supported'}, section modulus ${q(st.sectionModulusM3, 'sectionModulus')}${chip(b.id, 'stiffening.sectionModulusM3')}, allowable stress ${stress(st.allowableStressPa)}${chip(b.id, 'stiffening.allowableStressPa')}</td></tr>`,
    );
  }
  (b.shores ?? []).forEach((s, i) => {
    const { sec, design } = shoreWords(ctx, s);
    inputs.push(html`<tr><th scope="row">Shore ${i + 1}</th><td>${sec}, length ${q(s.lengthM, 'length')}, stands on side ${s.side}, ${END_CONDITION_WORDS[s.endCondition]}, head at ${pointWords(s.position, d.units)}; ${design}${chip(b.id, `shores.${s.id}.section`)}</td></tr>`);
  });
  if (b.plating) {
    const pl = b.plating;
    const t = (m: number) => (d.units === 'us' ? `${formatNumber(m / 0.0254, 3)} in` : `${formatNumber(m * 1000, 3)} mm`);
    inputs.push(html`<tr><th scope="row">Plating</th><td>${t(pl.thicknessM)} thick${chip(b.id, 'plating.thicknessM')}, corrosion allowance ${t(pl.corrosionAllowanceM ?? 0)}, yield ${stress(pl.yieldStressPa)}, allowable ${stress(pl.allowableStressPa)}${chip(b.id, 'plating.allowableStressPa')}, edges ${pl.edges === 'fixed' ? 'fixed' : 'simply supported'}</td></tr>`);
  }
  if (b.ratedCapacity) {
    inputs.push(html`<tr><th scope="row">Rated either way</th><td>${b.ratedCapacity.kind === 'pressure' ? q(b.ratedCapacity.pressurePa, 'pressure') : q(b.ratedCapacity.forceN, 'force')}${chip(b.id, 'ratedCapacity')}</td></tr>`);
  }
  const dc = b.directionalCapacity;
  if (dc) {
    const dim: Dimension = dc.kind === 'pressure' ? 'pressure' : 'force';
    inputs.push(
      html`<tr><th scope="row">Rated by direction</th><td>towards side B (${sideWords(b.sideB)}): ${dc.towardsB === undefined ? 'not rated' : q(dc.towardsB, dim)}; towards side A (${sideWords(b.sideA)}): ${dc.towardsA === undefined ? 'not rated' : q(dc.towardsA, dim)}</td></tr>`,
    );
  }
  return inputs;
}

function checksTable({ d, sideWords }: ReportContext, b: Boundary, res: BoundaryResult): SafeHtml | '' {
  const rows = structureCheckRows(res, d.units, { A: sideWords(b.sideA), B: sideWords(b.sideB) }, b);
  return rows.length
    ? html`<table><thead><tr><th scope="col">Check</th><th scope="col">Load</th><th scope="col">Allowed</th><th scope="col" class="num">Use</th></tr></thead><tbody>${rows.map(
        (c) => html`<tr><th scope="row">${c.check}${c.note ? html`<div class="muted">${c.note}</div>` : ''}</th><td>${c.load}</td><td>${c.capacity}</td><td class="num ${c.utilisation !== null && c.utilisation > 1 ? 'over' : ''}">${c.utilisation === null ? '—' : `${formatNumber(c.utilisation * 100, 3)} %`}</td></tr>`,
      )}</tbody></table>`
    : '';
}

/** The boundary's loads, or why it has none. */
function boundaryResults({ d, q, held }: ReportContext, b: Boundary, res: BoundaryResult | null): SafeHtml {
  const w = held.get(b.id);
  return res
    ? html`<table><tbody>
<tr><th scope="row">Net force</th><td class="num">${q(Math.abs(res.net.resultantN), 'force')}</td><td>${res.net.forceN >= 0 ? 'pushes towards side B' : 'pushes towards side A'}</td></tr>
<tr><th scope="row">Side A alone</th><td class="num">${q(res.sideA.forceN, 'force')}</td><td>peak ${q(res.sideA.peakPressurePa, 'pressure')}</td></tr>
<tr><th scope="row">Side B alone</th><td class="num">${q(res.sideB.forceN, 'force')}</td><td>peak ${q(res.sideB.peakPressurePa, 'pressure')}</td></tr>
<tr><th scope="row">Highest net pressure</th><td class="num">${q(Math.abs(res.net.peak.pressurePa), 'pressure')}</td><td>towards side ${res.net.peak.pressurePa >= 0 ? 'B' : 'A'}, at ${pointWords(res.net.peak.point, d.units)}</td></tr>
<tr><th scope="row">Centre of pressure</th><td colspan="2">${res.net.nearlyCancels ? `the sides nearly cancel: couple ${q(res.net.coupleNm ?? 0, 'moment')} about the centroid` : pointWords(res.net.centreOfPressure, d.units)}</td></tr>
<tr><th scope="row">Loaded area</th><td class="num">${q(res.areaM2, 'area')}</td><td></td></tr>
<tr><th scope="row">Utilisation</th><td class="num ${res.maxUtilisation !== null && res.maxUtilisation > 1 ? 'over' : ''}">${res.maxUtilisation === null ? 'nothing rated' : `${formatNumber(res.maxUtilisation * 100, 3)} %`}</td><td>${res.maxUtilisation !== null && res.maxUtilisation > 1 ? html`<span class="over">▲ OVER CAPACITY</span>` : ''}</td></tr>
</tbody></table>`
    : html`<p class="over">${w ? withheldSentence(w) : 'No result for this plate.'}</p>`;
}

function boundarySection(ctx: ReportContext, b: Boundary, res: BoundaryResult | null): SafeHtml {
  const v = ctx.verdictOf.get(b.id);
  return html`<section class="boundary" data-boundary="${b.name}">
<h3>${b.name} <span class="muted">(${boundaryKindWords(b.kind)})</span></h3>
<div class="grid"><div><p class="muted">Inputs</p><table><tbody>${boundaryInputs(ctx, b)}</tbody></table></div><div><p class="muted">Results</p>${boundaryResults(ctx, b, res)}</div></div>
${res ? checksTable(ctx, b, res) : ''}
<p>Reviewer: ${v ? html`<strong>${boundaryVerdictLabel(v.verdict)}</strong>: ${boundaryVerdictMeaning(v.verdict)}.${v.note ? html` ${v.note}` : ''}${ctx.staleVerdict(v)}` : html`<span class="muted">no verdict</span>`}</p>
</section>`;
}

/** The report's head: vessel, title, revision, status, engine version, units. */
function reportHeader({ d, doc, r }: ReportContext): SafeHtml {
  return html`
<header>
<p class="muted">Calculation report · ${d.organisationName}</p>
<h1>${doc.vessel.name}${doc.vessel.imo ? html` <span class="muted">IMO ${doc.vessel.imo}</span>` : ''}</h1>
<p>${doc.title}</p>
<table class="meta"><tbody>
<tr><td>Survey revision</td><td><strong>${d.revision}</strong></td><td>Review status</td><td><strong>${STATUS_LABELS[d.status]}</strong></td></tr>
<tr><td>Engine version</td><td><strong>${r?.engineVersion ?? '—'}</strong></td><td>Printed</td><td>${formatUtc(d.generatedAt)}</td></tr>
<tr><td>Figures in</td><td>${d.units === 'us' ? 'US customary units' : 'SI units'}</td><td>Signs</td><td>net force positive from side A towards side B</td></tr>
</tbody></table>
</header>`;
}

/** The readings' table: drafts, heel, sea density, and the heel and trim the engine used. */
function readingsTable({ q, r, chip, condition }: ReportContext): SafeHtml {
  const dr = condition.drafts;
  const draft = (v: number | undefined, field: string) => (v === undefined ? html`<span class="muted">not read</span>` : html`${q(v, 'length')}${chip(condition.id, field)}`);
  return html`<table><tbody>
<tr><th scope="row">Draft aft</th><td>${draft(dr.aftM, 'drafts.aftM')}</td><th scope="row">Draft forward</th><td>${draft(dr.forwardM, 'drafts.forwardM')}</td></tr>
<tr><th scope="row">Midship port</th><td>${draft(dr.midPortM, 'drafts.midPortM')}</td><th scope="row">Midship starboard</th><td>${draft(dr.midStarboardM, 'drafts.midStarboardM')}</td></tr>
<tr><th scope="row">Heel (inclinometer)</th><td>${condition.heelDeg === undefined ? html`<span class="muted">not read</span>` : html`${formatNumber(condition.heelDeg, 3)}° ${condition.heelDeg > 0 ? 'starboard' : condition.heelDeg < 0 ? 'port' : ''}${chip(condition.id, 'heelDeg')}`}</td>
<th scope="row">Sea water density</th><td>${q(condition.seaDensityKgM3 ?? 1025, 'density')}${chip(condition.id, 'seaDensityKgM3')}</td></tr>
${r && (r.frame.missingReadings ?? []).length === 0 ? html`<tr><th scope="row">Heel used</th><td>${formatNumber(Math.abs(r.frame.heelDeg), 3)}° ${r.frame.heelDeg > 0 ? 'starboard' : r.frame.heelDeg < 0 ? 'port' : ''} (from ${r.frame.heelSource})</td><th scope="row">Trim</th><td>${q(Math.abs(r.frame.trimM), 'length')} ${r.frame.trimM > 0 ? 'by the stern' : r.frame.trimM < 0 ? 'by the head' : ''}</td></tr>` : ''}
</tbody></table>`;
}

/** From the warnings to the signatures: warnings, assumed and estimated figures, verdicts, limits, cautions. */
function reportClosing({ d, r, notes, names, staleVerdict }: ReportContext): SafeHtml {
  const assumed = notes.filter((n) => n.mark === 'assumed');
  const estimated = notes.filter((n) => n.mark === 'estimated');
  const surveyVerdict = d.verdicts.find((v) => v.scope === 'survey');
  return html`<h2>Warnings</h2>
${r && r.warnings.length ? html`<ul>${r.warnings.map((w) => html`<li class="${w.severity === 'danger' ? 'over' : ''}">${w.message}</li>`)}</ul>` : html`<p class="muted">None.</p>`}
<h2>Assumptions and estimates</h2>
${assumed.length ? html`<p>Assumed (defaults not confirmed):</p><ul>${assumed.map((n) => html`<li>${figureNoteSentence(n)}</li>`)}</ul>` : html`<p class="muted">No assumed figures.</p>`}
${estimated.length ? html`<p>Estimated (judged, not measured):</p><ul>${estimated.map((n) => html`<li>${figureNoteSentence(n)}</li>`)}</ul>` : html`<p class="muted">No figures marked estimated.</p>`}
<h2>Reviewer’s verdicts and limits</h2>
<p>On the survey: ${surveyVerdict ? html`<strong>${surveyVerdictLabel(surveyVerdict.verdict)}</strong>${surveyVerdict.note ? html`: ${surveyVerdict.note}` : ''}${staleVerdict(surveyVerdict)}` : html`<span class="muted">no verdict yet</span>`}</p>
${d.limits.length ? html`<ol>${d.limits.map((l) => html`<li>${describeLimit(l, names, d.units)}</li>`)}</ol>` : html`<p class="muted">No operating limits set.</p>`}
<section class="cautions"><h2>Cautions</h2><ul>${CAUTIONS.map((c) => html`<li>${c}</li>`)}</ul></section>
<section class="sign" aria-label="Signatures">
<div>Prepared by: ${d.surveyorName ?? ''}<br>Signature and date</div>
<div>Checked by: ${d.reviewedBy ?? ''}${d.reviewedAt ? html`, ${formatUtc(d.reviewedAt)}` : ''}<br>Signature and date</div>
</section>`;
}

/** The forecast as the master's brief words it, with its volume balance (only beside computed results). */
function forecastSection({ d, doc, r }: ReportContext): SafeHtml | '' {
  const forecast = r ? nearestLimitWords(doc, d.units) : null;
  return forecast
    ? html`<h2>Flooding forecast</h2>
<p><strong>${forecast.sentence}</strong></p>
${forecast.downflooding.length ? html`<ul>${forecast.downflooding.map((t) => html`<li>${t}</li>`)}</ul>` : ''}
<p class="muted">${forecast.attitude}: ${forecast.assumptions}</p>
<p>${forecast.balance}</p>`
    : '';
}

export function renderReport(d: ReportData): string {
  const ctx = reportContext(d);
  const { doc, r, q, condition } = ctx;
  const resultOf = new Map((r?.boundaries ?? []).map((b) => [b.id, b]));
  const body = html`${reportHeader(ctx)}
<h2>Casualty</h2>
<p>${doc.casualtyDescription || '—'}</p>
<h2>Vessel</h2>
<p>Length between perpendiculars ${q(doc.vessel.lbpM, 'length')}, breadth ${q(doc.vessel.breadthM, 'length')}, depth ${q(doc.vessel.depthM, 'length')}; draught marks aft at x ${q(doc.vessel.draughtMarks.aftXM, 'length')}, forward at x ${q(doc.vessel.draughtMarks.forwardXM, 'length')}.</p>
<h2>Condition and readings</h2>
<p><strong>${condition.name ?? 'Readings'}</strong>, taken ${formatShipAndUtc(condition.time, doc.vessel.shipTimeOffsetMin)}.</p>
${readingsTable(ctx)}
<h2>Methods and sources</h2>
<ol>${METHODS.map((m) => html`<li>${m.what}. <span class="muted">Source: ${m.source}.</span></li>`)}</ol>
<h2>Spaces and contents</h2>
<table class="stack"><thead><tr><th scope="col">Space</th><th scope="col">Extent</th><th scope="col" class="num">Permeability</th><th scope="col">Contents (readings)</th><th scope="col" class="num">Liquid</th></tr></thead><tbody>${doc.compartments.map((c) => spaceRow(ctx, c))}</tbody></table>
${r ? html`<p>Flood water aboard ${q(r.ship.floodWater.massKg, 'mass')}, oil ${q(r.ship.oil.massKg, 'mass')}${r.ship.tankContents.massKg > 0 ? html`, tanks' own liquid (not flood water) ${q(r.ship.tankContents.massKg, 'mass')}` : ''}.</p>` : ''}
<h2>Boundaries (${doc.boundaries.length})</h2>
${doc.boundaries.map((b) => boundarySection(ctx, b, resultOf.get(b.id) ?? null))}
${forecastSection(ctx)}
${reportClosing(ctx)}`;

  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex, nofollow">
<title>${html`Calculation report: ${doc.vessel.name}, revision ${d.revision}`}</title>
<style>${STYLE}</style>
</head>
<body><main>${body}</main></body>
</html>`;
}
