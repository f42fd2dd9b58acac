/**
 * Reading a survey file: JSON, brought up to the current format version (an older file is upgraded,
 * shared/schemas/upgrade.ts), then the survey format's schema, with one "path: problem" line per error.
 */
import { UpgradingSurveySchema, type Survey } from '@shared/schemas/survey';
import { formatIssueLines } from '@shared/api/format-issues';

export type ParsedFile = { ok: true; survey: Survey } | { ok: false; errors: string[] };

export function parseSurveyFile(text: string): ParsedFile {
  let json: unknown;
  try {
    json = JSON.parse(text);
  } catch (err) {
    return { ok: false, errors: [`(file): not JSON — ${err instanceof Error ? err.message : 'unreadable'}`] };
  }
  const r = UpgradingSurveySchema.safeParse(json);
  return r.success ? { ok: true, survey: r.data } : { ok: false, errors: formatIssueLines(r.error) };
}

/**
 * The same survey under new ids (for an import that collides with a survey already here): every
 * id of the survey, its conditions, layers, compartments, boundaries, breaches, pumps, shores and
 * photos is replaced, and every reference follows.
 */
export function withFreshIds(survey: Survey): Survey {
  const map = new Map<string, string>();
  const fresh = (id: string) => {
    let n = map.get(id);
    if (!n) {
      n = crypto.randomUUID();
      map.set(id, n);
    }
    return n;
  };
  const uuid = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;
  // First pass: every id field; second: every string equal to a mapped id.
  const collect = (v: unknown): void => {
    if (Array.isArray(v)) v.forEach(collect);
    else if (v && typeof v === 'object') {
      for (const [k, x] of Object.entries(v)) {
        if (k === 'id' && typeof x === 'string' && uuid.test(x)) fresh(x);
        else collect(x);
      }
    }
  };
  collect(survey);
  const rewrite = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(rewrite);
    if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).map(([k, x]) => [k, rewrite(x)]));
    if (typeof v === 'string' && map.has(v)) return map.get(v);
    return v;
  };
  return rewrite(survey) as Survey;
}
