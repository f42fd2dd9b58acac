/**
 * Saves a form to the device store shortly after each change, once it validates: loads update as the
 * surveyor types, and a value that fails validation stays in the field (never lost, never saved).
 *
 * Nothing typed is lost to the pause: an edit still waiting for it is saved at once when the form goes
 * away (the surveyor taps another section or item), when the page is hidden or closed (`pagehide`,
 * `visibilitychange`: a phone may kill a hidden tab without another event) and when the link drops
 * (`offline`: the surveyor may put the phone away next). Saves run one after another, in the order
 * typed, so an older value never lands after a newer one.
 *
 * A form is filled from the survey as it was when it opened, which may be older than the device's
 * copy by the time it saves (a section reopened before the save of the one just left had landed).
 * So `save` gets, beside the value, its `base`: the form's starting values as the same resolver turns
 * them into the model, then each value saved. Sections hand both to `apply`, and only what changed
 * since `base` is written (client/src/offline/rebase-edit.ts): untouched fields never put older values back.
 */
import { useEffect, useRef, useState } from 'react';
import type { FieldValues, UseFormReturn } from 'react-hook-form';

/**
 * The form's default values as its resolver turns them into the model; undefined when they do not
 * validate (a stored document the form's stricter rules refuse), and then the whole value is saved.
 */
async function resolvedDefaults<FV extends FieldValues, Out>(form: UseFormReturn<FV, unknown, Out>): Promise<Out | undefined> {
  const { resolver, context } = form.control._options;
  if (!resolver) return undefined;
  try {
    const r = await resolver(structuredClone(form.control._defaultValues) as unknown as FV, context, { fields: {}, names: [], criteriaMode: 'firstError', shouldUseNativeValidation: false });
    return Object.keys(r.errors).length === 0 ? (r.values as Out) : undefined;
  } catch {
    return undefined;
  }
}

export type SaveState = 'idle' | 'pending' | 'saved' | 'invalid' | 'error';

export function useAutosave<FV extends FieldValues, Out>(
  form: UseFormReturn<FV, unknown, Out>,
  save: (value: Out, base: Out | undefined) => Promise<void> | void,
  delayMs = 250,
): SaveState {
  const [state, setState] = useState<SaveState>('idle');
  const saveRef = useRef(save);
  useEffect(() => {
    saveRef.current = save;
  });
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    let waiting = false;
    /** Edits seen so far; a save reports "saved" only if nothing was typed after it started. */
    let edits = 0;
    let chain: Promise<void> = Promise.resolve();
    /** What the device got from this form so far: its starting values, then each value saved. */
    let base: Promise<Out | undefined> = resolvedDefaults(form);
    /** `now`: the page is going away; start at once (the device store notes the edit before its first wait), not after earlier saves. */
    const saveNow = (now = false) => {
      clearTimeout(timer);
      timer = undefined;
      if (!waiting) return;
      waiting = false;
      const startedAt = edits;
      const current = () => startedAt === edits;
      const submit = () =>
        form.handleSubmit(
          async (v) => {
            try {
              await saveRef.current(v, await base);
              base = Promise.resolve(v);
              if (current()) setState('saved');
            } catch {
              if (current()) setState('error');
            }
          },
          () => {
            if (current()) setState('invalid');
          },
        )();
      if (now) void submit();
      else chain = chain.then(submit);
    };
    const saveSoon = () => saveNow();
    const saveAtOnce = () => saveNow(true);
    const sub = form.watch((_values, info) => {
      if (!info.name) return;
      edits += 1;
      waiting = true;
      setState('pending');
      clearTimeout(timer);
      timer = setTimeout(saveSoon, delayMs);
    });
    const onVisibility = () => {
      if (document.visibilityState === 'hidden') saveAtOnce();
    };
    window.addEventListener('pagehide', saveAtOnce);
    window.addEventListener('offline', saveSoon);
    document.addEventListener('visibilitychange', onVisibility);
    return () => {
      window.removeEventListener('pagehide', saveAtOnce);
      window.removeEventListener('offline', saveSoon);
      document.removeEventListener('visibilitychange', onVisibility);
      sub.unsubscribe();
      saveSoon();
    };
  }, [form, delayMs]);
  return state;
}
