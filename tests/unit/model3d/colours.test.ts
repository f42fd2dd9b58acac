/**
 * The plates' pressure colours cannot be mistaken for the liquids' colours: every step of the
 * pressure scale stands at least ΔE*ab 25 from each liquid colour, as drawn (material colour, and
 * at its 60 % opacity over the model's background), and the scale's lightness falls steadily.
 * sRGB → CIELAB by the published definitions: IEC 61966-2-1 (sRGB transfer and its D65 matrix)
 * and CIE 15:2004 (L*a*b*, ΔE*ab as the Euclidean distance).
 */
import { describe, expect, it } from 'vitest';
import { LIQUID_COLOUR, hexRgb, pressureRgb, type Rgb } from '@client/features/model3d/components/pressure-colour';

function lab([r, g, b]: Rgb): [number, number, number] {
  const lin = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
  const [R, G, B] = [lin(r), lin(g), lin(b)];
  const X = 0.4124 * R + 0.3576 * G + 0.1805 * B;
  const Y = 0.2126 * R + 0.7152 * G + 0.0722 * B;
  const Z = 0.0193 * R + 0.1192 * G + 0.9505 * B;
  const f = (t: number) => (t > (6 / 29) ** 3 ? Math.cbrt(t) : t / (3 * (6 / 29) ** 2) + 4 / 29);
  const [fx, fy, fz] = [f(X / 0.95047), f(Y / 1.0), f(Z / 1.08883)];
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}
const deltaE = (a: Rgb, b: Rgb) => Math.hypot(...lab(a).map((v, i) => v - lab(b)[i]));

describe('the colour arithmetic of this test', () => {
  it('gives the usually quoted L*a*b* of pure sRGB red and of white (from memory: 53.24, 80.09, 67.20; 100, 0, 0)', () => {
    const red = lab([1, 0, 0]);
    expect(red[0]).toBeCloseTo(53.24, 1);
    expect(red[1]).toBeCloseTo(80.09, 0);
    expect(red[2]).toBeCloseTo(67.2, 0);
    const white = lab([1, 1, 1]);
    expect(white[0]).toBeCloseTo(100, 1);
    expect(Math.abs(white[1])).toBeLessThan(0.5);
  });
});

describe('pressure colours', () => {
  const BACKGROUND = hexRgb('#e9eef2'); // the model's canvas
  const liquids = Object.entries(LIQUID_COLOUR).flatMap(([name, hex]) => {
    const c = hexRgb(hex);
    const over: Rgb = [0, 1, 2].map((i) => 0.6 * c[i] + 0.4 * BACKGROUND[i]) as Rgb;
    return [[name, c] as const, [`${name} at 60 % over the background`, over] as const];
  });
  const steps = Array.from({ length: 21 }, (_, i) => i / 20);

  it('stay at least ΔE 25 from every liquid colour (about ten times a just-noticeable difference)', () => {
    for (const t of steps) for (const [name, c] of liquids) expect(deltaE(pressureRgb(t), c), `${t} against ${name}`).toBeGreaterThanOrEqual(25);
  });

  it('run from light to dark without turning back, so the order reads without the legend', () => {
    const L = steps.map((t) => lab(pressureRgb(t))[0]);
    for (let i = 1; i < L.length; i++) expect(L[i]).toBeLessThan(L[i - 1]);
    expect(L[0] - L[L.length - 1]).toBeGreaterThan(60);
  });

  it('clamp out-of-range and undefined ratios to the ends of the scale', () => {
    expect(pressureRgb(-1)).toEqual(pressureRgb(0));
    expect(pressureRgb(2)).toEqual(pressureRgb(1));
    expect(pressureRgb(Number.NaN)).toEqual(pressureRgb(0));
  });
});
