/**
 * The flooding run's volume balance is said as a plain figure with its unit, never with an
 * exponent: on the device and the desk (ForecastView's sentence), the master's brief and the report.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, forecastFlooding } from '@shared/engine';
import { formatVolumeBalance } from '@shared/units/units';
import { volumeBalanceSentence } from '@shared/review/forecast-words';
import { renderBriefPage } from '../../../server/brief/render-brief';
import { renderReport } from '../../../server/report/render-report';
import { demoSurvey } from '../../../seeds/demo-survey';

describe('volume balance in words', () => {
  it('rounds to the litre in m³ and to 0.01 ft³, and says round-off as "< 0.001 m³"', () => {
    expect(formatVolumeBalance(1.2e-13, 'si')).toBe('< 0.001 m³');
    expect(formatVolumeBalance(-3e-16, 'si')).toBe('< 0.001 m³');
    expect(formatVolumeBalance(0, 'si')).toBe('< 0.001 m³');
    expect(formatVolumeBalance(0.0123, 'si')).toBe('0.012 m³');
    expect(formatVolumeBalance(-0.0456, 'si')).toBe('-0.046 m³');
    expect(formatVolumeBalance(1234.5, 'si')).toBe('1,234.500 m³');
    // 1 ft = 0.3048 m exactly (international yard and pound agreement, 1959): 1 m³ = 35.3147 ft³
    expect(formatVolumeBalance(1, 'us')).toBe('35.31 ft³');
    expect(formatVolumeBalance(1e-9, 'us')).toBe('< 0.01 ft³');
  });

  const s = demoSurvey();
  const f = forecastFlooding(s);
  const exponent = /\d(\.\d+)?e[-+]?\d/i;

  it('the forecast says its balance without an exponent', () => {
    const words = volumeBalanceSentence(f, 'si');
    // the demo's run keeps its balance to round-off (tests/reference/flooding.test.ts holds it to 1e-9 relative)
    expect(Math.abs(f.balance.balanceM3)).toBeLessThan(5e-4);
    expect(words).toBe('Volume balance over the run (in − out − stored): < 0.001 m³.');
    expect(volumeBalanceSentence(f, 'us')).toBe('Volume balance over the run (in − out − stored): < 0.01 ft³.');
  });

  it('the brief and the report print it, in the reader’s units, with no exponent', () => {
    const results = computeSurvey(s);
    const common = { doc: s, results, status: 'accepted' as const, revision: 3, verdicts: [], limits: [], organisationName: 'Demo', reviewedBy: null, reviewedAt: null };
    for (const units of ['si', 'us'] as const) {
      // HTML escapes the "<"
      const unit = units === 'si' ? '&lt; 0.001 m³' : '&lt; 0.01 ft³';
      const brief = renderBriefPage({ ...common, units, issuedRevision: 3, expiresAt: '2030-01-01T00:00:00Z' });
      expect(brief).toContain(`Volume balance over the run (in − out − stored): ${unit}.`);
      const report = renderReport({ ...common, units, surveyorName: null, generatedAt: new Date('2025-03-14T12:00:00Z') });
      expect(report).toContain('<h2>Flooding forecast</h2>');
      expect(report).toContain(`Volume balance over the run (in − out − stored): ${unit}.`);
      const balanceLine = (html: string) => html.split('\n').find((l) => l.includes('Volume balance'))!;
      expect(balanceLine(brief)).not.toMatch(exponent);
      expect(balanceLine(report)).not.toMatch(exponent);
    }
  }, 120_000);
});
