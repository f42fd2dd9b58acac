/**
 * The net pressure along a boundary as a plain SVG chart: height up the plate on the vertical axis,
 * net pressure on the horizontal, both labelled with the user's units. Positive pressure (pushing
 * towards side B) is drawn to the right.
 */
import type { LoadDiagramPoint } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { formatNumber } from '@shared/units/units';
import { display, unitLabel } from '@client/lib/unit-system';

const W = 340;
const H = 260;
const M = { l: 52, r: 16, t: 14, b: 44 };

function niceTicks(lo: number, hi: number, count = 4): number[] {
  if (hi - lo <= 0) return [lo];
  const raw = (hi - lo) / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 2.5, 5, 10].map((k) => k * mag).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step) out.push(Math.abs(v) < step * 1e-9 ? 0 : v);
  return out;
}

export function LoadDiagramChart({ points, system, title }: { points: LoadDiagramPoint[]; system: UnitSystem; title?: string }) {
  if (points.length < 2) return <p className="text-ink-soft">No load diagram for this boundary.</p>;
  const pts = [...points].sort((a, b) => a.sM - b.sM);
  const ps = pts.map((p) => display(p.pressurePa, 'pressure', system));
  const ss = pts.map((p) => display(p.sM, 'length', system));
  const pMin = Math.min(0, ...ps);
  const pMax = Math.max(0, ...ps);
  const sMin = ss[0];
  const sMax = ss[ss.length - 1];
  const pSpan = pMax - pMin || 1;
  const sSpan = sMax - sMin || 1;
  const px = (p: number) => M.l + ((p - pMin) / pSpan) * (W - M.l - M.r);
  const sy = (s: number) => H - M.b - ((s - sMin) / sSpan) * (H - M.t - M.b);
  const path = [`M ${px(0)} ${sy(ss[0])}`, ...ps.map((p, i) => `L ${px(p)} ${sy(ss[i])}`), `L ${px(0)} ${sy(ss[ss.length - 1])}`, 'Z'].join(' ');
  const line = ps.map((p, i) => `${i === 0 ? 'M' : 'L'} ${px(p)} ${sy(ss[i])}`).join(' ');
  const pu = unitLabel('pressure', system);
  const lu = unitLabel('length', system);
  return (
    <figure className="m-0">
      <svg
        viewBox={`0 0 ${W} ${H}`}
        className="h-auto w-full max-w-md"
        role="img"
        aria-label={`${title ?? 'Load diagram'}: net pressure from ${formatNumber(Math.min(...ps), 3)} to ${formatNumber(Math.max(...ps), 3)} ${pu} over ${formatNumber(sSpan, 3)} ${lu} of height`}
        data-testid="load-diagram"
      >
        <rect x={M.l} y={M.t} width={W - M.l - M.r} height={H - M.t - M.b} fill="var(--color-card)" stroke="var(--color-line)" />
        {niceTicks(pMin, pMax).map((t) => (
          <g key={`p${t}`}>
            <line x1={px(t)} x2={px(t)} y1={M.t} y2={H - M.b} stroke="var(--color-line)" strokeDasharray={t === 0 ? undefined : '3 3'} />
            <text x={px(t)} y={H - M.b + 14} textAnchor="middle" fontSize="11" fill="var(--color-ink)">
              {formatNumber(t, 3)}
            </text>
          </g>
        ))}
        {niceTicks(sMin, sMax).map((t) => (
          <g key={`s${t}`}>
            <line x1={M.l - 4} x2={M.l} y1={sy(t)} y2={sy(t)} stroke="var(--color-ink)" />
            <text x={M.l - 6} y={sy(t) + 4} textAnchor="end" fontSize="11" fill="var(--color-ink)">
              {formatNumber(t, 3)}
            </text>
          </g>
        ))}
        <path d={path} fill="var(--color-sea)" fillOpacity={0.3} />
        <path d={line} fill="none" stroke="var(--color-hull)" strokeWidth={2} />
        <line x1={px(0)} x2={px(0)} y1={M.t} y2={H - M.b} stroke="var(--color-ink)" strokeWidth={1.5} />
        <text x={(M.l + W - M.r) / 2} y={H - 8} textAnchor="middle" fontSize="12" fontWeight="bold" fill="var(--color-ink)">
          Net pressure ({pu}), + pushes towards side B
        </text>
        <text x={14} y={(M.t + H - M.b) / 2} textAnchor="middle" fontSize="12" fontWeight="bold" fill="var(--color-ink)" transform={`rotate(-90 14 ${(M.t + H - M.b) / 2})`}>
          Up the boundary ({lu})
        </text>
      </svg>
      {title && <figcaption className="text-sm text-ink-soft">{title}</figcaption>}
    </figure>
  );
}
