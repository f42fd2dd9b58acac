import { describe, expect, it } from 'vitest';
import { computeSurvey, type SurveyResults } from '@shared/engine';
import { compareResults } from '@shared/review/compare';
import { mismatchWords } from '@shared/review/mismatch-words';
import { demoSurvey } from '../../../seeds/demo-survey';

/** The demo results, and a copy with `edit` applied: the "device" of a desk that disagrees. */
function pair(edit: (r: SurveyResults) => void) {
  const server = computeSurvey(demoSurvey());
  const device = structuredClone(server);
  edit(device);
  const agreement = compareResults(server, device);
  return { server, device, words: agreement.mismatches.map((m) => mismatchWords(m, server, device, 'si')) };
}

describe('the desk says a differing number in words', () => {
  it('names the boundary and the quantity, with a unit, never the result path', () => {
    const { server, words } = pair((r) => {
      r.boundaries[1]!.net.forceN *= 1 + 1e-6;
    });
    expect(words).toHaveLength(1);
    const w = words[0]!;
    expect(w.where).toContain(server.boundaries[1]!.name);
    expect(w.what).toBe('net force (+ towards side B)');
    expect(`${w.where} ${w.what} ${w.a} ${w.b}`).not.toMatch(/\[|\]|forceN|boundaries|id=/);
    expect(w.a).toMatch(/ kN$/);
    // 1 part in 10⁶ apart: enough digits that the two figures do not read the same
    expect(w.a).not.toBe(w.b);
  });

  it('names stiffeners, layers, points and the ship as a whole', () => {
    const { words } = pair((r) => {
      const withStiffeners = r.boundaries.find((b) => b.stiffeners?.items.length)!;
      withStiffeners.stiffeners!.items[0]!.maxMomentNm *= 1.01;
      const hold = r.compartments.find((c) => c.layers.length > 0)!;
      hold.layers[0]!.massKg *= 1.01;
      r.boundaries[0]!.net.centreOfPressure!.z += 0.5;
      r.ship.floodWater.massKg *= 1.01;
      r.frame.heelDeg += 0.1;
    });
    const said = words.map((w) => `${w.where} | ${w.what} | ${w.a} | ${w.b}`);
    expect(said.some((s) => /stiffener 1 \| largest bending moment \| .* kN·m/.test(s))).toBe(true);
    expect(said.some((s) => /layer \| mass \| .* t \|/.test(s))).toBe(true);
    expect(said.some((s) => /\| net centre of pressure, height above base \| .* m \|/.test(s))).toBe(true);
    expect(said.some((s) => /^Whole ship \| flood water mass \| .* t \|/.test(s))).toBe(true);
    expect(said.some((s) => /^Ship attitude \| heel \| .*° \|/.test(s))).toBe(true);
    for (const s of said) expect(s).not.toMatch(/\[|\]|Kg|Nm\b|Deg|id=/);
  });

  it('says a missing figure as missing, in the reader’s units', () => {
    // 1 kip = 4.4482216152605 kN exactly (NIST SP 811, appendix B: pound-force = 4.448 221 615 260 5 N)
    const w = mismatchWords({ path: 'boundaries[id=x].net.forceN', a: 4448.2216152605, b: null, relative: null }, { boundaries: [{ id: 'x', name: 'Door', kind: 'door' }] }, {}, 'us');
    expect(w).toEqual({ where: 'Door', what: 'net force (+ towards side B)', a: '1.000 kip', b: 'missing' });
  });
});
