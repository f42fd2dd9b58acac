/**
 * The server's stored recomputation beside the numbers this device works out from the same
 * document, with a clear mark where they differ beyond 1e-9 relative or come from different
 * engine versions.
 */
import type { SurveyResults } from '@shared/engine';
import { RELATIVE_TOLERANCE, type ResultsAgreement } from '@shared/review/compare';
import type { UnitSystem } from '@shared/units/units';
import { fmt } from '@client/lib/unit-system';
import { countWords } from '@shared/review/plain-words';
import { mismatchWords } from '@shared/review/mismatch-words';

export interface DeviceNumbers {
  results: SurveyResults | null;
  error: string | null;
}

export function NumbersCheck({
  device,
  server,
  agreement,
  serverRevision,
  revision,
  system,
}: {
  device: DeviceNumbers;
  server: SurveyResults | null;
  agreement: ResultsAgreement | null;
  serverRevision: number | null;
  revision: number;
  system: UnitSystem;
}) {
  const stale = serverRevision !== null && serverRevision !== revision;
  let verdict: { cls: string; icon: string; text: string; state: string };
  if (!server) verdict = { cls: 'border-caution bg-caution-soft', icon: '◆', text: 'The server has not stored results for this survey yet.', state: 'missing' };
  else if (device.error) verdict = { cls: 'border-danger bg-danger-soft', icon: '▲', text: `This device could not compute the survey: ${device.error}`, state: 'error' };
  else if (agreement?.agree && !stale) verdict = { cls: 'border-ok bg-ok-soft', icon: '●', text: 'Device and server agree on every number.', state: 'agree' };
  else if (agreement && !agreement.sameEngine)
    verdict = {
      cls: 'border-danger bg-danger-soft',
      icon: '▲',
      text: `Engine versions differ: server ${agreement.engineA ?? '?'}, this device ${agreement.engineB ?? '?'}.`,
      state: 'engine',
    };
  else if (stale) verdict = { cls: 'border-caution bg-caution-soft', icon: '◆', text: `The server’s results are for revision ${serverRevision}; the survey is at ${revision}.`, state: 'stale' };
  else verdict = { cls: 'border-danger bg-danger-soft', icon: '▲', text: `${countWords(agreement?.mismatches.length ?? 0, 'number differs', 'numbers differ')} between device and server.`, state: 'differ' };

  const rows = server?.boundaries.map((sb) => {
    const db = device.results?.boundaries.find((b) => b.id === sb.id);
    const differs = agreement?.mismatches.some((m) => m.path.startsWith(`boundaries[id=${sb.id}]`)) ?? false;
    // signed as in the results table (+ towards side B), so the two never disagree in sign
    return { id: sb.id, name: sb.name, server: sb.net.forceN, device: db?.net.forceN ?? null, differs };
  });

  return (
    <section aria-labelledby="numbers-check-h" className="rounded-lg border border-line bg-card p-3" data-testid="numbers-check" data-state={verdict.state}>
      <h2 id="numbers-check-h" className="text-lg">Device and server</h2>
      <p className={`mt-2 flex gap-2 rounded border-2 p-2 font-bold ${verdict.cls}`} data-testid="numbers-verdict">
        <span aria-hidden="true">{verdict.icon}</span>
        {verdict.text}
      </p>
      <p className="mt-1 text-xs text-ink-soft">
        Tolerance: 1 part in 10<sup>{Math.round(-Math.log10(RELATIVE_TOLERANCE))}</sup>. Server engine {server?.engineVersion ?? '—'}
        {serverRevision !== null ? `, revision ${serverRevision}` : ''}; this device {device.results?.engineVersion ?? '—'}.
      </p>
      {rows && rows.length > 0 && (
        <div className="mt-2 overflow-x-auto" tabIndex={0} role="region" aria-label="Device and server figures (scrolls sideways)">
          <table className="w-full text-sm">
            <thead>
              <tr className="text-left text-xs uppercase text-ink-soft">
                <th className="py-1 pr-2">Net force, + towards side B</th>
                <th className="py-1 pr-2 text-right">Server</th>
                <th className="py-1 pr-2 text-right">Device</th>
                <th className="py-1 text-right">
                  <span className="sr-only">Match</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id} className={`border-t border-line ${r.differs ? 'bg-danger-soft font-bold' : ''}`} data-differs={r.differs}>
                  <td className="py-1 pr-2">{r.name}</td>
                  <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">{fmt(r.server, 'force', system)}</td>
                  <td className="whitespace-nowrap py-1 pr-2 text-right tabular-nums">{fmt(r.device, 'force', system)}</td>
                  <td className="py-1 text-right">{r.differs ? <span title="differs">▲ differs</span> : <span aria-label="same">=</span>}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {agreement && agreement.mismatches.length > 0 && (
        <details className="mt-2 text-sm">
          <summary className="cursor-pointer font-bold">Every differing number ({agreement.mismatches.length})</summary>
          <ul className="mt-1 max-h-60 space-y-1 overflow-auto text-sm" tabIndex={0} aria-label="Every differing number (scrolls)" data-testid="differing-numbers">
            {agreement.mismatches.map((m) => {
              const w = mismatchWords(m, server, device.results, system);
              return (
                <li key={m.path} className="break-words">
                  <span className="font-bold">{w.where}</span>: {w.what}. Server <span className="tabular-nums">{w.a}</span>, device <span className="tabular-nums">{w.b}</span>
                </li>
              );
            })}
          </ul>
        </details>
      )}
    </section>
  );
}
