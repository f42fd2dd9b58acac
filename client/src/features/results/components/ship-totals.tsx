/** The whole ship at a glance: heel, trim, flood water, oil, their centroid, the worst utilisation. */
import type { BoundarySummary, SurveyLevelResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { fmt } from '@client/lib/unit-system';
import type { ReactNode } from 'react';
import { pointParts } from '@shared/units/point-words';
import { UtilisationBadge } from './utilisation';

function Tile({ label, value, sub, testId }: { label: string; value: string; sub?: ReactNode; testId?: string }) {
  return (
    <div className="rounded-lg border border-line bg-card p-2">
      <div className="text-xs font-bold uppercase tracking-wide text-ink-soft">{label}</div>
      <div className="text-lg font-bold tabular-nums" data-testid={testId}>
        {value}
      </div>
      {sub && <div className="text-xs text-ink-soft">{sub}</div>}
    </div>
  );
}

export function ShipTotals({ results, rows, system }: { results: SurveyLevelResults; rows: readonly BoundarySummary[]; system: UnitSystem }) {
  const { frame, ship, summary } = results;
  const worst = rows.find((b) => b.id === summary.maxUtilisationBoundaryId);
  // where along the ship first ("244.6 ft fwd of AP"), then across and up, each with its unit and side
  const centroid = ship.allLiquids.centroid ? pointParts(ship.allLiquids.centroid, system) : null;
  // heel and trim are only real once the drafts and the heel are read
  const unread = (frame.missingReadings ?? []).length > 0;
  return (
    <section aria-label="Ship totals" className="space-y-2">
      {summary.overCapacityBoundaryIds.length > 0 && (
        <p className="flex items-center gap-2 rounded-lg border-2 border-danger bg-danger p-2 font-bold text-paper" role="alert" data-testid="over-capacity-alert">
          <span aria-hidden="true" className="text-xl">▲</span>
          {summary.overCapacityBoundaryIds.length === 1 ? '1 boundary is' : `${summary.overCapacityBoundaryIds.length} boundaries are`} OVER CAPACITY:{' '}
          {namesOf(rows, summary.overCapacityBoundaryIds)}
        </p>
      )}
      <div className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        <Tile label="Heel" value={unread ? '—' : `${Math.abs(frame.heelDeg).toFixed(1)}° ${frame.heelDeg > 0.05 ? 'stbd' : frame.heelDeg < -0.05 ? 'port' : ''}`} sub={unread ? 'readings needed' : `from ${frame.heelSource}`} />
        <Tile
          label="Trim"
          value={unread ? '—' : `${fmt(Math.abs(frame.trimM), 'length', system, 3)} ${frame.trimM > 0.0005 ? 'by stern' : frame.trimM < -0.0005 ? 'by head' : ''}`}
          sub={unread ? 'readings needed' : `${Math.abs(frame.trimDeg).toFixed(2)}°`}
        />
        <Tile label="Flood water" value={fmt(ship.floodWater.massKg, 'mass', system)} sub={fmt(ship.floodWater.volumeM3, 'volume', system)} testId="total-flood-water" />
        <Tile label="Oil" value={fmt(ship.oil.massKg, 'mass', system)} sub={fmt(ship.oil.volumeM3, 'volume', system)} />
        {ship.tankContents.massKg > 0 && (
          <Tile label="Tanks’ own liquid" value={fmt(ship.tankContents.massKg, 'mass', system)} sub={`${fmt(ship.tankContents.volumeM3, 'volume', system)}, not flood water`} testId="total-tank-contents" />
        )}
        <Tile
          label="All liquid centroid"
          value={centroid ? centroid[0] : '—'}
          sub={centroid ? centroid.slice(1).join(', ') : undefined}
          testId="total-centroid"
        />
        <Tile label="Sea density" value={fmt(frame.seaDensityKgM3, 'density', system)} />
        <div className="col-span-2 rounded-lg border border-line bg-card p-2">
          <div className="text-xs font-bold uppercase tracking-wide text-ink-soft">Worst utilisation</div>
          <div className="mt-1 flex flex-wrap items-center gap-2">
            <UtilisationBadge value={summary.maxUtilisation} />
            {worst && <span className="font-bold">{worst.name}</span>}
          </div>
        </div>
      </div>
    </section>
  );
}

export function EngineWarnings({ results }: { results: SurveyLevelResults }) {
  if (results.warnings.length === 0) return null;
  return (
    <details className="rounded-lg border border-caution bg-caution-soft p-2 text-sm" open={results.warnings.some((w) => w.severity === 'danger')}>
      <summary className="min-h-touch cursor-pointer content-center font-bold">Engine notes ({results.warnings.length})</summary>
      <ul className="mt-1 space-y-1">
        {results.warnings.map((w, i) => (
          <li key={i} className={w.severity === 'danger' ? 'font-bold text-danger' : ''}>
            <span aria-hidden="true">{w.severity === 'danger' ? '▲ ' : w.severity === 'warning' ? '◆ ' : '· '}</span>
            {w.message}
          </li>
        ))}
      </ul>
    </details>
  );
}

function namesOf(rows: readonly BoundarySummary[], ids: readonly string[]): string {
  const byId = new Map(rows.map((r) => [r.id, r.name]));
  return ids.map((id) => byId.get(id) ?? id).join(', ');
}
