/** Operating limits: structured entries said in plain words, plus free text. */
import { useState, type FormEvent } from 'react';
import { LIMIT_KIND_LABELS, type LimitRule, type OperatingLimit } from '@shared/api/review';
import type { Survey } from '@shared/schemas/survey';
import type { UnitSystem } from '@shared/units/units';
import { describeLimit, namesFromSurvey } from '@shared/review/words';
import { fromDisplay, unitLabel } from '@client/lib/unit-system';
import { useAddLimit, useRemoveLimit } from '../api/limits';
import { buttonClass } from '@client/components/ui/button';
import { inputCls } from '@client/components/ui/fields';

type Kind = LimitRule['kind'];
const KINDS = Object.keys(LIMIT_KIND_LABELS) as Kind[];

export function LimitsPanel({ surveyId, doc, limits, editable, system }: { surveyId: string; doc: Survey; limits: OperatingLimit[]; editable: boolean; system: UnitSystem }) {
  const add = useAddLimit(surveyId);
  const remove = useRemoveLimit(surveyId);
  const [kind, setKind] = useState<Kind>('keep_level_above');
  const [compartmentId, setCompartmentId] = useState(doc.compartments[0]?.id ?? '');
  const [boundaryId, setBoundaryId] = useState(doc.boundaries[0]?.id ?? '');
  const [value, setValue] = useState('');
  const [text, setText] = useState('');
  const names = namesFromSurvey(doc);
  const needsCompartment = kind === 'keep_level_above' || kind === 'keep_level_below' || kind === 'no_pumping_until_shored';
  const needsBoundary = kind === 'no_pumping_until_shored' || kind === 'max_net_pressure';
  const needsValue = kind === 'keep_level_above' || kind === 'keep_level_below' || kind === 'max_net_pressure';

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const v = Number(value.replace(',', '.'));
    let rule: LimitRule;
    switch (kind) {
      case 'keep_level_above':
      case 'keep_level_below':
        rule = { kind, compartmentId, levelM: fromDisplay(v, 'length', system) };
        break;
      case 'no_pumping_until_shored':
        rule = { kind, compartmentId, boundaryId };
        break;
      case 'max_net_pressure':
        rule = { kind, boundaryId, pressurePa: fromDisplay(v, 'pressure', system) };
        break;
      default:
        rule = { kind: 'text' };
    }
    add.mutate({ rule, text: text || undefined }, { onSuccess: () => (setValue(''), setText('')) });
  };

  return (
    <section aria-labelledby="limits-h" className="rounded-lg border border-line bg-card p-3">
      <h2 id="limits-h" className="text-lg">
        Operating limits
      </h2>
      {limits.length === 0 ? (
        <p className="mt-1 text-sm text-ink-soft">No limits set.</p>
      ) : (
        <ol className="mt-2 list-decimal space-y-2 pl-5" data-testid="limit-list">
          {limits.map((l) => (
            <li key={l.id}>
              <span className="font-bold">{describeLimit(l, names, system)}</span>
              <span className="block text-xs text-ink-soft">set by {l.createdByName}</span>
              {editable && (
                <button type="button" className={buttonClass('danger-link')} onClick={() => remove.mutate(l.id)} disabled={remove.isPending}>
                  Remove
                </button>
              )}
            </li>
          ))}
        </ol>
      )}
      {editable && (
        <form onSubmit={submit} className="mt-3 flex flex-col gap-2 border-t border-line pt-3" data-testid="limit-form">
          <label className="text-sm font-bold" htmlFor="limit-kind">
            New limit
          </label>
          <select id="limit-kind" className={inputCls} value={kind} onChange={(e) => setKind(e.target.value as Kind)}>
            {KINDS.map((k) => (
              <option key={k} value={k}>
                {LIMIT_KIND_LABELS[k]}
              </option>
            ))}
          </select>
          {needsCompartment && (
            <>
              <label className="text-sm font-bold" htmlFor="limit-compartment">
                Compartment
              </label>
              <select id="limit-compartment" className={inputCls} value={compartmentId} onChange={(e) => setCompartmentId(e.target.value)}>
                {doc.compartments.map((c) => (
                  <option key={c.id} value={c.id}>
                    {c.name}
                  </option>
                ))}
              </select>
            </>
          )}
          {needsBoundary && (
            <>
              <label className="text-sm font-bold" htmlFor="limit-boundary">
                Boundary
              </label>
              <select id="limit-boundary" className={inputCls} value={boundaryId} onChange={(e) => setBoundaryId(e.target.value)}>
                {doc.boundaries.map((b) => (
                  <option key={b.id} value={b.id}>
                    {b.name}
                  </option>
                ))}
              </select>
            </>
          )}
          {needsValue && (
            <>
              <label className="text-sm font-bold" htmlFor="limit-value">
                {kind === 'max_net_pressure' ? `Pressure (${unitLabel('pressure', system)})` : `Level over the baseline (${unitLabel('length', system)})`}
              </label>
              <input id="limit-value" className={inputCls} inputMode="decimal" value={value} onChange={(e) => setValue(e.target.value)} required pattern="-?[0-9]+([.,][0-9]+)?" />
            </>
          )}
          <label className="text-sm font-bold" htmlFor="limit-text">
            {kind === 'text' ? 'The limit, in words' : 'More words (optional)'}
          </label>
          <textarea id="limit-text" className={`${inputCls} py-2`} rows={2} value={text} onChange={(e) => setText(e.target.value)} required={kind === 'text'} />
          <button type="submit" className={buttonClass('primary', 'self-start')} disabled={add.isPending}>
            Add limit
          </button>
          {add.isError && <p role="alert" className="text-danger">{add.error.message}</p>}
        </form>
      )}
    </section>
  );
}
