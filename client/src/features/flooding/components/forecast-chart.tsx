/**
 * The forecast's timeline: liquid levels of the spaces that change (left axis, in the user's length unit above their
 * lowest point) against the ship's clock, and the worst boundary utilisation (right axis, %), with a marker at each time a
 * boundary reaches its limit. uPlot, in its own lazily loaded chunk (a lazy default export).
 */
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import type { FloodForecast } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { display, unitLabel } from '@client/lib/unit-system';
import { utcOffsetWords } from '@shared/review/time-words';

const COLOURS = ['#0b4f6c', '#2a9d8f', '#8a5a00', '#5b3a8c', '#1d6f42', '#7a1f1f'];

/** "10:30" on the ship's clock (UTC when the offset is not set), `h` hours after the readings. */
function clockAt(readingsTime: string, h: number, offsetMin: number | undefined): string {
  const d = new Date(Date.parse(readingsTime) + h * 3_600_000 + (offsetMin ?? 0) * 60_000);
  return d.toISOString().slice(11, 16);
}

export default function ForecastChart({ forecast, width, offsetMin, system }: { forecast: FloodForecast; width: number; offsetMin?: number; system: UnitSystem }) {
  const ref = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!ref.current) return;
    const moving = forecast.spaces.filter((s) => s.active && Math.max(...s.levelM) - Math.min(...s.levelM) > 1e-3).slice(0, COLOURS.length);
    const hours = forecast.times.map((t) => t / 3600);
    const worst = forecast.worst.map((w) => (w.utilisation === null ? null : 100 * w.utilisation));
    const limitHours = forecast.limits.map((l) => l.atS / 3600);
    // levels in the user's length unit, as the rest of the screen
    const data: uPlot.AlignedData = [hours, ...moving.map((s) => s.levelM.map((v) => display(v, 'length', system))), worst];
    const opts: uPlot.Options = {
      width,
      height: 260,
      scales: { x: { time: false }, pct: { auto: true } },
      axes: [
        {
          label: offsetMin === undefined ? 'UTC (hours from the readings)' : `ship's time, ${utcOffsetWords(offsetMin)} (hours from the readings)`,
          // whole hours only; each tick says the clock time and how long after the readings
          incrs: [1, 2, 3, 4, 6, 8, 12, 24, 48],
          values: (_u, splits) => splits.map((h) => `${clockAt(forecast.readingsTime, h, offsetMin)}\n+${h} h`),
          size: 48,
        },
        { label: `level, ${unitLabel('length', system)}` },
        { side: 1, scale: 'pct', label: 'worst utilisation, %', grid: { show: false } },
      ],
      series: [
        {},
        ...moving.map((s, i) => ({ label: s.name, stroke: COLOURS[i], width: 2 })),
        { label: 'Worst utilisation', scale: 'pct', stroke: '#c2185b', width: 2, dash: [6, 4] },
      ],
      hooks: {
        draw: [
          (u) => {
            // a marker per limit reached: a vertical line at its time
            const ctx = u.ctx;
            ctx.save();
            ctx.strokeStyle = '#c2185b';
            ctx.lineWidth = 2 * uPlot.pxRatio;
            for (const h of limitHours) {
              const x = u.valToPos(h, 'x', true);
              ctx.beginPath();
              ctx.moveTo(x, u.bbox.top);
              ctx.lineTo(x, u.bbox.top + u.bbox.height);
              ctx.stroke();
            }
            ctx.restore();
          },
        ],
      },
    };
    const plot = new uPlot(opts, data, ref.current);
    return () => plot.destroy();
  }, [forecast, width, offsetMin, system]);
  return <div ref={ref} data-testid="forecast-chart" />;
}
