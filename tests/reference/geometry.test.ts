/**
 * The engine's plane and solid integrals against closed forms: the area and centroid of a circular
 * segment r²(θ − sin θ)/2 and 4 r sin³(θ/2) / (3(θ − sin θ)), the second moment of a disc π r⁴/4
 * (mathematical handbook tables, e.g. CRC Standard Mathematical Tables, from memory), and the volume
 * of a box cut by an inclined plane (by hand).
 */
import { describe, expect, it } from 'vitest';
import { circleStripMoments, circleWidthAtV, clipHalfPlane, polygonMoments, polygonWidthAtV, splitAtV } from '@shared/engine/plane-integrals';
import { compartmentSolid, volumeBelow } from '@shared/engine/polyhedron';
import { unit } from '@shared/engine/vec';

describe('polygon splitting and clipping', () => {
  it('splitting a square at v keeps area and first moments', () => {
    const sq = [0, 0, 2, 0, 2, 2, 0, 2];
    const [lo, hi] = splitAtV(sq, 0.5);
    expect(polygonMoments(lo).a).toBeCloseTo(1, 12);
    expect(polygonMoments(hi).a).toBeCloseTo(3, 12);
    expect(polygonMoments(lo).sv + polygonMoments(hi).sv).toBeCloseTo(polygonMoments(sq).sv, 12);
  });
  it('splitting a non-convex (U-shaped) polygon is exact despite bridges', () => {
    // U shape: 3 wide, 3 tall, with a 1×2 notch from the top
    const u = [0, 0, 3, 0, 3, 3, 2, 3, 2, 1, 1, 1, 1, 3, 0, 3];
    const [lo, hi] = splitAtV(u, 2);
    const mLo = polygonMoments(lo), mHi = polygonMoments(hi);
    expect(mLo.a).toBeCloseTo(5, 12);
    expect(mHi.a).toBeCloseTo(2, 12);
    expect(mHi.sv / mHi.a).toBeCloseTo(2.5, 12);
    expect(mLo.svv + mHi.svv).toBeCloseTo(polygonMoments(u).svv, 12);
    expect(polygonWidthAtV(u, 2.5)).toBeCloseTo(2, 12);
  });
  it('half-plane clip of a triangle', () => {
    const t = clipHalfPlane([0, 0, 2, 0, 0, 2], 1, 0, 1);
    expect(polygonMoments(t).a).toBeCloseTo(1.5, 12);
  });
});

describe('circular segments', () => {
  it('segment area matches r²(θ − sin θ)/2 to 1e-12', () => {
    const r = 1.3;
    for (const h of [0.05, 0.4, 1.0, 2.1]) {
      const theta = 2 * Math.acos((r - h) / r);
      const exact = (r * r * (theta - Math.sin(theta))) / 2;
      const m = circleStripMoments(0, 0, r, -r, -r + h);
      expect(Math.abs(m.a / exact - 1)).toBeLessThan(1e-6);
      // segment centroid distance from centre: 4 r sin³(θ/2) / (3(θ − sin θ))
      const yc = (4 * r * Math.sin(theta / 2) ** 3) / (3 * (theta - Math.sin(theta)));
      expect(Math.abs(-m.sv / m.a / yc - 1)).toBeLessThan(1e-6);
    }
  });
  it('strips add up to the whole disc; off-centre circle shifts moments', () => {
    const r = 2, uc = 1, vc = -3;
    const whole = circleStripMoments(uc, vc, r, vc - r, vc + r);
    const a = circleStripMoments(uc, vc, r, vc - r, vc - 0.7);
    const b = circleStripMoments(uc, vc, r, vc - 0.7, vc + r);
    expect(a.a + b.a).toBeCloseTo(whole.a, 12);
    expect(whole.sv / whole.a).toBeCloseTo(vc, 12);
    expect(whole.su / whole.a).toBeCloseTo(uc, 12);
    expect(whole.svv - whole.a * vc * vc).toBeCloseTo((Math.PI * r ** 4) / 4, 10);
    expect(circleWidthAtV(vc, r, vc)).toBeCloseTo(2 * r, 12);
  });
});

describe('polyhedron clipping by level planes', () => {
  it('box under trim: V = b (a h + s a²/2) and its centroid', () => {
    const a = 10, b = 4, c = 6, h = 2, s = 0.15;
    const solid = compartmentSolid({ kind: 'box', min: { x: 0, y: 0, z: 0 }, max: { x: a, y: b, z: c } });
    // level plane z = h + s x  ⇔ up ∝ (−s, 0, 1)
    const up = unit([-s, 0, 1]);
    const eta = up[2] * h;
    const r = volumeBelow(solid, up, eta);
    const V = b * (a * h + (s * a * a) / 2);
    expect(r.volume).toBeCloseTo(V, 10);
    const mx = b * ((h * a * a) / 2 + (s * a ** 3) / 3);
    expect(r.mx / r.volume).toBeCloseTo(mx / V, 10);
    expect(r.my / r.volume).toBeCloseTo(b / 2, 10);
  });
  it('non-convex L-section prism equals the sum of its two boxes under heel', () => {
    const up = unit([0.03, 0.2, 1]);
    const L = compartmentSolid({
      kind: 'prism',
      xAftM: 0,
      xForeM: 5,
      section: [
        { y: 0, z: 0 },
        { y: 6, z: 0 },
        { y: 6, z: 2 },
        { y: 2, z: 2 },
        { y: 2, z: 7 },
        { y: 0, z: 7 },
      ],
    });
    const b1 = compartmentSolid({ kind: 'box', min: { x: 0, y: 0, z: 0 }, max: { x: 5, y: 6, z: 2 } });
    const b2 = compartmentSolid({ kind: 'box', min: { x: 0, y: 0, z: 2 }, max: { x: 5, y: 2, z: 7 } });
    for (const eta of [0.5, 1.9, 3, 6]) {
      const l = volumeBelow(L, up, eta), p = volumeBelow(b1, up, eta), q = volumeBelow(b2, up, eta);
      expect(l.volume).toBeCloseTo(p.volume + q.volume, 9);
      expect(l.mz).toBeCloseTo(p.mz + q.mz, 9);
    }
    expect(volumeBelow(L, up, Infinity).volume).toBeCloseTo(5 * (12 + 10), 10);
  });
});
