/**
 * Colours of the 3D view. Liquids keep the colours of the rest of the app (water blue, oil brown,
 * anything else grey). Plates are coloured by the size of their mean net pressure on a sequential
 * pale-pink → magenta → deep-purple scale (ColorBrewer's RdPu, from memory): lightness falls
 * steadily with pressure, and no step of it is near the liquids' blue, brown or grey
 * (tests/unit/model3d/colours.test.ts measures the distance). The direction is the arrows' job.
 */
export type Rgb = [number, number, number];

/** Material colours of liquid bodies, by the engine's layer category. */
export const LIQUID_COLOUR = { water: '#1f6fa3', oil: '#6b4a12', other: '#5b6670' } as const;

/** RdPu, 9 classes without its near-white first step (hex, low → high). */
const RAMP = ['#fde0dd', '#fcc5c0', '#fa9fb5', '#f768a1', '#dd3497', '#ae017e', '#7a0177', '#49006a'] as const;

export const hexRgb = (hex: string): Rgb => [parseInt(hex.slice(1, 3), 16) / 255, parseInt(hex.slice(3, 5), 16) / 255, parseInt(hex.slice(5, 7), 16) / 255];

const STOPS = RAMP.map(hexRgb);

/** t in [0, 1] (|pressure| / largest |pressure|) → rgb 0..1, linear between the ramp's steps. */
export function pressureRgb(t: number): Rgb {
  const c = Math.max(0, Math.min(1, Number.isFinite(t) ? t : 0)) * (STOPS.length - 1);
  const i = Math.min(Math.floor(c), STOPS.length - 2);
  const f = c - i;
  const a = STOPS[i], b = STOPS[i + 1];
  return [a[0] + (b[0] - a[0]) * f, a[1] + (b[1] - a[1]) * f, a[2] + (b[2] - a[2]) * f];
}

export const rgbCss = ([r, g, b]: Rgb) => `rgb(${Math.round(r * 255)} ${Math.round(g * 255)} ${Math.round(b * 255)})`;
