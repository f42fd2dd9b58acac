/**
 * Saves a form to the device store shortly after each change, once it validates: loads update as the
 * surveyor types, and a value that fails validation stays in the field (never lost, never saved).
 */
import { useEffect, useRef, useState } from 'react';
import type { FieldValues, UseFormReturn } from 'react-hook-form';

export type SaveState = 'idle' | 'pending' | 'saved' | 'invalid' | 'error';

export function useAutosave<FV extends FieldValues, Out>(
  form: UseFormReturn<FV, unknown, Out>,
  save: (value: Out) => Promise<void> | void,
  delayMs = 250,
): SaveState {
  const [state, setState] = useState<SaveState>('idle');
  const saveRef = useRef(save);
  useEffect(() => {
    saveRef.current = save;
  });
  useEffect(() => {
    let timer: ReturnType<typeof setTimeout> | undefined;
    const sub = form.watch((_values, info) => {
      if (!info.name) return;
      setState('pending');
      clearTimeout(timer);
      timer = setTimeout(() => {
        void form.handleSubmit(
          async (v) => {
            try {
              await saveRef.current(v);
              setState('saved');
            } catch {
              setState('error');
            }
          },
          () => setState('invalid'),
        )();
      }, delayMs);
    });
    return () => {
      clearTimeout(timer);
      sub.unsubscribe();
    };
  }, [form, delayMs]);
  return state;
}
