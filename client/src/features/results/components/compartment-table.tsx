/**
 * Liquid in every compartment: each layer's volume (permeability applied), mass and level. Beyond a
 * screenful of spaces only those in view are rendered (one `tbody` per space, measured as it shows).
 */
import type { SurveyLevelResults } from '@shared/engine';
import type { UnitSystem } from '@shared/units/units';
import { PointText } from './point-text';
import { fmt, num, percent, unitLabel } from '@client/lib/unit-system';
import { countWords, spaceTypeWords } from '@shared/review/plain-words';
import { tankWords } from '@shared/review/tank-words';
import { useVirtualWindow } from '@client/components/ui/use-virtual-window';

/** A space's rows: its own, and one per layer (about one layer each). */
const SPACE_ESTIMATE_PX = 96;

export function CompartmentTable({ results, system, onSelect }: { results: SurveyLevelResults; system: UnitSystem; onSelect?: (id: string) => void }) {
  const spaces = results.compartments;
  const { scroller, virtual, indices, padTop, padBottom, measure } = useVirtualWindow<HTMLTableSectionElement>({ count: spaces.length, estimatePx: SPACE_ESTIMATE_PX, from: 40 });
  if (spaces.length === 0) return <p className="text-ink-soft">No compartments yet.</p>;
  return (
    <div
      ref={scroller}
      className={`overflow-x-auto rounded-lg border border-line bg-card ${virtual ? 'max-h-[70vh] overflow-y-auto' : ''}`}
      tabIndex={0}
      role="region"
      aria-label={virtual ? `Contents of ${countWords(spaces.length, 'space')} (scrolls)` : 'Spaces and contents (scrolls sideways)'}
    >
      <table className="w-full min-w-[34rem] border-collapse text-left text-sm" data-testid="compartment-results">
        <thead className="bg-sea-soft">
          <tr>
            <th className="p-1.5">Space / layer</th>
            <th className="p-1.5 text-right">Volume ({unitLabel('volume', system)})</th>
            <th className="p-1.5 text-right">Mass ({unitLabel('mass', system)})</th>
            <th className="p-1.5 text-right">Full</th>
            <th className="p-1.5">Centroid ({unitLabel('length', system)})</th>
          </tr>
        </thead>
        {padTop > 0 && (
          <tbody aria-hidden="true">
            <tr style={{ height: padTop }} />
          </tbody>
        )}
        {indices.map((i) => (
          <tbody key={spaces[i].id} ref={measure} data-index={i}>
            <CompartmentRows c={spaces[i]} system={system} onSelect={onSelect} />
          </tbody>
        ))}
        {padBottom > 0 && (
          <tbody aria-hidden="true">
            <tr style={{ height: padBottom }} />
          </tbody>
        )}
      </table>
    </div>
  );
}

function CompartmentRows({ c, system, onSelect }: { c: SurveyLevelResults['compartments'][number]; system: UnitSystem; onSelect?: (id: string) => void }) {
  return (
    <>
      <tr className="border-t-2 border-line font-bold">
        <td className="p-1.5">
          {onSelect ? (
            <button type="button" className="min-h-touch text-left underline" onClick={() => onSelect(c.id)}>
              {c.name}
            </button>
          ) : (
            c.name
          )}
          <span className="block text-xs font-normal text-ink-soft">
            {spaceTypeWords(c.spaceType)} · permeability {c.permeability.toFixed(2)}
            {c.openToSea ? ' · open to sea' : ''}
          </span>
          {c.tank && (
            <span className="block text-xs font-normal text-ink-soft" data-testid="tank-split">
              {tankWords(c.tank, system)}
            </span>
          )}
        </td>
        <td className="p-1.5 text-right tabular-nums">{num(c.liquid.volumeM3, 'volume', system)}</td>
        <td className="p-1.5 text-right tabular-nums">{num(c.liquid.massKg, 'mass', system)}</td>
        <td className="whitespace-nowrap p-1.5 text-right tabular-nums">{percent(c.fillFraction)}</td>
        <td className="p-1.5"><PointText point={c.liquid.centroid} system={system} /></td>
      </tr>
      {c.layers.map((l) => (
        <tr key={l.layerId} className="border-t border-line">
          <td className="p-1.5 pl-5">
            <span
              aria-hidden="true"
              className={`mr-1 inline-block size-3 rounded-sm ${l.category === 'oil' ? 'bg-oil' : l.category === 'water' ? 'bg-sea' : 'bg-ink-soft'}`}
            />
            {l.fluidName} <span className="whitespace-nowrap text-ink-soft">({num(l.densityKgM3, 'density', system)} {unitLabel('density', system)})</span>
            {c.tank && l.ownVolumeM3 > 0 && (
              <span className="block text-xs text-ink-soft">
                {l.ownVolumeM3 >= l.volumeM3 * (1 - 1e-9) ? 'the tank’s own' : `${fmt(l.ownVolumeM3, 'volume', system)} the tank’s own, the rest flood water`}
              </span>
            )}
          </td>
          <td className="p-1.5 text-right tabular-nums">{num(l.volumeM3, 'volume', system)}</td>
          <td className="p-1.5 text-right tabular-nums">{num(l.massKg, 'mass', system)}</td>
          <td className="p-1.5" />
          <td className="p-1.5"><PointText point={l.centroid} system={system} /></td>
        </tr>
      ))}
    </>
  );
}
