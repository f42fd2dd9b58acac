/**
 * The structural checks of one plate: stiffeners, shores (as columns by their design method) and
 * the plating between stiffeners, with what the model assumes said in words.
 */
import type { BoundaryResult } from '@shared/engine';
import { INCH_M, STRESS_UNIT, formatStress, type UnitSystem } from '@shared/units/units';
import { fmt, num, percent, unitLabel } from '@client/lib/unit-system';
import { UtilisationBadge } from './utilisation';

const BEARS_ON: Record<BoundaryResult['shores'][number]['bearsOn'], string> = {
  plate: 'plate',
  stiffener: 'a stiffener',
  panel: 'plating between stiffeners',
  edge: 'a held edge (carries nothing)',
};

const th = 'p-1.5 text-right';

function UtilCell({ value }: { value: number }) {
  return (
    <td className="p-1.5">
      <UtilisationBadge value={value} compact />
    </td>
  );
}
const td = 'p-1.5 text-right tabular-nums';

const thicknessText = (m: number, system: UnitSystem) => (system === 'us' ? `${(m / INCH_M).toFixed(3)} in` : `${(m * 1000).toFixed(1)} mm`);

export function StructureChecks({ boundary: b, system }: { boundary: BoundaryResult; system: UnitSystem }) {
  const st = b.stiffeners;
  const u = (d: Parameters<typeof unitLabel>[0]) => unitLabel(d, system);
  return (
    <>
      {b.structureModel && (
        <p className="rounded border border-line bg-card p-2 text-sm" data-testid="structure-model">
          <span className="font-bold">What the model assumes: </span>
          {b.structureModel}
        </p>
      )}
      {st && st.status !== 'ok' && (
        <p className="font-bold text-danger" data-testid="stiffener-not-checked">
          <span aria-hidden="true">▲ </span>Stiffeners not checked: {st.note}
        </p>
      )}
      {st && st.items.length > 0 && (
        <div className="space-y-1">
          {/* said above the table, not in a caption, so a phone shows it without scrolling sideways */}
          <p className="text-sm font-bold">
            Stiffeners ({st.endFixity === 'fixed' ? 'fixed ends' : 'simply supported'}, {fmt(st.spacingM, 'length', system, 3)} apart; offsets from the {st.offsetFromEdge})
            {st.edgeLoadN !== null && <span className="block font-normal">Taken straight by the plate&apos;s edges: {fmt(st.edgeLoadN, 'force', system)}</span>}
          </p>
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Stiffeners (scrolls sideways)">
          <table className="w-full min-w-[40rem] border-collapse text-left text-sm" data-testid="stiffener-table">
            <caption className="sr-only">Stiffeners</caption>
            <thead className="bg-sea-soft">
              <tr>
                <th className="p-1.5">No.</th>
                <th className={th}>Offset from the {st.offsetFromEdge} ({u('length')})</th>
                <th className={th}>Span ({u('length')})</th>
                <th className={th}>Load, along the normal ({u('force')})</th>
                <th className={th}>End reactions ({u('force')})</th>
                <th className={th}>From shores ({u('force')})</th>
                <th className={th}>Max moment ({u('moment')})</th>
                <th className={th}>Modulus needed ({u('sectionModulus')})</th>
                <th className="p-1.5">Utilisation</th>
              </tr>
            </thead>
            <tbody>
              {st.items.map((s, i) => (
                <tr key={i} className={`border-t border-line ${s.utilisation > 1 ? 'bg-danger-soft' : ''}`}>
                  <td className="p-1.5">{i + 1}</td>
                  <td className={td}>{num(s.offsetM, 'length', system, 3)}</td>
                  <td className={td}>{num(s.spanM, 'length', system, 3)}</td>
                  <td className={td}>{num(s.totalLoadN, 'force', system)}</td>
                  <td className={td}>
                    {num(s.reactionStartN, 'force', system)} / {num(s.reactionEndN, 'force', system)}
                  </td>
                  <td className={td}>{s.shoreForcesN === 0 ? '—' : num(s.shoreForcesN, 'force', system)}</td>
                  <td className={td}>{num(s.maxMomentNm, 'moment', system)}</td>
                  <td className={td}>{num(s.requiredModulusM3, 'sectionModulus', system)}</td>
                  <UtilCell value={s.utilisation} />
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        </div>
      )}

      {b.plating && (
        <div className="space-y-1">
          <p className="text-sm font-bold" data-testid="plating-heading">
            Plating {st && st.items.length > 0 ? 'between stiffeners' : '(the whole plate as one panel)'}: {thicknessText(b.plating.netThicknessM, system)} net of corrosion allowance, edges{' '}
            {b.plating.edges === 'fixed' ? 'fixed' : 'simply supported'}, allowable {formatStress(b.plating.allowableStressPa, system, 3)} (yield {formatStress(b.plating.yieldStressPa, system, 3)})
            <span className="block font-normal">
              Coefficients: {b.plating.source}. {b.plating.notes.join('; ')}
            </span>
          </p>
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Plating panels (scrolls sideways)">
          <table className="w-full min-w-[36rem] border-collapse text-left text-sm" data-testid="plating-table">
            <caption className="sr-only">Plating panels</caption>
            <thead className="bg-sea-soft">
              <tr>
                <th className="p-1.5">Panel</th>
                {st && st.offsetFromEdge && <th className={th}>Middle, from the {st.offsetFromEdge} ({u('length')})</th>}
                <th className={th}>Long × short side ({u('length')})</th>
                <th className={th}>Net pressure, least–greatest, + towards side B ({u('pressure')})</th>
                <th className={th}>Bending stress ({STRESS_UNIT[system]})</th>
                <th className="p-1.5">Utilisation of allowable</th>
              </tr>
            </thead>
            <tbody>
              {b.plating.panels.map((p, i) => (
                <tr key={i} className={`border-t border-line ${p.utilisation > 1 ? 'bg-danger-soft' : ''}`} data-testid="plating-panel">
                  <td className="p-1.5">{i + 1}</td>
                  {st && st.offsetFromEdge && <td className={td}>{num(p.offsetM, 'length', system, 3)}</td>}
                  <td className={td}>
                    {num(p.longSideM, 'length', system, 3)} × {num(p.shortSideM, 'length', system, 3)}
                  </td>
                  <td className={td}>
                    {num(p.pressureMinPa, 'pressure', system)} – {num(p.pressureMaxPa, 'pressure', system)}
                  </td>
                  <td className={td}>{formatStress(p.stressPa, system, 4, false)}</td>
                  <UtilCell value={p.utilisation} />
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        </div>
      )}

      {b.shores.length > 0 && (
        <div className="overflow-x-auto" tabIndex={0} role="region" aria-label="Shores (scrolls sideways)">
          <table className="w-full min-w-[44rem] border-collapse text-left text-sm" data-testid="shore-table">
            <caption className="text-left font-bold">Shores, checked as columns</caption>
            <thead className="bg-sea-soft">
              <tr>
                <th className="p-1.5">No.</th>
                <th className="p-1.5">Bears on</th>
                <th className={th}>Axial load, compression ({u('force')})</th>
                <th className={th}>Design capacity ({u('force')})</th>
                <th className="p-1.5">Design method</th>
                <th className={th}>Slenderness</th>
                <th className={th}>Euler (elastic) buckling load ({u('force')})</th>
                <th className="p-1.5">Utilisation of design capacity</th>
              </tr>
            </thead>
            <tbody>
              {b.shores.map((s, i) => (
                <tr key={s.id} className={`border-t border-line ${s.utilisation > 1 ? 'bg-danger-soft' : ''}`}>
                  <td className="p-1.5">
                    {i + 1}
                    {!s.loaded && <span className="block text-xs text-ink-soft">not loaded</span>}
                    {s.slender && (
                      <span className="block text-xs text-caution">
                        length {s.lengthToLeastDimension?.toFixed(0)} × thickness (common practice ≤ 30)
                      </span>
                    )}
                  </td>
                  <td className="p-1.5">
                    {BEARS_ON[s.bearsOn]}
                    {s.tributaryAreaM2 !== null && <span className="block text-xs text-ink-soft">{fmt(s.tributaryAreaM2, 'area', system)} of plate</span>}
                  </td>
                  <td className={td}>{num(s.axialLoadN, 'force', system)}</td>
                  <td className={td} data-testid="shore-design-capacity">
                    {num(s.designCapacityN, 'force', system)}
                  </td>
                  <td className="p-1.5 text-xs">{s.designMethodLabel}</td>
                  <td className={td}>
                    {s.slendernessName} {s.slenderness.toFixed(0)}
                    {s.columnStabilityFactor !== null && <span className="block text-xs">Cp {s.columnStabilityFactor.toFixed(3)}</span>}
                    {s.slendernessExceeded && <span className="block text-xs font-bold text-danger">over {s.slendernessLimit}</span>}
                  </td>
                  <td className={td}>
                    {num(s.eulerLoadN, 'force', system)}
                    <span className="block text-xs text-ink-soft">{percent(s.eulerRatio)} of it</span>
                  </td>
                  <UtilCell value={s.utilisation} />
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
