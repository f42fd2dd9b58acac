/** The desk's list of figures the surveyor left assumed or marked estimated, so the engineer weighs them. */
import type { Survey } from '@shared/schemas/survey';
import { figureNotes, figureNoteSentence } from '@shared/review/assumptions';

export function FigureNotesPanel({ doc }: { doc: Survey }) {
  const notes = figureNotes(doc);
  if (notes.length === 0) return null;
  const assumed = notes.filter((n) => n.mark === 'assumed');
  const estimated = notes.filter((n) => n.mark === 'estimated');
  return (
    <details className="mt-3 rounded-lg border-2 border-caution bg-caution-soft p-2 text-sm" data-testid="figure-notes">
      <summary className="min-h-touch cursor-pointer content-center font-bold">
        Assumed and estimated figures ({assumed.length} assumed, {estimated.length} estimated)
      </summary>
      <ul className="mt-1 list-disc space-y-0.5 pl-5">
        {notes.map((n) => (
          <li key={`${n.entityId}-${n.field}`}>{figureNoteSentence(n)}</li>
        ))}
      </ul>
    </details>
  );
}
