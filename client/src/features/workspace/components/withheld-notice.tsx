/**
 * What the loads are waiting for: each plate or space whose loads rest on a reading not entered yet,
 * and the readings to enter. Shown above the results so an empty table is never read as "no load".
 */
import { useSearchParams } from 'react-router';
import { joinWords, withheldSentence, type SurveyResults } from '@shared/engine';
import { secondaryBtn } from '@client/components/ui/fields';

export function WithheldNotice({ results }: { results: SurveyResults }) {
  const [, setParams] = useSearchParams();
  const ship = results.frame.missingReadings ?? [];
  const withheld = results.withheld ?? [];
  if (ship.length === 0 && withheld.length === 0) return null;
  return (
    <section aria-label="Readings needed" className="space-y-2 rounded-lg border-2 border-caution bg-caution-soft p-3" data-testid="withheld-notice">
      <h3 className="text-lg font-bold">Readings needed before these loads show</h3>
      {ship.length > 0 && (
        <p>
          Enter the {joinWords(ship)} under Readings: every liquid level, and the sea against the shell, rests on them.{' '}
          <button type="button" className={`${secondaryBtn} mt-1`} onClick={() => setParams({ s: 'readings' }, { replace: true })}>
            Go to Readings
          </button>
        </p>
      )}
      <ul className="list-disc space-y-0.5 pl-5 text-sm">
        {withheld.map((w) => (
          <li key={w.entityId}>{withheldSentence(w)}</li>
        ))}
      </ul>
    </section>
  );
}
