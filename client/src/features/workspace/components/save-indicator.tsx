import type { SaveState } from '../hooks/use-autosave';

export function SaveIndicator({ state }: { state: SaveState }) {
  const text =
    state === 'pending' ? 'Saving…' : state === 'saved' ? 'Saved on this device' : state === 'invalid' ? 'Not saved: check the marked fields' : state === 'error' ? 'Could not save on this device' : '';
  return (
    <p className={`min-h-6 text-sm ${state === 'invalid' || state === 'error' ? 'font-bold text-danger' : 'text-ink-soft'}`} aria-live="polite" data-testid="save-state">
      {text}
    </p>
  );
}
