/**
 * The flooding forecast against closed-form results from outside the engine: Torricelli draining of
 * a prismatic tank, filling from the sea, pumping against a level-dependent inflow (t(h) derived
 * below), trapped air by Boyle's law, the large rectangular orifice, an open-to-sea space with oil
 * on top balanced by hand, oil leaving at oil density, soundings with pumps added back, and volume
 * conservation on a random 20-space ship.
 */
import { describe, expect, it } from 'vitest';
import { computeSurvey, forecastFlooding, soundingEvidence } from '@shared/engine';
import type { Compartment, Survey } from '@shared/schemas/survey';
import { baseSurvey, boxCompartment, contents, tid } from '../unit/engine/fixtures';
import { prng } from '../support/prng';

const G = 9.80665; // standard gravity, 3rd CGPM (1901)
const P_ATM = 101_325; // standard atmosphere, ISO 2533

/** A 10 m × 10 m box (plan area 100 m², permeability 1) from z0 to z0 + height at x 10..20, y −5..5. */
function box(z0: number, height: number, extra: Partial<Compartment> = {}): Compartment {
  return boxCompartment([10, -5, z0], [20, 5, z0 + height], { permeability: 1, ...extra });
}

function survey(draft: number, ...comps: Compartment[]): Survey {
  const s = baseSurvey({ aft: draft, fwd: draft });
  s.compartments.push(...comps);
  return s;
}

