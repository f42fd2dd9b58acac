/** Everything computed for one boundary: each side, the net load, its diagram, stiffeners, shores, capacity. */
import type { BoundaryResult, SurveyLevelResults } from '@shared/engine/results';
import type { UnitSystem } from '@shared/units/units';
import { fmt, num, percent, unitLabel } from '@client/lib/unit-system';
import { LoadDiagramChart } from './load-diagram-chart';
import { UtilisationBadge } from './utilisation';
import { fmtPoint, sideName } from './side-name';

function Row({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <div className="flex justify-between gap-3 border-b border-line py-1">
      <dt className="text-ink-soft">{label}</dt>
      <dd className="text-right font-bold tabular-nums" data-testid={testId}>
        {value}
      </dd>
    </div>
  );
}

export function BoundaryDetail({ boundary: b, results, system }: { boundary: BoundaryResult; results: SurveyLevelResults; system: UnitSystem }) {
  const L = (v: number) => num(v, 'length', system, 3);
  const warnings = results.warnings.filter((w) => w.entityId === b.id || b.shores.some((s) => s.id === w.entityId));
  return (
    <section aria-label={`Loads on ${b.name}`} className="space-y-4" data-testid="boundary-detail">
      <div className="flex flex-wrap items-center gap-2">
        <h3 className="text-xl">{b.name}</h3>
        <UtilisationBadge value={b.maxUtilisation} />
      </div>
      <div className="grid gap-4 md:grid-cols-2">
        <dl>
          <Row label="Net force (A − B, along the normal)" value={fmt(b.net.forceN, 'force', system)} testId="detail-net-force" />
          <Row label="Resultant" value={fmt(b.net.resultantN, 'force', system)} />
          <Row label="Vertical component (+ up)" value={fmt(b.net.verticalN, 'force', system)} />
          <Row label="Horizontal component" value={fmt(b.net.horizontalN, 'force', system)} />
          <Row label={`Centre of pressure (${unitLabel('length', system)})`} value={fmtPoint(b.net.centreOfPressure, L)} />
          <Row label="Peak net pressure" value={fmt(b.net.peak.pressurePa, 'pressure', system)} />
          <Row label={`Peak acts at (${unitLabel('length', system)})`} value={fmtPoint(b.net.peak.point, L)} />
          <Row label="Loaded area" value={fmt(b.areaM2, 'area', system)} />
          {b.net.signChange && <Row label="Pressure reverses" value="yes — pushes both ways" />}
          {b.capacity && (
            <Row
              label={`Rated ${b.capacity.kind}`}
              value={`${fmt(b.capacity.rated, b.capacity.kind === 'pressure' ? 'pressure' : 'force', system)} (${percent(b.capacity.utilisation)})`}
            />
          )}
        </dl>
        <LoadDiagramChart points={b.loadDiagram} system={system} title={`Load diagram, ${b.name}`} />
      </div>

      <div className="overflow-x-auto">
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

      {b.stiffeners && b.stiffeners.items.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[36rem] border-collapse text-left text-sm" data-testid="stiffener-table">
            <caption className="text-left font-bold">
              Stiffeners ({b.stiffeners.endFixity === 'fixed' ? 'fixed ends' : 'simply supported'}, {fmt(b.stiffeners.spacingM, 'length', system, 3)} apart)
            </caption>
            <thead className="bg-sea-soft">
              <tr>
                <th className="p-1.5">No.</th>
                <th className="p-1.5 text-right">Offset ({unitLabel('length', system)})</th>
                <th className="p-1.5 text-right">Span ({unitLabel('length', system)})</th>
                <th className="p-1.5 text-right">Load ({unitLabel('force', system)})</th>
                <th className="p-1.5 text-right">Max moment ({unitLabel('moment', system)})</th>
                <th className="p-1.5 text-right">Modulus needed ({unitLabel('sectionModulus', system)})</th>
                <th className="p-1.5">Utilisation</th>
              </tr>
            </thead>
            <tbody>
              {b.stiffeners.items.map((s, i) => (
                <tr key={i} className={`border-t border-line ${s.utilisation > 1 ? 'bg-danger-soft' : ''}`}>
                  <td className="p-1.5">{i + 1}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.offsetM, 'length', system, 3)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.spanM, 'length', system, 3)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.totalLoadN, 'force', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.maxMomentNm, 'moment', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.requiredModulusM3, 'sectionModulus', system)}</td>
                  <td className="p-1.5">
                    <UtilisationBadge value={s.utilisation} compact />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

      {b.shores.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[36rem] border-collapse text-left text-sm" data-testid="shore-table">
            <caption className="text-left font-bold">Shores</caption>
            <thead className="bg-sea-soft">
              <tr>
                <th className="p-1.5">No.</th>
                <th className="p-1.5 text-right">Tributary area ({unitLabel('area', system)})</th>
                <th className="p-1.5 text-right">Axial load ({unitLabel('force', system)})</th>
                <th className="p-1.5 text-right">Buckling load ({unitLabel('force', system)})</th>
                <th className="p-1.5 text-right">Stress ({unitLabel('pressure', system)})</th>
                <th className="p-1.5">Utilisation</th>
              </tr>
            </thead>
            <tbody>
              {b.shores.map((s, i) => (
                <tr key={s.id} className={`border-t border-line ${s.utilisation > 1 ? 'bg-danger-soft' : ''}`}>
                  <td className="p-1.5">
                    {i + 1}
                    {!s.loaded && <span className="block text-xs text-ink-soft">not loaded</span>}
                    {s.slender && <span className="block text-xs text-danger">slender</span>}
                  </td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.tributaryAreaM2, 'area', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.axialLoadN, 'force', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.eulerLoadN, 'force', system)}</td>
                  <td className="p-1.5 text-right tabular-nums">{num(s.stressPa, 'pressure', system)}</td>
                  <td className="p-1.5">
                    <UtilisationBadge value={s.utilisation} compact />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}

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
