/** The cautions that stand beside every computed result and on the master's brief. */
export const CAUTIONS: readonly string[] = [
  'These figures are estimates for planning, not a structural approval.',
  'Structural decisions rest with a competent naval architect, the vessel’s classification society, and the flag and local authorities.',
  'Never enter a flooded or closed space without gas testing and an entry permit.',
  'Pumping or moving liquid changes both the ship’s stability and the loads on its boundaries.',
];

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
