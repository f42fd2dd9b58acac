/**
 * Conflicts to settle: the same thing changed on two devices since they last synced. Shows both
 * values side by side — the one the survey keeps for now and the one the other edit proposed — and
 * lets the user choose. The choice applies on this device at once and syncs like any edit.
 */
import { useEffect, useState } from 'react';
import { Button } from '@client/components/ui/button';
import { describeTarget } from '@client/offline/describe';
import { getDeviceId, type LocalConflict } from '@client/offline/db';
import { resolveConflict, useAllOpenConflicts, useConflicts } from '@client/offline/survey-store';

function show(value: unknown): string {
  if (value === null || value === undefined) return '(deleted)';
  if (typeof value === 'string') return value || '(empty)';
  if (typeof value === 'number' || typeof value === 'boolean') return String(value);
  const named = value as { name?: unknown };
  const text = JSON.stringify(value, null, 1);
  const short = text.length > 240 ? `${text.slice(0, 240)}…` : text;
  return typeof named.name === 'string' ? `“${named.name}” ${short}` : short;
}

function ConflictItem({ c, deviceId }: { c: LocalConflict; deviceId: string | undefined }) {
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const mineProposed = c.proposedDeviceId === deviceId;
  const entity = c.target.kind === 'field' ? undefined : (c.kept ?? c.proposed);
  const choose = async (value: unknown) => {
    setBusy(true);
    setError(null);
    try {
      await resolveConflict(c.id, value);
    } catch (err) {
      setError(err instanceof Error ? err.message : 'This choice could not be saved.');
    } finally {
      setBusy(false);
    }
  };
  const options = [
    { key: 'kept', label: 'Kept now', who: c.keptBy?.name ?? 'another device', value: c.kept, mine: !mineProposed && c.keptBy === null },
    { key: 'proposed', label: mineProposed ? 'Your edit' : 'Other edit', who: c.proposedBy.name, value: c.proposed, mine: mineProposed },
  ];
  return (
    <li className="rounded-lg border-2 border-caution bg-caution-soft p-3 text-ink" data-testid="conflict">
      <p className="font-bold">Changed on two devices: {describeTarget(c.target, entity)}</p>
      <div className="mt-2 grid gap-2">
        {options.map((o) => (
          <div key={o.key} className="rounded border border-line bg-card p-2" data-testid={`conflict-${o.key}`}>
            <p className="text-sm text-ink-soft">
              {o.label} — {o.who}
            </p>
            <p className="my-1 break-words font-mono text-sm whitespace-pre-wrap">{show(o.value)}</p>
            <Button tone="secondary" disabled={busy} onClick={() => void choose(o.value)}>
              Keep this
            </Button>
          </div>
        ))}
      </div>
      {error && (
        <p className="mt-2 text-danger" role="alert">
          {error}
        </p>
      )}
    </li>
  );
}

/** The open conflicts of one survey, or of every survey on the device when `surveyId` is not given. */
export function ConflictList({ surveyId }: { surveyId?: string }) {
  const one = useConflicts(surveyId);
  const all = useAllOpenConflicts();
  const [deviceId, setDeviceId] = useState<string>();
  useEffect(() => {
    void getDeviceId().then(setDeviceId);
  }, []);
  const list = surveyId ? one : all;
  if (!list || list.length === 0) return null;
  return (
    <section aria-label="Conflicts to settle" className="mt-2">
      <p className="font-bold">
        {list.length === 1 ? 'One change needs' : `${list.length} changes need`} your choice — nothing has been overwritten.
      </p>
      <ul className="mt-2 space-y-2" data-testid="conflict-list">
        {list.map((c) => (
          <ConflictItem key={c.id} c={c} deviceId={deviceId} />
        ))}
      </ul>
    </section>
  );
}
