/**
 * The demo bulkhead's shores, stiffeners and plate edges carry its load between them, each part
 * once (equilibrium: a fact of statics), and the CLI's US units agree with mathjs's unit library.
 */
import { unit } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { computeSurvey } from '@shared/engine';
import { SurveySchema } from '@shared/schemas/survey';
import { convertUs, parseArgs, renderTable, runLoads } from '../../server/cli/loads';
import { demoSurvey } from '../../seeds/demo-survey';

const results = computeSurvey(SurveySchema.parse(demoSurvey()));
const bulkhead = results.boundaries.find((b) => b.name === 'No. 2/3 hold bulkhead')!;

describe('demo: No. 2/3 hold bulkhead, shored on its stiffeners', () => {
  it('stiffener end reactions + shore loads + what the plate edges take = the net force on the plate (equilibrium)', () => {
    const st = bulkhead.stiffeners!;
    const ends = st.items.reduce((a, s) => a + s.reactionStartN + s.reactionEndN, 0);
    const shores = bulkhead.shores.reduce((a, s) => a + s.tributaryForceN, 0);
    // stiffener strips take the pressure at the stiffener's line across their width; where a liquid
    // surface crosses a strip obliquely (4° heel) that differs from the exact strip integral by a
    // few parts in a million of the plate load
    expect(Math.abs(ends + shores + st.edgeLoadN! - bulkhead.net.forceN) / bulkhead.net.forceN).toBeLessThan(1e-4);
    // and every stiffener is in equilibrium on its own: load = end reactions + shore forces
    for (const s of st.items) expect(s.reactionStartN + s.reactionEndN + s.shoreForcesN).toBeCloseTo(s.totalLoadN, 3);
    // each shore stands on a stiffener and takes load from it, not from a tributary area of its own
    expect(bulkhead.shores.every((s) => s.bearsOn === 'stiffener' && s.tributaryAreaM2 === null)).toBe(true);
  });
  it('the timber shores are checked by the NDS column stability factor, with Euler only as a secondary figure', () => {
    for (const s of bulkhead.shores) {
      expect(s.designMethod).toBe('nds-3.7.1');
      expect(s.designCapacityN).toBeLessThan(s.eulerLoadN);
      expect(s.utilisation).toBeCloseTo(s.axialLoadN / s.designCapacityN, 12);
    }
    // 250 mm square, 6.0 m pinned: le/d = 24, FcE = 0.822 × 3.6 GPa / 24² = 5.1375 MPa; Fc* = 6.3 MPa;
    // r = 0.81548; (1 + r)/1.6 = 1.13467; Cp = 1.13467 − √(1.13467² − 0.81548/0.8) = 0.6169;
    // P = 0.6169 × 6.3 MPa × 0.0625 m² = 242.9 kN (NDS-2018 Eq. 3.7-1, worked by hand)
    expect(bulkhead.shores[0].designCapacityN / 1000).toBeCloseTo(242.9, 0);
  });
  it('the plating between stiffeners is checked (Roark case 8a, fixed edges): 0.4974+ × p b² / t²', () => {
    const pl = bulkhead.plating!;
    expect(pl.netThicknessM).toBeCloseTo(0.011, 12);
    const worst = pl.panels[pl.governingIndex!];
    // a 0.75 m wide panel of 9.8 m is a long plate: β → 0.5 (clamped strip, beam theory q b²/12 at the edge)
    expect(worst.stressPa).toBeCloseTo((0.5 * Math.abs(worst.pressureMaxPa) * 0.75 ** 2) / 0.011 ** 2, -3);
  });
});

describe('loads CLI', () => {
  const us = convertUs(results) as Record<string, unknown>;
  it('--units us leaves no SI-suffixed number behind', () => {
    const leftovers: string[] = [];
    const walk = (v: unknown, path: string) => {
      if (Array.isArray(v)) v.forEach((x, i) => walk(x, `${path}[${i}]`));
      else if (v && typeof v === 'object') for (const [k, x] of Object.entries(v)) {
        if (typeof x === 'number' && /(M|M2|M3|Pa|N|Nm|Kg|KgM3|M3S|MS2)$/.test(k) && !/Deg$/.test(k)) leftovers.push(`${path}.${k}`);
        walk(x, `${path}.${k}`);
      }
    };
    walk(us, '');
    expect(leftovers).toEqual([]);
  });
  it('converts with the same factors as mathjs (NIST SP 811)', () => {
    const b = (us.boundaries as Record<string, unknown>[]).find((x) => x.name === 'No. 2/3 hold bulkhead')!;
    expect(b.areaFt2 as number).toBeCloseTo(unit(bulkhead.areaM2, 'm^2').toNumber('ft^2'), 9);
    const cap = b.capacity as Record<string, number>;
    expect(cap.ratedPsi).toBeCloseTo(unit(bulkhead.capacity!.rated, 'Pa').toNumber('psi'), 6);
    const cop = (b.net as Record<string, Record<string, number>>).centreOfPressure;
    expect(cop.x).toBeCloseTo(unit(bulkhead.net.centreOfPressure!.x, 'm').toNumber('ft'), 9);
  });
  it('the table gives trim by the head and by the stern the right way round, and names every unit', () => {
    const table = renderTable(runLoads(parseArgs(['seeds/demo-survey.json'])), 'us');
    // 1.20 m = 3.94 ft (NIST SP 811: 1 ft = 0.3048 m)
    expect(table).toContain('3.94 ft by the stern');
    const s = demoSurvey();
    s.conditions[0].drafts = { ...s.conditions[0].drafts, forwardM: s.conditions[0].drafts.aftM! + 1.2 };
    const head = renderTable(computeSurvey(SurveySchema.parse(s)), 'si');
    expect(head).toContain('1.20 m by the head');
  });
});
