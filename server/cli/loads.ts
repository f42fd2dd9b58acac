/**
 * Command-line load calculator: reads a survey JSON file, validates it with the survey schema and
 * prints the engine's results.
 *
 *   tsx server/cli/loads.ts path/to/survey.json [--units si|us] [--table] [--condition <id>]
 *
 * JSON output keeps the engine's field names, with unit suffixes renamed when --units us converts
 * them (forceN → forceKip, areaM2 → areaFt2, ...), and `shipResponse` beside them (predicted drafts, trim, heel,
 * GM, TPC and MCT 1 cm, or TPI and MTI with --units us; null without particulars). Exit codes: 0 ok, 1 invalid input, 2 usage or file error.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { computeSurvey, shipResponseOf, type SurveyResults } from '@shared/engine';
import { STABILITY_CAUTION } from '@shared/api/cautions';
import type { Survey } from '@shared/schemas/survey';
import { formatIssueLines } from '@shared/api/format-issues';
import { UpgradingSurveySchema } from '@shared/schemas/survey';
import { pointWords, trimWords } from '@shared/units/point-words';
import { FOOT_M, formatNumber, formatQuantity, fromSi, type Dimension, type UnitId, type UnitSystem } from '@shared/units/units';

interface Args {
  file: string;
  units: UnitSystem;
  table: boolean;
  conditionId?: string;
}

export class CliError extends Error {
  constructor(message: string, readonly exitCode: number) {
    super(message);
  }
}

export function parseArgs(argv: readonly string[]): Args {
  let file: string | undefined;
  let units: UnitSystem = 'si';
  let table = false;
  let conditionId: string | undefined;
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i];
    if (a === '--table') table = true;
    else if (a === '--units') {
      const u = argv[++i];
      if (u !== 'si' && u !== 'us') throw new CliError(`--units must be "si" or "us", got ${u ?? 'nothing'}`, 2);
      units = u;
    } else if (a.startsWith('--units=')) {
      const u = a.slice(8);
      if (u !== 'si' && u !== 'us') throw new CliError(`--units must be "si" or "us", got ${u}`, 2);
      units = u;
    } else if (a === '--condition') conditionId = argv[++i];
    else if (a.startsWith('--')) throw new CliError(`unknown option ${a}`, 2);
    else if (file === undefined) file = a;
    else throw new CliError(`unexpected argument ${a}`, 2);
  }
  if (!file) throw new CliError('usage: loads <survey.json> [--units si|us] [--table] [--condition <id>]', 2);
  return { file, units, table, conditionId };
}

/** Reads, validates and computes; throws CliError with a readable message. */
export function runLoads(args: Args): SurveyResults {
  return computeSurvey(readSurvey(args), { conditionId: args.conditionId });
}

