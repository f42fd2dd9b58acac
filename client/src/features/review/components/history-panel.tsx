/** Every revision with who changed what and when, and the comparison of any two revisions' results. */
import { useState } from 'react';
import type { FieldChange } from '@shared/api/review';
import type { UnitSystem } from '@shared/units/units';
import { fmt } from '@client/lib/unit-system';
import { UtilisationBadge } from '@client/features/results/components/utilisation';
import { useCompare, useRevisions } from '../api/history';
import { inputCls } from '@client/components/ui/fields';

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' }) + ' UTC';

function show(v: unknown): string {
  if (v === null || v === undefined) return '—';
  const s = typeof v === 'string' ? v : JSON.stringify(v);
  return s.length > 60 ? `${s.slice(0, 57)}…` : s;
}

function ChangeRow({ c, names }: { c: FieldChange; names: Map<string, string> }) {
  const who = c.entity === 'survey' || c.entity === 'vessel' ? c.entity : `${c.entity} ${names.get(c.entityId ?? '') ?? (c.entityId ?? '').slice(0, 8)}`;
  return (
    <li className="break-words">
      <span className="font-bold">{who}</span> · <span className="font-mono text-xs">{c.field}</span>: {show(c.old)} → <strong>{show(c.new)}</strong>
    </li>
  );
}

/** One end of the revision comparison. */
function RevisionSelect(props: { label: string; revisions: { revision: number }[]; value: number | null | undefined; onChange: (revision: number) => void }) {
  return (
    <label className="flex flex-col text-sm font-bold">
      {props.label}
      <select className={inputCls} value={props.value ?? ''} onChange={(e) => props.onChange(Number(e.target.value))}>
        {props.revisions.map((r) => (
          <option key={r.revision} value={r.revision}>
            Revision {r.revision}
          </option>
        ))}
      </select>
    </label>
  );
}

export function HistoryPanel({ surveyId, names, system }: { surveyId: string; names: Map<string, string>; system: UnitSystem }) {
  const revisions = useRevisions(surveyId);
  const list = revisions.data?.revisions ?? [];
  const [a, setA] = useState<number | null>(null);
  const [b, setB] = useState<number | null>(null);
  const ra = a ?? (list.length > 1 ? list[list.length - 2]!.revision : null);
  const rb = b ?? (list.length > 0 ? list[list.length - 1]!.revision : null);
  const compare = useCompare(surveyId, ra, rb);

  return (
    <section aria-labelledby="history-h" className="space-y-3">
      <h2 id="history-h" className="text-lg">
        History
      </h2>
      {revisions.isPending && <p>Loading…</p>}
      {revisions.isError && <p role="alert">{revisions.error.message}</p>}
      {list.length > 1 && (
        <div className="rounded-lg border border-line bg-card p-3">
          <h3 className="font-bold">Compare the results of two revisions</h3>
          <div className="mt-2 flex flex-wrap items-end gap-2">
            <RevisionSelect label="From" revisions={list} value={ra} onChange={setA} />
            <RevisionSelect label="To" revisions={list} value={rb} onChange={setB} />
          </div>
          {compare.isError && <p role="alert">{compare.error.message}</p>}
          {compare.data && (
            <div className="mt-2 overflow-x-auto" data-testid="revision-compare" tabIndex={0} role="region" aria-label="Revision comparison (scrolls sideways)">
              <p className="text-sm text-ink-soft">
                {compare.data.differenceCount} numbers differ. Engines: {compare.data.a.engineVersion ?? '—'} / {compare.data.b.engineVersion ?? '—'}.
              </p>
              <table className="mt-1 w-full text-sm">
                <thead>
                  <tr className="text-left text-xs uppercase text-ink-soft">
                    <th className="py-1 pr-2">Boundary</th>
                    <th className="py-1 pr-2 text-right">Net load {compare.data.a.revision}</th>
                    <th className="py-1 pr-2 text-right">Net load {compare.data.b.revision}</th>
                    <th className="py-1 text-right">Utilisation</th>
                  </tr>
                </thead>
                <tbody>
                  {compare.data.boundaries.map((row) => (
                    <tr key={row.boundaryId} className="border-t border-line">
                      <td className="py-1 pr-2">{row.name}</td>
                      <td className="py-1 pr-2 text-right tabular-nums">{row.a ? fmt(row.a.netForceN, 'force', system) : 'absent'}</td>
                      <td className="py-1 pr-2 text-right tabular-nums">{row.b ? fmt(row.b.netForceN, 'force', system) : 'absent'}</td>
                      <td className="py-1 text-right">{row.b ? <UtilisationBadge value={row.b.maxUtilisation} compact /> : '—'}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </div>
      )}
      <ol className="space-y-2" data-testid="revision-list">
        {[...list].reverse().map((r) => (
          <li key={r.revision} className="rounded-lg border border-line bg-card p-3">
            <p className="font-bold">
              Revision {r.revision} · {r.authorName ?? 'unknown'} · {when(r.at)}
            </p>
            {r.changes.length === 0 ? (
              <p className="text-sm text-ink-soft">No field changes recorded.</p>
            ) : (
              <ul className="mt-1 space-y-0.5 text-sm">
                {r.changes.slice(0, 40).map((c, i) => (
                  <ChangeRow key={i} c={c} names={names} />
                ))}
                {r.changes.length > 40 && <li className="text-ink-soft">…and {r.changes.length - 40} more</li>}
              </ul>
            )}
          </li>
        ))}
      </ol>
    </section>
  );
}
