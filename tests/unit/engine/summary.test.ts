/**
 * The lean per-edit path (computeSurveySummary, computeBoundaryDetail) against the full results:
 * every summary number must be the full result's number, bit for bit, and the detail must be the
 * full boundary with its load diagram. The full path's own figures are checked against outside
 * sources in tests/reference; this file only proves the lean path adds no arithmetic of its own.
 */
import { describe, expect, it } from 'vitest';
import {
  boundaryRow,
  boundaryRows,
  computeBoundaryDetail,
  computeSurvey,
  computeSurveySummary,
  summariseBoundary,
  tableOfRows,
} from '@shared/engine';
import { SurveySchema, type Survey } from '@shared/schemas/survey';
import { demoSurvey } from '../../../seeds/demo-survey';
import { generateVessel } from '../../../scripts/bench-engine';

function expectSame(s: Survey) {
  const full = computeSurvey(s);
  const lean = computeSurveySummary(s);
  const byId = new Map(s.boundaries.map((b) => [b.id, b]));
  expect(lean.boundaries.length).toBe(full.boundaries.length);
  expect(boundaryRows(lean.boundaries)).toEqual(full.boundaries.map((r) => summariseBoundary(r, byId.get(r.id)!)));
  const { boundaries: fb, ...fullLevel } = full;
  const { boundaries: lb, ...leanLevel } = lean;
  void fb;
  void lb;
  expect(leanLevel).toEqual(fullLevel);
  return { full, lean };
}

describe('computeSurveySummary', () => {
  it('equals the full results on the demo survey (survey level, and every boundary row)', () => {
    const { full } = expectSame(SurveySchema.parse(demoSurvey()));
    expect(full.boundaries.some((b) => b.shores.length > 0)).toBe(true);
  });
  it('equals the full results on the 4,000-boundary bench vessel', { timeout: 60_000 }, () => {
    expectSame(generateVessel());
  });
  it('keeps null where the full result has none, and round-trips through a table', () => {
    const s = SurveySchema.parse(demoSurvey());
    const lean = computeSurveySummary(s);
    const rows = boundaryRows(lean.boundaries);
    expect(boundaryRows(tableOfRows(rows))).toEqual(rows);
    expect(rows.some((r) => r.capacityUtilisation === null)).toBe(true);
    expect(boundaryRow(lean.boundaries, 0).id).toBe(s.boundaries[0].id);
  });
});

describe('computeBoundaryDetail', () => {
  it('is the full boundary with its load diagram', () => {
    const s = SurveySchema.parse(demoSurvey());
    const withDiagrams = computeSurvey(s, { includeLoadDiagrams: true });
    for (const b of withDiagrams.boundaries) {
      expect(computeBoundaryDetail(s, b.id)).toEqual(b);
    }
    expect(withDiagrams.boundaries.some((b) => b.loadDiagram.length > 0)).toBe(true);
    expect(computeSurvey(s).boundaries.every((b) => b.loadDiagram.length === 0)).toBe(true);
    expect(computeBoundaryDetail(s, 'no-such-id')).toBeNull();
  });
});
