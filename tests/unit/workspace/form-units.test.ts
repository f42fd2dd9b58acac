// What the user types, in their units, to SI and back. Conversion factors are checked against mathjs's unit
// definitions (an outside library) and NIST SP 811 (2008) Appendix B: 1 ft = 0.3048 m exactly,
// 1 psi = 6 894.757 Pa, 1 ksi = 6.894 757 MPa, 1 in³ = 16.387 064 cm³.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { unit } from 'mathjs';
import { byKey, measureLabel, parseField, showField, unitResolver } from '@client/features/workspace/utils/form-units';

const mathjs = (value: number, from: string, to: string) => unit(value, from).toNumber(to);

describe('parseField', () => {
  it('reads feet into metres: 10 ft = 3.048 m (NIST SP 811: 1 ft = 0.3048 m exactly)', () => {
    expect(parseField('10', 'length', 'us')).toBeCloseTo(3.048, 12);
    expect(parseField('10', 'length', 'us')).toBeCloseTo(mathjs(10, 'ft', 'm'), 12);
  });

  it('reads psi into pascals: 14.5 psi = 99 973.98 Pa (NIST SP 811: 1 psi = 6 894.757 293 168 Pa), as mathjs within 1e-9', () => {
    const pa = parseField('14.5', 'pressure', 'us')!;
    expect(pa).toBeCloseTo(14.5 * 6894.757293168, 6);
    // mathjs rounds its psi definition (to about 1e-10 relative), so compare relatively.
    expect(Math.abs(pa / mathjs(14.5, 'psi', 'Pa') - 1)).toBeLessThan(1e-9);
  });

  it('reads a stress in MPa (SI) and ksi (US): 235 MPa, 36 ksi = 248.2 MPa (NIST SP 811)', () => {
    expect(parseField('235', 'stress', 'si')).toBe(235e6);
    expect(parseField('36', 'stress', 'us')! / 1e6).toBeCloseTo(mathjs(36000, 'psi', 'Pa') / 1e6, 4);
    expect(parseField('36', 'stress', 'us')! / 1e6).toBeCloseTo(248.211, 3);
  });

  it('reads a section modulus in cm³ and in³ (1 in³ = 16.387064 cm³, NIST SP 811)', () => {
    expect(parseField('300', 'sectionModulus', 'si')).toBeCloseTo(300e-6, 15);
    expect(parseField('10', 'sectionModulus', 'us')).toBeCloseTo(mathjs(10, 'in^3', 'm^3'), 15);
  });

  it('takes a decimal comma, and a ratio as it is typed', () => {
    expect(parseField(' 2,5 ', 'length', 'si')).toBe(2.5);
    expect(parseField('0.85', 'ratio', 'us')).toBe(0.85);
  });

  it('gives undefined for an empty field (the schema says "required") and NaN for junk', () => {
    expect(parseField('', 'length', 'si')).toBeUndefined();
    expect(parseField('   ', 'length', 'si')).toBeUndefined();
    expect(parseField(undefined, 'length', 'si')).toBeUndefined();
    expect(parseField('12 m', 'length', 'si')).toBeNaN();
  });
});

describe('showField', () => {
  it('shows metres in feet without floating-point noise: 3.048 m is "10"', () => {
    expect(showField(3.048, 'length', 'us')).toBe('10');
    expect(showField(4.7, 'length', 'si')).toBe('4.7');
  });

  it('round-trips what was typed, in both systems', () => {
    for (const text of ['0.1', '12.35', '1234.5']) {
      expect(showField(parseField(text, 'length', 'us'), 'length', 'us')).toBe(text);
      expect(showField(parseField(text, 'pressure', 'si'), 'pressure', 'si')).toBe(text);
    }
  });

  it('leaves the field empty for nothing', () => {
    expect(showField(undefined, 'length', 'si')).toBe('');
    expect(showField(null, 'length', 'si')).toBe('');
    expect(showField(Number.NaN, 'length', 'si')).toBe('');
  });
});

describe('measureLabel', () => {
  it('names the stress unit the user works in, and no unit for a ratio', () => {
    expect(measureLabel('stress', 'si')).toBe('MPa');
    expect(measureLabel('stress', 'us')).toBe('ksi');
    expect(measureLabel('length', 'us')).toBe('ft');
    expect(measureLabel('ratio', 'si')).toBe('');
  });
});

describe('unitResolver', () => {
  type Form = { span: string; name: string };
  const schema = z.object({ spanM: z.number().min(0.1).max(30), name: z.string().min(1) });
  const toModel = (v: Form) => ({ spanM: parseField(v.span, 'length', 'us'), name: v.name });
  const resolve = (values: Form) =>
    unitResolver(schema, toModel, 'us', byKey({ spanM: 'length' }))(values, undefined, { shouldUseNativeValidation: false, fields: {} });

  it('passes SI values through to the schema: 10 ft arrive as 3.048 m', async () => {
    const r = await resolve({ span: '10', name: 'Frame web' });
    expect(r.errors).toEqual({});
    expect((r.values as { spanM: number }).spanM).toBeCloseTo(3.048, 12);
  });

  it('words a bound in the user’s unit: at least 0.1 m is "0.3281 ft" (0.1 / 0.3048, NIST SP 811)', async () => {
    const r = await resolve({ span: '0.2', name: 'x' });
    expect((r.errors as Record<string, { message: string }>).spanM.message).toBe('Must be at least 0.3281 ft.');
    expect(mathjs(0.1, 'm', 'ft')).toBeCloseTo(0.3281, 4);
  });

  it('says what is missing and what is not a number, in plain words', async () => {
    const empty = await resolve({ span: '', name: '' });
    expect((empty.errors as Record<string, { message: string }>).spanM.message).toBe('Required: enter a value.');
    expect((empty.errors as Record<string, { message: string }>).name.message).toBe('Required: enter some text.');
    const junk = await resolve({ span: 'ten', name: 'x' });
    expect((junk.errors as Record<string, { message: string }>).spanM.message).toBe('Enter a number, for example 12.5.');
  });
});