/** Reads and validates the survey file; throws CliError with a readable message. */
export function readSurvey(args: Args): Survey {
  let text: string;
  try {
    text = readFileSync(args.file, 'utf8');
  } catch (e) {
    const code = (e as { code?: string }).code;
    throw new CliError(`${args.file}: ${code === 'ENOENT' ? 'file not found' : `cannot read (${code ?? String(e)})`}`, 2);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (e) {
    throw new CliError(`${args.file}: not valid JSON (${(e as Error).message})`, 1);
  }
  // An older file is brought up to the current format first (shared/schemas/upgrade.ts).
  const parsed = UpgradingSurveySchema.safeParse(doc);
  if (!parsed.success) {
    throw new CliError(`${args.file}: invalid survey\n${formatIssueLines(parsed.error).map((l) => `  ${l}`).join('\n')}`, 1);
  }
  if (args.conditionId && !parsed.data.conditions.some((c) => c.id === args.conditionId)) {
    throw new CliError(`${args.file}: no condition with id ${args.conditionId}`, 1);
  }
  return parsed.data;
}

/**
 * The ship's response to the modelled contents in the chosen units, fields named by their unit
 * (TPC in t/cm or TPI in LT/in, MCT 1 cm in t·m/cm or MTI in ft·LT/in); null without particulars.
 */
export function responseOutput(survey: Survey, r: SurveyResults, units: UnitSystem): Record<string, unknown> | null {
  const resp = shipResponseOf(survey, r);
  if (!resp) return null;
  const a = resp.attitude;
  const len = (v: number) => (units === 'us' ? fromSi(v, 'ft') : v);
  const L = units === 'us' ? 'Ft' : 'M';
  const tpc = r.frame.seaDensityKgM3 * resp.waterplaneAreaM2;
  return {
    [`draftAft${L}`]: len(a.draftAftM),
    [`draftFore${L}`]: len(a.draftForeM),
    [`meanDraft${L}`]: len(a.meanDraftM),
    [`trim${L}`]: len(a.trimM),
    heelDeg: a.heelDeg,
    [`gmSolid${L}`]: len(resp.gmSolidM),
    [`gmFluid${L}`]: len(resp.gmFluidM),
    ...(units === 'us' ? { displacementLongTons: fromSi(resp.displacementKg, 'LT'), tpiLongTonsPerIn: fromSi(tpc, 'tpi'), mtiFtLongTonsPerIn: fromSi(resp.mctKgM, 'mt1in') } : { displacementT: resp.displacementKg / 1000, tpcTPerCm: fromSi(tpc, 'tpc'), mct1cmTMPerCm: fromSi(resp.mctKgM, 'mct1cm') }),
    ...(resp.ground && !resp.ground.afloat
      ? units === 'us'
        ? { groundReactionLongTons: fromSi(resp.ground.reactionKg, 'LT'), [`gmFluidAfloat${L}`]: len(resp.ground.free.gmFluidM) }
        : { groundReactionT: resp.ground.reactionKg / 1000, [`gmFluidAfloat${L}`]: len(resp.ground.free.gmFluidM) }
      : {}),
    warnings: resp.warnings.map((w) => w.message),
    caution: STABILITY_CAUTION,
  };
}

/** The ship's response as lines for the table output. */
function responseLines(survey: Survey, r: SurveyResults, units: UnitSystem): string[] {
  const resp = shipResponseOf(survey, r);
  if (!resp) return ["SHIP'S RESPONSE", '  Not computed: this condition has no hydrostatic particulars.'];
  const q = (v: number, d: Dimension) => formatQuantity(v, d, units, 4).text;
  const a = resp.attitude;
  return [
    "SHIP'S RESPONSE (predicted from the modelled contents)",
    `  drafts aft ${q(a.draftAftM, 'length')}, forward ${q(a.draftForeM, 'length')}, mean ${q(a.meanDraftM, 'length')}; trim ${trimWords(a.trimM, units)}; heel ${formatNumber(a.heelDeg, 3)}° (starboard down +)`,
    `  GM solid ${q(resp.gmSolidM, 'length')}, GM fluid ${q(resp.gmFluidM, 'length')}; displacement ${q(resp.displacementKg, 'mass')}`,
    `  ${units === 'us' ? 'TPI' : 'TPC'} ${q(r.frame.seaDensityKgM3 * resp.waterplaneAreaM2, 'immersion')}, ${units === 'us' ? 'MTI' : 'MCT 1 cm'} ${q(resp.mctKgM, 'trimMoment')}`,
    ...resp.warnings.map((w) => `  [${w.severity}] ${w.message}`),
    `  ${STABILITY_CAUTION}`,
  ];
}

// ---- unit conversion of the JSON output, by field-name suffix
const SUFFIXES: [string, Dimension, string][] = [
  ['KgM3', 'density', 'LbFt3'],
  ['M3S', 'flow', 'UsGpm'],
  ['M3', 'volume', 'Ft3'],
  ['M2', 'area', 'Ft2'],
  ['Nm', 'moment', 'KipFt'],
  ['Kg', 'mass', 'LongTons'],
  ['Pa', 'pressure', 'Psi'],
  ['N', 'force', 'Kip'],
  ['M', 'length', 'Ft'],
];
const POINT_KEYS = new Set(['centroid', 'centreOfPressure', 'centreOfPressurePlate', 'point', 'levelPoint', 'waterlinePoint', 'origin']);

/** Ratings carry their unit in `kind`: rated and actual are Pa or N. */
function convertRating(obj: Record<string, unknown>): Record<string, unknown> {
  const dim: Dimension = obj.kind === 'pressure' ? 'pressure' : 'force';
  const suffix = dim === 'pressure' ? 'Psi' : 'Kip';
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(obj)) {
    if ((k === 'rated' || k === 'actual') && typeof v === 'number') out[k + suffix] = fromSi(v, usUnit(dim));
    else out[k] = v;
  }
  return out;
}

