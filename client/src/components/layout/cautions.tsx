/** The cautions that stand beside every computed result (text shared with the brief in shared/api/cautions.ts). */
import { CAUTIONS } from '@shared/api/cautions';

export { CAUTIONS };

export function Cautions({ compact = false }: { compact?: boolean }) {
  return (
    <aside
      aria-label="Cautions"
      className="rounded-lg border-2 border-caution bg-caution-soft p-3 text-sm text-ink"
      data-testid="cautions"
    >
      <p className="font-bold">Cautions</p>
      <ul className={compact ? 'mt-1 list-disc pl-5' : 'mt-1 list-disc space-y-1 pl-5'}>
        {CAUTIONS.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </aside>
  );
}
