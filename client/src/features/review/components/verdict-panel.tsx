/** The engineer's verdict on the survey as a whole and on each boundary. */
import { useEffect, useRef, useState } from 'react';
import {
  BOUNDARY_VERDICT_LABELS,
  BOUNDARY_VERDICTS,
  SURVEY_VERDICT_LABELS,
  SURVEY_VERDICTS,
  type BoundaryVerdictValue,
  type SurveyVerdictValue,
  type Verdict,
} from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import { verdictSeverity } from '@shared/review/words';
import { useSetVerdict } from '../api/set-verdict';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';

const SEVERITY_CLS = ['border-ok bg-ok-soft', 'border-caution bg-caution-soft', 'border-danger bg-danger-soft', 'border-danger bg-danger-soft'];

/**
 * A field's text as typed, over the value the server holds. A newer server value replaces the text
 * only while nothing was typed since the last one arrived, so a save that returns (or another
 * reviewer's refresh) never wipes what was typed after it was sent.
 */
function useDraft(server: string): [string, (v: string) => void] {
  const [draft, setDraft] = useState(server);
  const [base, setBase] = useState(server);
  if (server !== base) {
    setBase(server);
    if (draft === base) setDraft(server);
  }
  return [draft, setDraft];
}

function BoundaryVerdictRow({ surveyId, boundary, current, editable }: { surveyId: string; boundary: { id: string; name: string }; current?: Verdict; editable: boolean }) {
  const set = useSetVerdict(surveyId, boundary.id);
  const [note, setNote] = useDraft(current?.note ?? '');
  const [value, setValue] = useDraft(current?.verdict ?? '');
  /** What was last sent, so a note is saved once, and saved when the row goes away before its blur. */
  const sent = useRef({ verdict: current?.verdict ?? '', note: current?.note ?? '' });
  const send = (verdict: string, text: string) => {
    if (!verdict || (verdict === sent.current.verdict && text === sent.current.note)) return;
    sent.current = { verdict, note: text };
    set.mutate({ scope: 'boundary', boundaryId: boundary.id, verdict: verdict as BoundaryVerdictValue, note: text || undefined });
  };
  const latest = useRef(() => {});
  latest.current = () => send(value, note);
  useEffect(() => () => latest.current(), []);
  return (
    <li className={`rounded border-2 p-2 ${current ? SEVERITY_CLS[verdictSeverity(current.verdict)] : 'border-line'}`} data-testid="boundary-verdict" data-boundary={boundary.name}>
      <label className="block font-bold" htmlFor={`bv-${boundary.id}`}>
        {boundary.name}
      </label>
      <div className="mt-1 flex flex-wrap gap-2">
        <select
          id={`bv-${boundary.id}`}
          className={`${inputCls} flex-1`}
          value={value}
          disabled={!editable}
          onChange={(e) => {
            setValue(e.target.value);
            send(e.target.value, note);
          }}
        >
          <option value="">No verdict</option>
          {BOUNDARY_VERDICTS.map((v) => (
            <option key={v} value={v}>
              {BOUNDARY_VERDICT_LABELS[v]}
            </option>
          ))}
        </select>
      </div>
      <input
        aria-label={`Note on ${boundary.name}`}
        className={`${inputCls} mt-1 text-sm`}
        placeholder="Note (optional, saved with the verdict)"
        value={note}
        disabled={!editable}
        onChange={(e) => setNote(e.target.value)}
        onBlur={() => send(value, note)}
      />
      {set.isError && <p role="alert" className="text-sm text-danger">{set.error.message}</p>}
    </li>
  );
}

export function VerdictPanel({ surveyId, doc, verdicts, editable }: { surveyId: string; doc: Survey; verdicts: Verdict[]; editable: boolean }) {
  const set = useSetVerdict(surveyId, 'survey');
  const surveyVerdict = verdicts.find((v) => v.scope === 'survey');
  const [note, setNote] = useDraft(surveyVerdict?.note ?? '');
  const [choiceText, setChoice] = useDraft(surveyVerdict?.verdict ?? '');
  const choice = choiceText as SurveyVerdictValue | '';
  return (
    <section aria-labelledby="verdicts-h" className="rounded-lg border border-line bg-card p-3">
      <h2 id="verdicts-h" className="text-lg">
        Verdicts
      </h2>
      {!editable && <p className="mt-1 text-sm text-ink-soft">Verdicts are set while the survey is under review.</p>}
      <form
        className="mt-2 flex flex-col gap-2"
        onSubmit={(e) => {
          e.preventDefault();
          if (choice) set.mutate({ scope: 'survey', verdict: choice, note: note || undefined });
        }}
      >
        <label className="font-bold" htmlFor="survey-verdict">
          On the survey as a whole
        </label>
        <select
          id="survey-verdict"
          className={inputCls}
          value={choice}
          disabled={!editable}
          onChange={(e) => setChoice(e.target.value as SurveyVerdictValue)}
        >
          <option value="">Choose…</option>
          {SURVEY_VERDICTS.map((v) => (
            <option key={v} value={v}>
              {SURVEY_VERDICT_LABELS[v]}
            </option>
          ))}
        </select>
        <textarea aria-label="Note on the survey verdict" className={`${inputCls} py-2`} rows={2} placeholder="Note (optional)" value={note} disabled={!editable} onChange={(e) => setNote(e.target.value)} />
        <button type="submit" className={buttonClass('primary', 'self-start')} disabled={!editable || !choice || set.isPending}>
          Save survey verdict
        </button>
        {surveyVerdict && (
          <p className="text-sm" data-testid="survey-verdict-saved">
            Saved: <strong>{SURVEY_VERDICT_LABELS[surveyVerdict.verdict as SurveyVerdictValue] ?? surveyVerdict.verdict}</strong> by {surveyVerdict.setByName}
          </p>
        )}
        {set.isError && <p role="alert" className="text-danger">{set.error.message}</p>}
      </form>
      <h3 className="mt-4 font-bold">On each boundary</h3>
      <ul className="mt-2 space-y-2">
        {doc.boundaries.map((b) => (
          <BoundaryVerdictRow
            key={b.id}
            surveyId={surveyId}
            boundary={b}
            current={verdicts.find((v) => v.scope === 'boundary' && v.boundaryId === b.id)}
            editable={editable}
          />
        ))}
      </ul>
    </section>
  );
}
