/** The whole ship at a glance: heel, trim, flood water, oil, their centroid, the worst utilisation. */
import type { BoundarySummary, SurveyLevelResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { fmt } from '@client/lib/unit-system';
import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { VirtualList } from '@client/components/ui/virtual-list';
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

/** `predicted`: the results are at the attitude the ship's response predicts, not the one read. */
export function ShipTotals({ results, rows, system, predicted = false }: { results: SurveyLevelResults; rows: readonly BoundarySummary[]; system: UnitSystem; predicted?: boolean }) {
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
        <Tile label="Heel" value={unread ? '—' : `${Math.abs(frame.heelDeg).toFixed(1)}° ${frame.heelDeg > 0.05 ? 'stbd' : frame.heelDeg < -0.05 ? 'port' : ''}`} sub={unread ? 'readings needed' : predicted ? 'predicted (ship’s response)' : `from ${frame.heelSource}`} />
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

/**
 * The engine's notes, folded unless one is a danger. Nothing folded is rendered (a big ship has over a
 * thousand notes: as hidden list items they were most of the Loads screen's elements), and an open
 * list longer than a screenful renders only the notes in view (`VirtualList`).
 */
export function EngineWarnings({ results }: { results: SurveyLevelResults }) {
  const danger = results.warnings.some((w) => w.severity === 'danger');
  const [open, setOpen] = useState(danger);
  // a danger that appears later opens the notes again, as before
  useEffect(() => {
    if (danger) setOpen(true);
  }, [danger]);
  // notes have no id of their own: their place in the list is their key
  const notes = useMemo(() => results.warnings.map((w, i) => ({ w, key: String(i) })), [results.warnings]);
  if (results.warnings.length === 0) return null;
  return (
    <details className="rounded-lg border border-caution bg-caution-soft p-2 text-sm" open={open} onToggle={(e) => setOpen(e.currentTarget.open)} data-testid="engine-notes">
      <summary className="min-h-touch cursor-pointer content-center font-bold">Engine notes ({results.warnings.length})</summary>
      {open && (
        <div className="mt-1">
          <VirtualList
            items={notes}
            itemKey={(n) => n.key}
            label="Engine notes"
            className="space-y-1"
            estimatePx={WARNING_ESTIMATE_PX}
            render={({ w }) => (
              <span className={w.severity === 'danger' ? 'font-bold text-danger' : ''}>
                <span aria-hidden="true">{w.severity === 'danger' ? '▲ ' : w.severity === 'warning' ? '◆ ' : '· '}</span>
                {w.message}
              </span>
            )}
          />
        </div>
      )}
    </details>
  );
}

/** A note as one line of a phone's width (they wrap to two or three; measured once shown). */
const WARNING_ESTIMATE_PX = 44;

function namesOf(rows: readonly BoundarySummary[], ids: readonly string[]): string {
  const byId = new Map(rows.map((r) => [r.id, r.name]));
  return ids.map((id) => byId.get(id) ?? id).join(', ');
}