/**
 * The results with every dimensioned field in US customary units, renamed by its new unit
 * (areaM2 → areaFt2); dimensionless fields (ratios, unit vectors, utilisations, degrees, seconds)
 * are left as they are.
 */
export function convertUs(value: unknown, key = ''): unknown {
  if (Array.isArray(value)) return value.map((v) => convertUs(v, key));
  if (value !== null && typeof value === 'object') {
    const obj = value as Record<string, unknown>;
    if ((key === 'capacity' || key === 'capacities') && 'rated' in obj) return convertRating(obj);
    if (POINT_KEYS.has(key) || key === 'forceVector') {
      const dim: Dimension = key === 'forceVector' ? 'force' : 'length';
      const out: Record<string, unknown> = {};
      for (const [k, v] of Object.entries(obj)) out[k] = typeof v === 'number' ? fromSi(v, usUnit(dim)) : v;
      return out;
    }
    const out: Record<string, unknown> = {};
    for (const [k, v] of Object.entries(obj)) {
      const match = typeof v === 'number' ? SUFFIXES.find(([s]) => k.endsWith(s) && k.length > s.length) : undefined;
      if (k.endsWith('MS2') && typeof v === 'number') out[`${k.slice(0, -3)}FtS2`] = v / FOOT_M;
      else if (k.endsWith('ModulusM3') && typeof v === 'number') out[`${k.slice(0, -2)}In3`] = fromSi(v, 'in3');
      else if (match && typeof v === 'number') out[k.slice(0, -match[0].length) + match[2]] = fromSi(v, usUnit(match[1]));
      else out[k] = convertUs(v, k);
    }
    return out;
  }
  return value;
}

function usUnit(d: Dimension): UnitId {
  const map: Partial<Record<Dimension, UnitId>> = { length: 'ft', area: 'ft2', volume: 'ft3', mass: 'LT', force: 'kip', pressure: 'psi', density: 'lbft3', flow: 'usgpm', moment: 'kipft' };
  return map[d] ?? 'm';
}

// ---- table output
function pad(s: string, n: number): string {
  return s.length >= n ? s : s + ' '.repeat(n - s.length);
}
function table(headers: string[], rows: string[][]): string {
  const widths = headers.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i].length)));
  const line = (cells: string[]) => cells.map((c, i) => pad(c, widths[i])).join('  ').trimEnd();
  return [line(headers), widths.map((w) => '-'.repeat(w)).join('  '), ...rows.map(line)].join('\n');
}

type Q = (v: number, d: Dimension) => string;
const percent = (u: number) => `${(100 * u).toFixed(0)} %${u > 1 ? ' OVER' : ''}`;

function boundaryTable(r: SurveyResults, q: Q): string {
  return table(
    ['name', 'kind', 'area', 'net force (+ towards B)', 'peak net p', 'CoP height above lowest point', 'vertical (+ up)', 'horizontal', 'utilisation'],
    r.boundaries.map((b) => [
      b.name,
      b.kind,
      q(b.areaM2, 'area'),
      q(b.net.forceN, 'force'),
      q(b.net.peak.pressurePa, 'pressure'),
      b.net.nearlyCancels ? `couple ${q(b.net.coupleNm ?? 0, 'moment')}` : b.net.centreOfPressureAboveLowestM !== null ? q(b.net.centreOfPressureAboveLowestM, 'length') : '-',
      q(b.net.verticalN, 'force'),
      q(b.net.horizontalN, 'force'),
      b.maxUtilisation === null ? '-' : percent(b.maxUtilisation),
    ]),
  );
}

