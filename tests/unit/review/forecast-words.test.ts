/** A forecast's flows and volume balance in words: unit converted, way said, no exponent noise. */
import { describe, expect, it } from 'vitest';
import { flowWords } from '@shared/review/forecast-words';

describe('flowWords', () => {
  it('says which way and converts: 0.0716 m³/s out is 1135 US gal/min (US gallon = 231 in³ = 3.785411784 L, NIST Handbook 44)', () => {
    expect(flowWords(-0.0716, 'us')).toBe('1135 US gal/min out');
    // 0.0716 m³/s × 3600 s/h = 257.8 m³/h (definition of the hour)
    expect(flowWords(0.0716, 'si')).toBe('258 m³/h in');
  });
  it('round-off of a still space is no flow, never an exponent', () => {
    expect(flowWords(3.24e-7 * 6.309e-5, 'us')).toBe('none');
    expect(flowWords(-2e-7, 'si')).toBe('none');
  });
});
