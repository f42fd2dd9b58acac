/** Everything computed for one boundary: each side, the net load, its diagram, stiffeners, shores, capacity. */
import type { BoundaryResult, SurveyLevelResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { fmt, num, percent, unitLabel } from '@client/lib/unit-system';
import { LoadDiagramChart } from './load-diagram-chart';
import { StructureChecks } from './structure-checks';
import { UtilisationBadge } from './utilisation';
import { horizontalWords } from '@shared/units/point-words';
import type { ReactNode } from 'react';
import { PointText } from './point-text';
import { sideName } from './side-name';
import { ratingWayWords } from '@shared/review/rating-words';

/** A figure never breaks between its number and its unit ("3374 kN", not "3374" over "kN"). */
const keepUnits = (value: ReactNode): ReactNode => (typeof value === 'string' ? value.replace(/(\d) (?=[^\d\s])/g, '$1\u00a0') : value);

function Row({ label, value, testId }: { label: string; value: ReactNode; testId?: string }) {
  return (
    <div className="flex justify-between gap-3 border-b border-line py-1">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="text-right font-bold tabular-nums" data-testid={testId}>
        {keepUnits(value)}
      </dd>
    </div>
  );
}

export function BoundaryDetail({ boundary: b, results, system }: { boundary: BoundaryResult; results: SurveyLevelResults; system: UnitSystem }) {
  const warnings = results.warnings.filter((w) => w.entityId === b.id || b.shores.some((s) => s.id === w.entityId));
  return (
    <section aria-label={`Loads on ${b.name}`} className="space-y-4" data-testid="boundary-detail">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-xl">{b.name}</h3>
        <UtilisationBadge value={b.maxUtilisation} />
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <dl>
          <Row
            label={b.geometryKind === 'faceted' ? "Net force along the facets' mean normal (+ towards side B)" : 'Net force along the normal (A − B, + towards side B)'}
            value={fmt(b.net.forceN, 'force', system)}
            testId="detail-net-force"
          />
          <Row label="Resultant" value={fmt(b.net.resultantN, 'force', system)} />
          <Row label="Vertical component (+ up)" value={fmt(b.net.verticalN, 'force', system)} />
          <Row label="Horizontal component" value={`${fmt(b.net.horizontalN, 'force', system)} ${horizontalWords(b.net.horizontalDirection)}`.trim()} />
          {b.net.nearlyCancels ? (
            <Row label="The two sides nearly cancel: couple about the centroid" value={fmt(b.net.coupleNm, 'moment', system)} testId="detail-couple" />
          ) : (
            <Row label="Centre of pressure" value={<PointText point={b.net.centreOfPressure} system={system} />} testId="detail-cop" />
          )}
          {b.net.centreOfPressureAboveLowestM !== null && (
            <Row label="Centre of pressure above the boundary’s lowest point" value={fmt(b.net.centreOfPressureAboveLowestM, 'length', system, 3)} />
          )}
          <Row label="Peak net pressure (+ towards side B)" value={fmt(b.net.peak.pressurePa, 'pressure', system)} />
          <Row label="Peak acts at" value={<PointText point={b.net.peak.point} system={system} />} />
          <Row label="Loaded area" value={fmt(b.areaM2, 'area', system)} />
          {b.net.signChange && <Row label="Pressure reverses" value="yes — pushes both ways" />}
          {b.capacities.map((c, i) => (
            <Row
              key={i}
              label={`Rated ${c.kind} ${ratingWayWords(c.direction, { A: sideName(results, b.sideA), B: sideName(results, b.sideB) })}: ${c.direction === 'either' ? 'greatest' : 'pushing that way'} of rated`}
              value={`${fmt(c.actual, c.kind === 'pressure' ? 'pressure' : 'force', system)} of ${fmt(c.rated, c.kind === 'pressure' ? 'pressure' : 'force', system)} (${percent(c.utilisation)})`}
              testId={`capacity-${c.direction}`}
            />
          ))}
        </dl>
        <LoadDiagramChart points={b.loadDiagram} system={system} title={`Load diagram, ${b.name}`} />
      </div>

      <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Pressure on each side (scrolls sideways)">
        <table className="w-full min-w-[28rem] border-collapse text-left text-sm">
          <caption className="text-left font-bold">Pressure on each side</caption>
          <thead className="bg-sea-soft">
            <tr>
              <th className="p-1.5">Side</th>
              <th className="p-1.5">Space</th>
              <th className="p-1.5 text-right">Force ({unitLabel('force', system)})</th>
              <th className="p-1.5 text-right">Peak ({unitLabel('pressure', system)})</th>
              <th className="p-1.5 text-right">Wetted area ({unitLabel('area', system)})</th>
            </tr>
          </thead>
          <tbody>
            {(['A', 'B'] as const).map((k) => {
              const s = k === 'A' ? b.sideA : b.sideB;
              return (
                <tr key={k} className="border-t border-line">
                  <td className="p-1.5 font-bold">{k}</td>
                  <td className="p-1.5">{sideName(results, s)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.forceN, 'force', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.peakPressurePa, 'pressure', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.wettedAreaM2, 'area', system)}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>

      <StructureChecks boundary={b} system={system} />

      {warnings.length > 0 && (
        <ul className="space-y-1 text-sm">
          {warnings.map((w, i) => (
            <li key={i} className={w.severity === 'danger' ? 'font-bold text-danger' : 'text-caution'}>
              <span aria-hidden="true">{w.severity === 'danger' ? '▲ ' : '◆ '}</span>
              {w.message}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