/** The shores as columns, or no lines when no boundary is shored. */
function shoreLines(r: SurveyResults, q: Q): string[] {
  const shored = r.boundaries.filter((b) => b.shores.length > 0);
  if (shored.length === 0) return [];
  const rows = shored.flatMap((b) =>
    b.shores.map((s, i) => [b.name, String(i + 1), s.bearsOn, q(s.axialLoadN, 'force'), q(s.designCapacityN, 'force'), s.designMethodLabel, q(s.eulerLoadN, 'force'), percent(s.utilisation)]),
  );
  return ['', 'SHORES (checked as columns)', table(['boundary', 'no.', 'bears on', 'axial load', 'design capacity', 'method', 'Euler (elastic) buckling load', 'utilisation'], rows)];
}

function compartmentTable(r: SurveyResults, q: Q): string {
  return table(
    ['name', 'permeability', 'liquid volume', 'liquid mass', 'layers (top z at centroid)', 'inflow', 'pump-out'],
    r.compartments.map((c) => [
      c.name,
      c.permeability.toFixed(2),
      q(c.liquid.volumeM3, 'volume'),
      q(c.liquid.massKg, 'mass'),
      c.layers.map((l) => `${l.fluidName} ${q(l.levelPoint.z, 'length')}`).join('; ') || '-',
      c.inflow ? q(c.inflow.inflowUsedM3S, 'flow') : '-',
      c.inflow ? (c.inflow.timeToPumpOutS === null ? (c.inflow.pumpCapacityM3S > 0 ? 'pumps behind' : '-') : q(c.inflow.timeToPumpOutS, 'time')) : '-',
    ]),
  );
}

function shipTotalLines(r: SurveyResults, units: UnitSystem, q: Q): string[] {
  const agg = (name: string, a: SurveyResults['ship']['floodWater']) =>
    `${pad(name, 12)} ${q(a.massKg, 'mass')}  ${q(a.volumeM3, 'volume')}  centroid ${pointWords(a.centroid, units)}`;
  return [
    'SHIP TOTALS',
    agg('flood water', r.ship.floodWater),
    agg('oil', r.ship.oil),
    ...(r.ship.tankContents.massKg > 0 ? [agg('tanks\' own', r.ship.tankContents)] : []),
    agg('all liquids', r.ship.allLiquids),
  ];
}

export function renderTable(r: SurveyResults, units: UnitSystem, survey?: Survey): string {
  const q: Q = (v, d) => formatQuantity(v, d, units, 4).text;
  const out: string[] = [];
  out.push(`Engine ${r.engineVersion}  condition ${r.conditionId} at ${r.conditionTime}`);
  out.push(`Heel ${formatNumber(r.frame.heelDeg, 3)}° (starboard down +), trim ${trimWords(r.frame.trimM, units)} (${formatNumber(r.frame.trimDeg, 3)}°), sea ${q(r.frame.seaDensityKgM3, 'density')}`);
  out.push('', 'BOUNDARIES', boundaryTable(r, q));
  out.push(...shoreLines(r, q));
  out.push('', 'COMPARTMENTS', compartmentTable(r, q));
  out.push('', ...shipTotalLines(r, units, q));
  if (survey) out.push('', ...responseLines(survey, r, units));
  if (r.warnings.length > 0) {
    out.push('', 'WARNINGS');
    for (const w of r.warnings) out.push(`  [${w.severity}] ${w.message}`);
  }
  out.push('');
  out.push('Estimates for planning only: structural decisions rest with a competent naval architect, the classification society and the authorities.');
  return out.join('\n');
}

export function main(argv: readonly string[] = process.argv.slice(2)): number {
  try {
    const args = parseArgs(argv);
    const survey = readSurvey(args);
    const results = computeSurvey(survey, { conditionId: args.conditionId });
    if (args.table) process.stdout.write(`${renderTable(results, args.units, survey)}\n`);
    else {
      // the ship's response rides beside the results, its fields already in the chosen units
      const out = { ...((args.units === 'us' ? convertUs(results) : results) as object), shipResponse: responseOutput(survey, results, args.units) };
      process.stdout.write(`${JSON.stringify(out, null, 2)}\n`);
    }
    return 0;
  } catch (e) {
    if (e instanceof CliError) {
      process.stderr.write(`loads: ${e.message}\n`);
      return e.exitCode;
    }
    throw e;
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) process.exitCode = main();
