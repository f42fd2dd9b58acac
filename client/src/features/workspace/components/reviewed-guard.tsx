/**
 * Before the first edit of a survey that is sent, under review or accepted: the surveyor is told
 * that a change sends it back for review, and the forms stay read-only until they say "Make
 * changes" (nothing can be typed before that, so nothing typed is lost). Afterwards a slim notice
 * stays, until the server's "changed since review" arrives.
 */
import { buttonClass } from '@client/components/ui/button';

export function ReviewedGuard({ warning, locked, onConfirm }: { warning: string; locked: boolean; onConfirm: () => void }) {
  if (!locked) {
    return (
      <p className="rounded-md border-2 border-caution bg-caution-soft p-2 text-sm font-bold" role="status" data-testid="reviewed-guard" data-locked="false">
        <span aria-hidden="true">▲ </span>
        {warning} Your changes are being kept; the engineer will review them again.
      </p>
    );
  }
  return (
    <section className="rounded-lg border-2 border-danger bg-danger-soft p-3" aria-labelledby="reviewed-guard-h" data-testid="reviewed-guard" data-locked="true">
      <h2 id="reviewed-guard-h" className="text-lg">
        <span aria-hidden="true">▲ </span>
        {warning}
      </h2>
      <p className="mt-1 text-sm">
        The forms are read-only until you choose to change it. Any change, even one figure, goes to the engineer for review again, and the master’s brief keeps showing the
        reviewed figures until then.
      </p>
      <button type="button" className={buttonClass('primary', 'mt-2')} onClick={onConfirm} data-testid="reviewed-guard-confirm">
        Make changes
      </button>
    </section>
  );
}
