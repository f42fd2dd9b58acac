/** Unit factors against mathjs's unit definitions (NIST SP 811 Appendix B exact values). */
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { formatOpeningArea, fromSi, toSi, UNITS, type UnitId } from '@shared/units/units';
import { openingWords } from '@shared/review/plain-words';

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

describe('the area of a hole, as a surveyor measures it', () => {
  it('cm² and in² agree with mathjs', () => {
    expect(rel(UNITS.cm2.toSi, unit(1, 'cm2').toSI().toNumber())).toBeLessThan(1e-15);
    expect(rel(UNITS.in2.toSi, unit(1, 'sqin').toSI().toNumber())).toBeLessThan(1e-15);
  });

  it('says a small hole in whole cm² (in²) and a larger one in m² (ft²) to two decimals', () => {
    // a 40 cm² hole: 0.004 m² (the demo's cracked-plate breach), never "0.004000 m²"
    expect(formatOpeningArea(0.004, 'si')).toBe('40 cm²');
    expect(formatOpeningArea(0.35, 'si')).toBe('0.35 m²');
    // 1 in² = 6.4516 cm² exactly (NIST SP 811, 1 in = 2.54 cm): a 2 in × 3 in hole is 6 in²
    expect(formatOpeningArea(6 * 0.00064516, 'us')).toBe('6.0 in²');
    expect(formatOpeningArea(30 * 0.00064516, 'us')).toBe('30 in²');
    // 0.35 m² = 3.767 ft² (1 ft² = 0.09290304 m², NIST SP 811)
    expect(formatOpeningArea(0.35, 'us')).toBe('3.77 ft²');
    // a pin-hole never reads as 0
    expect(formatOpeningArea(0.00005, 'si')).toBe('0.50 cm²');
  });

  it('gives the sides the surveyor measured with the area', () => {
    expect(openingWords({ areaM2: 0.04, size: { kind: 'rectangular', widthM: 0.2, heightM: 0.2 } }, 'si')).toBe('0.20 m × 0.20 m, 400 cm²');
    // π/4 × 0.25² = 0.049087 m² (area of a circle): 491 cm²
    expect(openingWords({ areaM2: (Math.PI / 4) * 0.25 ** 2, size: { kind: 'round', diameterM: 0.25 } }, 'si')).toBe('0.25 m across, 491 cm²');
  });
});