describe('flooding forecast against closed forms', () => {
  it('drains a prismatic tank through a bottom orifice as Torricelli: √h falls linearly, t = (A/(C_d a))·√(2h₀/g) (standard fluid-mechanics texts, e.g. White, Fluid Mechanics, unsteady tank draining; from memory)', () => {
    const a = 0.05, A = 100, h0 = 4, cd = 0.6;
    // tank bottom at z = 6, above the waterline (draft 5): free discharge into air
    const c = box(6, 5, { breaches: [{ id: tid(), position: { x: 15, y: 0, z: 6 }, areaM2: a, face: 'bottom' }] });
    const s = survey(5, c);
    s.conditions[0].contents.push(contents(c.id, [{ fluidId: 'fresh-water', z: 6 + h0 }]));
    const tDrain = (A / (cd * a)) * Math.sqrt((2 * h0) / G); // 1,505 s
    const f = forecastFlooding(s, { horizonH: (0.9 * tDrain) / 3600, outputSteps: 30, rtol: 1e-11, atol: 1e-9 });
    const k = (cd * a) / A * Math.sqrt(G / 2);
    f.times.forEach((t, i) => {
      const exact = (Math.sqrt(h0) - k * t) ** 2;
      expect(Math.abs(f.spaces[0].levelM[i] - exact) / exact).toBeLessThan(1e-6);
    });
    // the closed form's drain time and the √h line agree: √h reaches 0 at tDrain
    expect(Math.sqrt(h0) / k).toBeCloseTo(tDrain, 6);
  });

  it('fills an empty box from the sea through a bottom opening: h(t) = H − (√H − (C_d a/A)√(g/2)·t)² (derived by integrating dh/dt = (C_d a/A)√(2g(H − h)))', () => {
    const a = 0.02, A = 100, H = 6, cd = 0.6;
    const c = box(0, 10, { breaches: [{ id: tid(), position: { x: 15, y: 0, z: 0 }, areaM2: a, face: 'bottom' }] });
    const s = survey(H, c);
    const k = (cd * a) / A * Math.sqrt(G / 2);
    const tFull = (Math.sqrt(H) - Math.sqrt(0.05)) / k; // up to 5 cm below the sea
    const f = forecastFlooding(s, { horizonH: tFull / 3600, outputSteps: 25, rtol: 1e-11, atol: 1e-9 });
    f.times.forEach((t, i) => {
      const exact = H - (Math.sqrt(H) - k * t) ** 2;
      expect(Math.abs(f.spaces[0].levelM[i] - exact)).toBeLessThan(1e-6 * H);
    });
    expect(f.balance.relative).toBeLessThan(1e-9);
  });

  it('pumps down against an inflow that grows as the level falls: t(h) in closed form, and a plan step stopping at a level', () => {
    // dh/dt = (c √(H − h) − Q)/A with c = C_d a √(2g). With u = √(H − h), dh = −2u du:
    //   dt = −2A u du / (c u − Q) = −2A [1/c + (Q/c)/(c u − Q)] du
    //   t(h) = (2A/c)(u − u₀)·(−1)·(−1)… = (2A/c)(u₀ − u)·(−1) + … ; written out:
    //   t(h) = −(2A/c)(u − u₀) − (2AQ/c²)·ln((c u − Q)/(c u₀ − Q))
    const a = 0.01, A = 100, H = 6, cd = 0.6, Q = 0.12, h0 = 3;
    const c = cd * a * Math.sqrt(2 * G);
    const u0 = Math.sqrt(H - h0);
    const tOf = (h: number) => {
      const u = Math.sqrt(H - h);
      return (-(2 * A) / c) * (u - u0) - ((2 * A * Q) / (c * c)) * Math.log((c * u - Q) / (c * u0 - Q));
    };
    const pumpId = tid();
    const comp = box(0, 10, {
      breaches: [{ id: tid(), position: { x: 15, y: 0, z: 0 }, areaM2: a, face: 'bottom' }],
      pumps: [{ id: pumpId, name: 'P1', capacityM3S: Q }],
    });
    const s = survey(H, comp);
    s.conditions[0].contents.push(contents(comp.id, [{ fluidId: 'sea-water', z: h0, densityKgM3: 1025 }]));
    s.conditions[0].seaDensityKgM3 = 1025;
    const tEnd = tOf(1);
    const f = forecastFlooding(s, { horizonH: tEnd / 3600, outputSteps: 20, rtol: 1e-11, atol: 1e-9 });
    f.times.forEach((t, i) => {
      // the closed form inverted for h at this time (bisection, test side)
      let lo = 1 - 1e-3, hi = h0;
      for (let k = 0; k < 200; k++) {
        const mid = 0.5 * (lo + hi);
        if (tOf(mid) > t) lo = mid;
        else hi = mid;
      }
      expect(Math.abs(f.spaces[0].levelM[i] - 0.5 * (lo + hi))).toBeLessThan(1e-6 * h0);
    });
    // the same pump in a plan: "until 1.5 m" stops at t(1.5)
    s.conditions[0].flooding = { plan: [{ id: tid(), pumpId, compartmentId: comp.id, startH: 0, untilLevelM: 1.5 }] };
    const planned = forecastFlooding(s, { horizonH: tEnd / 3600, outputSteps: 4, rtol: 1e-11, atol: 1e-9 });
    expect(planned.plan[0].stoppedBy).toBe('level');
    expect(Math.abs(planned.plan[0].stopS - tOf(1.5)) / tOf(1.5)).toBeLessThan(1e-6);
    expect(planned.plan[0].atStop!.levelM).toBeCloseTo(1.5, 6);
  });

  it("compresses trapped air by Boyle's law: the closed box settles at the root of ρg h² − (P₀ + ρg(L + H)) h + ρg H L = 0", () => {
    // p_air = P₀ L/(L − h) (isothermal, from the standard atmosphere P₀ = 101,325 Pa); balance at the
    // bottom opening: (p_air − P₀) + ρ g h = ρ g H; multiplied out by (L − h) it is the quadratic above.
    const L = 10, H = 6, rho = 1025;
    const c = box(0, L, { airTight: true, breaches: [{ id: tid(), position: { x: 15, y: 0, z: 0 }, areaM2: 0.05, face: 'bottom' }] });
    const s = survey(H, c);
    s.conditions[0].seaDensityKgM3 = rho;
    const rg = rho * G;
    const B = P_ATM + rg * (L + H);
    const h = (B - Math.sqrt(B * B - 4 * rg * rg * H * L)) / (2 * rg); // ≈ 2.44 m
    const f = forecastFlooding(s, { horizonH: 24, outputSteps: 4, rtol: 1e-10, atol: 1e-9 });
    const last = f.spaces[0].levelM[f.times.length - 1];
    expect(Math.abs(last - h) / h).toBeLessThan(1e-6);
    expect(f.spaces[0].gasGaugePa[f.times.length - 1]).toBeCloseTo(P_ATM * L / (L - h) - P_ATM, 0);
    // vented instead, it fills to the sea
    const vented = forecastFlooding(s, { horizonH: 24, outputSteps: 4, variant: { kind: 'space-vented', compartmentId: c.id } });
    expect(vented.spaces[0].levelM[vented.times.length - 1]).toBeCloseTo(H, 2);
  });

  it('integrates a large rectangular opening over its height: Q = C_d w √(2g)·(2/3)(h₂^{3/2} − h₁^{3/2}) (large rectangular orifice, hydraulics texts; from memory)', () => {
    const w = 0.5, cd = 0.6;
    // side opening from z = 2 to 3 (heads 4 and 3 m below a 6 m waterline), and one straddling the waterline (5.5 to 6.5)
    const deep = box(0, 10, { breaches: [{ id: tid(), position: { x: 15, y: -5, z: 2.5 }, areaM2: w * 1, face: 'starboard', size: { kind: 'rectangular', widthM: w, heightM: 1 } }] });
    const straddle = box(0, 10, { breaches: [{ id: tid(), position: { x: 15, y: -5, z: 6 }, areaM2: w * 1, face: 'starboard', size: { kind: 'rectangular', widthM: w, heightM: 1 } }] });
    const r = computeSurvey(survey(6, deep, straddle));
    const expectDeep = cd * w * Math.sqrt(2 * G) * (2 / 3) * (4 ** 1.5 - 3 ** 1.5);
    // straddling the waterline, the top 10 mm of head follow the engine's stated linear law
    // (v = √(2g·0.01)·s/0.01 there): its integral is √(2g)·0.01^{3/2}/2 in place of √(2g)·(2/3)·0.01^{3/2}
    const hl = 0.01;
    const expectStraddle = cd * w * Math.sqrt(2 * G) * ((2 / 3) * (0.5 ** 1.5 - hl ** 1.5) + hl ** 1.5 / 2);
    expect(r.compartments[0].inflow!.orificeInflowM3S).toBeCloseTo(expectDeep, 10);
    expect(r.compartments[1].inflow!.orificeInflowM3S).toBeCloseTo(expectStraddle, 10);
  });

  it('an open-to-sea space with 1 m of diesel on top balances at its opening (worked by hand)', () => {
    // ρ_o g·1 + ρ_s g (w − 1) = ρ_s g (6 − 1) at the breach (z = 1): w = 6 − 840/1025 m
    const c = box(0, 10, { openToSea: true, breaches: [{ id: tid(), position: { x: 15, y: -5, z: 1 }, areaM2: 0.1 }] });
    const s = survey(6, c);
    s.conditions[0].seaDensityKgM3 = 1025;
    s.conditions[0].contents.push({
      compartmentId: c.id,
      layers: [
        { id: tid(), fluidId: 'sea-water', level: { kind: 'openToSea' } },
        { id: tid(), fluidId: 'diesel', level: { kind: 'point', point: { x: 15, y: 0, z: 7 } } }, // 1 m on the pinned waterline
      ],
      gas: { kind: 'vented' },
    });
    const r = computeSurvey(s);
    const w = 6 - 840 / 1025;
    expect(r.compartments[0].layers[0].levelElevationM).toBeCloseTo(w, 9);
    expect(r.compartments[0].layers[1].levelElevationM).toBeCloseTo(w + 1, 9);
    expect(Math.abs(r.compartments[0].inflow!.orificeInflowM3S)).toBeLessThan(1e-9);
    // a 20 kPa air cushion instead: the water stands 20,000/(ρ g) below the sea
    const s2 = survey(6, c);
    s2.conditions[0].seaDensityKgM3 = 1025;
    s2.conditions[0].contents.push({ compartmentId: c.id, layers: [{ id: tid(), fluidId: 'sea-water', level: { kind: 'openToSea' } }], gas: { kind: 'pressurised', gaugePressurePa: 20e3 } });
    expect(computeSurvey(s2).compartments[0].layers[0].levelElevationM).toBeCloseTo(6 - 20e3 / (1025 * G), 9);
    // and the forecast keeps it there
    const f = forecastFlooding(s, { horizonH: 6, outputSteps: 3 });
    expect(f.spaces[0].levelM[3]).toBeCloseTo(f.spaces[0].levelM[0], 6);
  });

  it('oil leaving through a breach in the oil layer flows at oil density (hand calculation)', () => {
    // water to z = 4, diesel (840) to z = 8, sea to z = 6, breach at z = 5: Δp = 840 g·3 − 1025 g·1 outwards
    const c = box(0, 10, { breaches: [{ id: tid(), position: { x: 15, y: -5, z: 5 }, areaM2: 0.01 }] });
    const s = survey(6, c);
    s.conditions[0].seaDensityKgM3 = 1025;
    s.conditions[0].contents.push(contents(c.id, [{ fluidId: 'sea-water', z: 4, densityKgM3: 1025 }, { fluidId: 'diesel', z: 8 }]));
    const q = computeSurvey(s).compartments[0].inflow!.orificeInflowM3S;
    const dp = (840 * 3 - 1025 * 1) * G;
    expect(q).toBeCloseTo(-0.6 * 0.01 * Math.sqrt((2 * dp) / 840), 12);
  });

  it('soundings add back only the pumps that ran, once (hand arithmetic)', () => {
    // 100 m³/h comes in; a 50 m³/h pump ran between the 2nd and 3rd readings only: net volumes 0, 100, 150, 250
    const pump = tid();
    const c = box(0, 10, {
      pumps: [{ id: pump, name: 'P', capacityM3S: 50 / 3600 }],
      soundingLog: {
        pipe: { x: 15, y: 0, bottomZM: 0 },
        readings: [
          { time: '2025-01-01T00:00:00Z', soundingM: 0 },
          { time: '2025-01-01T01:00:00Z', soundingM: 1 },
          { time: '2025-01-01T02:00:00Z', soundingM: 1.5, pumpIds: [pump] },
          { time: '2025-01-01T03:00:00Z', soundingM: 2.5 },
        ],
      },
    });
    const ev = soundingEvidence(c, (m) => 100 * m, 0)!;
    expect(ev.netRiseM3S * 3600).toBeCloseTo(80, 9); // least squares of 0, 100, 150, 250 over 0..3 h
    expect(ev.grossInflowM3S * 3600).toBeCloseTo(100, 9);
    expect(ev.r2).toBeCloseTo(1, 12);
    expect(ev.disagree).toBe(true); // inflow with no opening entered
    const out = soundingEvidence({ ...c, soundingLog: { ...c.soundingLog!, readings: [...c.soundingLog!.readings].reverse() } }, (m) => 100 * m, 100 / 3600)!;
    expect(out.outOfOrder).toBe(true);
    expect(out.grossInflowM3S * 3600).toBeCloseTo(100, 9);
    expect(out.disagree).toBe(false);
  });

  it('conserves volume to 1e-9 on a random 20-space ship with openings between spaces (seeded)', () => {
    const rnd = prng(16);
    const s = baseSurvey({ aft: 6.5, fwd: 5.5, heelDeg: 2 });
    const ids: string[] = [];
    for (let i = 0; i < 20; i++) {
      const x = 10 + (i % 10) * 8, y = i < 10 ? -8 : 0;
      const c = boxCompartment([x, y, 1], [x + 8, y + 8, 12], { permeability: 0.6 + 0.4 * rnd(), airTight: i === 7 });
      if (rnd() < 0.3) c.breaches = [{ id: tid(), position: { x: x + 4, y, z: 1 + 6 * rnd() }, areaM2: 0.01 + 0.05 * rnd(), face: 'starboard', size: { kind: 'rectangular', widthM: 0.3, heightM: 0.2 + rnd() } }];
      if (rnd() < 0.2) c.pumps = [{ id: tid(), name: `P${i}`, capacityM3S: 0.02 + 0.05 * rnd(), suctionHeightM: rnd() }];
      s.compartments.push(c);
      ids.push(c.id);
      if (rnd() < 0.7) {
        const layers = [{ fluidId: 'sea-water', z: 1 + 8 * rnd() }];
        if (rnd() < 0.3) layers.push({ fluidId: 'diesel', z: layers[0].z + 1.5 * rnd() });
        s.conditions[0].contents.push(contents(c.id, layers));
      }
    }
    s.compartments.forEach((c, i) => {
      const next = i % 10 < 9 ? i + 1 : -1, across = i < 10 ? i + 10 : -1;
      const to = [next, across].filter((j) => j >= 0 && rnd() < 0.6);
      c.openings = to.map((j) => ({
        id: tid(),
        toCompartmentId: ids[j],
        position: { x: s.compartments[j].geometry.kind === 'box' ? s.compartments[j].geometry.min.x : 0, y: 0, z: 1 + 8 * rnd() },
        areaM2: 0.005 + 0.05 * rnd(),
        face: 'fore' as const,
        size: rnd() < 0.5 ? { kind: 'round' as const, diameterM: 0.3 } : { kind: 'rectangular' as const, widthM: 0.2, heightM: 0.5 },
      }));
    });
    const f = forecastFlooding(s, { horizonH: 24 });
    expect(f.balance.relative).toBeLessThan(1e-9);
    expect(Math.abs(f.balance.inM3) + Math.abs(f.balance.outM3)).toBeGreaterThan(1); // something flowed
  });
});
