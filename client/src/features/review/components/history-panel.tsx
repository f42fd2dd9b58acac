/**
 * The survey's history in plain words (shared/review/change-words.ts): each sitting of one person is one
 * entry, its saves merged; each line links to the inputs it changed. Below it, the comparison of any two
 * revisions' results.
 */
import { useMemo, useState } from 'react';
import type { UnitSystem } from '@shared/units/units';
import type { CompareResponse } from '@shared/api/review';
import { changeLineText, changeWords, groupSittings, type ChangeLine, type Sitting } from '@shared/review/change-words';
import { countWords } from '@shared/review/plain-words';
import { formatUtcSpan } from '@shared/review/time-words';
import { fmt } from '@client/lib/unit-system';
import { UtilisationBadge } from '@client/features/results/components/utilisation';
import { useCompare, useRevisions } from '../api/history';
import { inputCls } from '@client/components/ui/fields';
import { useVirtualWindow } from '@client/components/ui/use-virtual-window';
import type { InputTarget } from '@client/features/survey-inputs/components/survey-inputs';

function SittingEntry({ s, words, onShowInput }: { s: Sitting; words: (s: Sitting) => ChangeLine[]; onShowInput?: (t: InputTarget) => void }) {
  const lines = words(s);
  const revisions = s.firstRevision === s.lastRevision ? `revision ${s.firstRevision}` : `revisions ${s.firstRevision}–${s.lastRevision}, ${countWords(s.revisionCount, 'save')}`;
  return (
    <li className="rounded-lg border border-line bg-card p-3" data-testid="history-entry">
      <p className="font-bold">
        {s.authorName ?? 'Someone no longer in the firm'} · {formatUtcSpan(s.from, s.to)}
      </p>
      <p className="text-xs text-ink-soft">{revisions}</p>
      {lines.length === 0 ? (
        <p className="text-sm text-ink-soft">Nothing changed in the end (edits undone in the same sitting).</p>
      ) : (
        <ul className="mt-1 space-y-0.5 text-sm">
          {lines.slice(0, 40).map((l, i) => {
            const t = l.target;
            const linkable = onShowInput && t && t.id && (t.kind === 'compartment' || t.kind === 'boundary' || t.kind === 'condition');
            return (
              <li key={i} className="break-words">
                {changeLineText(l)}
                {linkable && (
                  <>
                    {' '}
                    <button type="button" className="text-sea underline" onClick={() => onShowInput({ kind: t.kind as InputTarget['kind'], id: t.id! })}>
                      see inputs
                    </button>
                  </>
                )}
              </li>
            );
          })}
          {lines.length > 40 && <li className="text-ink-soft">…and {countWords(lines.length - 40, 'more change')}</li>}
        </ul>
      )}
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

/** Every boundary's net load in both revisions: a long ship's thousands of rows render only those in view. */
function RevisionCompareTable({ compare, system }: { compare: CompareResponse; system: UnitSystem }) {
  const rows = compare.boundaries;
  const { scroller, virtual, indices, padTop, padBottom } = useVirtualWindow({ count: rows.length, estimatePx: 33 });
  return (
    <div ref={scroller} className={virtual ? 'max-h-[60vh] overflow-y-auto' : undefined} tabIndex={virtual ? 0 : undefined} role={virtual ? 'region' : undefined} aria-label={virtual ? `Net loads of ${countWords(rows.length, 'boundary', 'boundaries')} (scrolls)` : undefined}>
      <table className="mt-1 w-full text-sm">
        <thead>
          <tr className="text-left text-xs uppercase text-ink-soft">
            <th className="py-1 pr-2">Boundary</th>
            <th className="py-1 pr-2 text-right">Net load {compare.a.revision}</th>
            <th className="py-1 pr-2 text-right">Net load {compare.b.revision}</th>
            <th className="py-1 text-right">Utilisation</th>
          </tr>
        </thead>
        <tbody>
          {padTop > 0 && <tr aria-hidden="true" style={{ height: padTop }} />}
          {indices.map((i) => {
            const row = rows[i];
            return (
              <tr key={row.boundaryId} className="border-t border-line">
                <td className="py-1 pr-2">{row.name}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{row.a ? fmt(row.a.netForceN, 'force', system) : 'absent'}</td>
                <td className="py-1 pr-2 text-right tabular-nums">{row.b ? fmt(row.b.netForceN, 'force', system) : 'absent'}</td>
                <td className="py-1 text-right">{row.b ? <UtilisationBadge value={row.b.maxUtilisation} compact /> : '—'}</td>
              </tr>
            );
          })}
          {padBottom > 0 && <tr aria-hidden="true" style={{ height: padBottom }} />}
        </tbody>
      </table>
    </div>
  );
}

export function HistoryPanel(props: {
  surveyId: string;
  names: ReadonlyMap<string, string>;
  system: UnitSystem;
  shipTimeOffsetMin?: number;
  onShowInput?: (t: InputTarget) => void;
}) {
  const { surveyId, names, system, shipTimeOffsetMin, onShowInput } = props;
  const revisions = useRevisions(surveyId);
  const list = revisions.data?.revisions ?? [];
  const [a, setA] = useState<number | null>(null);
  const [b, setB] = useState<number | null>(null);
  const ra = a ?? (list.length > 1 ? list[list.length - 2]!.revision : null);
  const rb = b ?? (list.length > 0 ? list[list.length - 1]!.revision : null);
  const compare = useCompare(surveyId, ra, rb);
  const sittings = useMemo(() => groupSittings(revisions.data?.revisions ?? []), [revisions.data]);
  const words = (st: Sitting) => st.changes.flatMap((c) => changeWords(c, { system, names, shipTimeOffsetMin }));

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
                {countWords(compare.data.differenceCount, 'number differs', 'numbers differ')}. Engines: {compare.data.a.engineVersion ?? '—'} / {compare.data.b.engineVersion ?? '—'}.
              </p>
              <RevisionCompareTable compare={compare.data} system={system} />
            </div>
          )}
        </div>
      )}
      <ol className="space-y-2" data-testid="revision-list">
        {[...sittings].reverse().map((st) => (
          <SittingEntry key={st.firstRevision} s={st} words={words} onShowInput={onShowInput} />
        ))}
      </ol>
    </section>
  );
}
