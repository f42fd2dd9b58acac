/**
 * Net pressure → colour for the 3D view and its legend: a diverging scale, blue when the plate is
 * pushed towards side A, amber to magenta towards side B, pale near zero (colour-blind safe pair;
 * the legend gives the numbers).
 */
const NEG: [number, number, number] = [0.12, 0.44, 0.64]; // sea
const MID: [number, number, number] = [0.93, 0.93, 0.9];
const POS1: [number, number, number] = [0.95, 0.72, 0.02]; // amber
const POS2: [number, number, number] = [0.69, 0.0, 0.31]; // danger magenta

const mix = (a: number[], b: number[], t: number): [number, number, number] => [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t, a[2] + (b[2] - a[2]) * t];

/** t in [−1, 1] (pressure / largest magnitude) → rgb 0..1. */
export function pressureRgb(t: number): [number, number, number] {
  const c = Math.max(-1, Math.min(1, t));
  if (c < 0) return mix(MID, NEG, -c);
  if (c < 0.5) return mix(MID, POS1, c * 2);
  return mix(POS1, POS2, (c - 0.5) * 2);
}

export const rgbCss = ([r, g, b]: [number, number, number]) => `rgb(${Math.round(r * 255)} ${Math.round(g * 255)} ${Math.round(b * 255)})`;
