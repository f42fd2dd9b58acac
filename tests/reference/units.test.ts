/** Unit factors against mathjs's unit definitions (NIST SP 811 Appendix B exact values). */
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { fromSi, toSi, UNITS, type UnitId } from '@shared/units/units';

const rel = (a: number, b: number) => Math.abs(a / b - 1);

describe('US customary conversions vs mathjs', () => {
  const cases: [UnitId, string, number][] = [
    ['ft', 'ft', 1e-15],
    ['in', 'inch', 1e-15],
    ['lb', 'lbm', 1e-15],
    ['lbf', 'lbf', 1e-15],
    // mathjs stores psi rounded to 15 significant figures
    ['psi', 'psi', 1e-9],
    // mathjs rounds kip to 4448.2216 N
    ['kip', 'kip', 1e-8],
    ['ST', 'ton', 1e-15],
    ['LT', '2240 lbm', 1e-15],
    ['ft3', 'cuft', 1e-15],
    ['usgal', 'gallon', 1e-15],
    // the petroleum barrel is 42 US gallons (mathjs's "bbl" is a 31-gallon barrel)
    ['bbl', '42 gallon', 1e-15],
    ['ft2', 'sqft', 1e-15],
  ];
  for (const [id, mathjsUnit, tol] of cases) {
    it(`${id} = ${mathjsUnit}`, () => {
      const u = mathjsUnit.includes(' ') ? unit(mathjsUnit) : unit(1, mathjsUnit);
      const si = u.toSI().toNumber();
      expect(rel(UNITS[id].toSi, si)).toBeLessThan(tol);
    });
  }
  it('round trip', () => {
    expect(toSi(fromSi(12345.678, 'psi'), 'psi')).toBeCloseTo(12345.678, 9);
  });
  it('exact definitions (NIST SP 811)', () => {
    expect(UNITS.ft.toSi).toBe(0.3048);
    expect(UNITS.lb.toSi).toBe(0.45359237);
    expect(UNITS.lbf.toSi).toBeCloseTo(4.4482216152605, 13);
  });
});
