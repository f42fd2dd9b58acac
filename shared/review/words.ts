/**
 * Operating limits and verdicts said in plain words, in the reader's units. The review desk, the
 * surveyor's notes and the master's brief all use these, so everyone reads the same sentence.
 */
import { formatQuantity, type UnitSystem } from '../units/units';
import {
  BOUNDARY_VERDICT_LABELS,
  BOUNDARY_VERDICT_MEANINGS,
  BOUNDARY_VERDICTS,
  SURVEY_VERDICT_LABELS,
  SURVEY_VERDICTS,
  type BoundaryVerdictValue,
  type LimitRule,
  type SurveyVerdictValue,
} from '../api/review';

export interface NameLookup {
  compartment: (id: string) => string;
  boundary: (id: string) => string;
}

/** A limit as one sentence (without its free text, which callers add after it). */
export function describeLimitRule(rule: LimitRule, names: NameLookup, system: UnitSystem): string {
  const level = (m: number) => formatQuantity(m, 'length', system, 3).text;
  switch (rule.kind) {
    case 'keep_level_above':
      return `Keep the liquid level in ${names.compartment(rule.compartmentId)} above ${level(rule.levelM)} over the baseline.`;
    case 'keep_level_below':
      return `Keep the liquid level in ${names.compartment(rule.compartmentId)} below ${level(rule.levelM)} over the baseline.`;
    case 'no_pumping_until_shored':
      return `Do not pump out ${names.compartment(rule.compartmentId)} until ${names.boundary(rule.boundaryId)} is shored.`;
    case 'max_net_pressure':
      return `Do not let the net pressure on ${names.boundary(rule.boundaryId)} rise above ${formatQuantity(rule.pressurePa, 'pressure', system, 3).text}.`;
    case 'text':
      return '';
  }
}

/** The limit's sentence followed by the engineer's own words, if any. */
export function describeLimit(limit: { rule: LimitRule; text: string | null }, names: NameLookup, system: UnitSystem): string {
  const sentence = describeLimitRule(limit.rule, names, system);
  const extra = limit.text?.trim() ?? '';
  return [sentence, extra].filter(Boolean).join(' ');
}

const isBoundaryVerdict = (v: string): v is BoundaryVerdictValue => (BOUNDARY_VERDICTS as readonly string[]).includes(v);
const isSurveyVerdict = (v: string): v is SurveyVerdictValue => (SURVEY_VERDICTS as readonly string[]).includes(v);

export function boundaryVerdictLabel(v: string): string {
  return isBoundaryVerdict(v) ? BOUNDARY_VERDICT_LABELS[v] : v;
}
export function boundaryVerdictMeaning(v: string): string {
  return isBoundaryVerdict(v) ? BOUNDARY_VERDICT_MEANINGS[v] : '';
}
export function surveyVerdictLabel(v: string): string {
  return isSurveyVerdict(v) ? SURVEY_VERDICT_LABELS[v] : v;
}

/** Severity of a verdict for colour and ordering: 0 fine … 3 worst. */
export function verdictSeverity(v: string): number {
  switch (v) {
    case 'sound':
    case 'proceed':
      return 0;
    case 'sound_if_shored':
    case 'proceed_within_limits':
      return 1;
    case 'load_no_further':
      return 2;
    default:
      return 3;
  }
}

/** Names from a survey document, with a plain fallback for an item that has since been deleted. */
export function namesFromSurvey(doc: { compartments: { id: string; name: string }[]; boundaries: { id: string; name: string }[] }): NameLookup {
  const c = new Map(doc.compartments.map((x) => [x.id, x.name]));
  const b = new Map(doc.boundaries.map((x) => [x.id, x.name]));
  return {
    compartment: (id) => c.get(id) ?? 'a space no longer in the survey',
    boundary: (id) => b.get(id) ?? 'a boundary no longer in the survey',
  };
}
