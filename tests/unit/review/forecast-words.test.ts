/** A forecast's flows and volume balance in words: unit converted, way said, no exponent noise. */
import { describe, expect, it } from 'vitest';
import { durationWords, flowWords, limitGovernsWords, pumpsWords } from '@shared/review/forecast-words';

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

describe('durationWords', () => {
  it('says hours and minutes in words, never a bare 5:51 (1 h = 60 min = 3600 s, SI definition)', () => {
    expect(durationWords(5 * 3600 + 51 * 60)).toBe('5 h 51 min');
    expect(durationWords(40 * 60)).toBe('40 min');
    // 59.6 min rounds to the hour
    expect(durationWords(3576)).toBe('1 h 0 min');
  });
});

describe('pumpsWords', () => {
  // 1321 US gal/min × 3.785411784 L/gal (NIST Handbook 44) / 60 s = 0.08334 m³/s
  const capacityM3S = (1321 * 3.785411784e-3) / 60;
  it('says plainly what gaining means, with the flow in the user units and the time as h min', () => {
    expect(pumpsWords({ capacityM3S, verdict: 'dry', dryAtS: 5 * 3600 + 51 * 60 }, 'us')).toBe('Pumps (1321 US gal/min): the pumps gain on the inflow; pumped dry in 5 h 51 min.');
    // 0.08334 m³/s × 3600 s/h = 300 m³/h
    expect(pumpsWords({ capacityM3S, verdict: 'losing', dryAtS: null }, 'si')).toBe('Pumps (300 m³/h): the pumps do not keep up with the inflow: the level rises.');
  });
  it('never uses the bare word "gain" alone, whatever the verdict', () => {
    for (const verdict of ['dry', 'gaining', 'holding', 'losing'] as const) expect(pumpsWords({ capacityM3S, verdict, dryAtS: 600 }, 'us')).not.toMatch(/\): gain/);
  });
});

describe('limitGovernsWords', () => {
  const sides = { A: 'Hold 2', B: 'Engine room' };
  it('names the rating with its value, unit and direction: 17.5 kPa = 2.54 psi (1 psi = 6894.757 Pa, NIST SP 811)', () => {
    const rating = { kind: 'pressure' as const, direction: 'towards-B' as const, rated: 17_500 };
    expect(limitGovernsWords({ governs: 'rating', rating }, 'si', sides)).toBe('its rating, 17.5\u00a0kPa towards side B (Engine room)');
    expect(limitGovernsWords({ governs: 'rating', rating }, 'us', sides)).toBe('its rating, 2.54\u00a0psi towards side B (Engine room)');
  });
  it('other checks by name, none as a dash', () => {
    expect(limitGovernsWords({ governs: 'stiffeners', rating: null }, 'si', sides)).toBe('stiffeners');
    expect(limitGovernsWords({ governs: null, rating: null }, 'si', sides)).toBe('—');
  });
});
