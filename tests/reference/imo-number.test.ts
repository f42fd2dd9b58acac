import { describe, expect, it } from 'vitest';
import { imoCheckDigitOk } from '@shared/schemas/marks';
import { demoSurvey } from '../../seeds/demo-survey';

describe('IMO ship identification number check digit', () => {
  it('accepts the usual worked example of the rule', () => {
    // IMO 9074729: 9×7 + 0×6 + 7×5 + 4×4 + 7×3 + 2×2 = 139, last digit 9 = the seventh digit
    // (the example given with the IMO numbering scheme, from memory)
    expect(imoCheckDigitOk('9074729')).toBe(true);
  });
  it('refuses the same number with any other last digit, and malformed numbers', () => {
    for (let d = 0; d <= 9; d++) if (d !== 9) expect(imoCheckDigitOk(`907472${d}`)).toBe(false);
    expect(imoCheckDigitOk('9074792')).toBe(false); // two digits swapped
    expect(imoCheckDigitOk('907472')).toBe(false);
    expect(imoCheckDigitOk('IMO9074729')).toBe(false);
  });
  it('the demo vessel carries a number that passes', () => {
    expect(imoCheckDigitOk(demoSurvey().vessel.imo ?? '')).toBe(true);
  });
});
