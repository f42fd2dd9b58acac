/**
 * Utilisation shown so nobody misses an overload: colour, a word and an icon together (never colour
 * alone), bold and boxed above 100 %.
 */
import { percent } from '@client/lib/unit-system';

export type UtilisationLevel = 'over' | 'near' | 'ok' | 'none';

export function utilisationLevel(u: number | null | undefined): UtilisationLevel {
  if (u === null || u === undefined || !Number.isFinite(u)) return 'none';
  if (u > 1) return 'over';
  if (u >= 0.8) return 'near';
  return 'ok';
}

const STYLE: Record<UtilisationLevel, { cls: string; word: string; icon: string }> = {
  over: { cls: 'border-danger bg-danger text-paper', word: 'OVER CAPACITY', icon: '▲' },
  near: { cls: 'border-caution bg-caution-soft text-ink', word: 'near limit', icon: '◆' },
  ok: { cls: 'border-ok bg-ok-soft text-ink', word: 'within', icon: '●' },
  none: { cls: 'border-line bg-card text-ink-soft', word: 'not rated', icon: '○' },
};

export function UtilisationBadge({ value, compact = false }: { value: number | null | undefined; compact?: boolean }) {
  const level = utilisationLevel(value);
  const s = STYLE[level];
  return (
    <span
      className={`inline-flex items-center gap-1 whitespace-nowrap rounded border-2 px-1.5 py-0.5 text-sm font-bold ${s.cls}`}
      data-utilisation={level}
    >
      <span aria-hidden="true">{s.icon}</span>
      {level !== 'none' && <span>{percent(value)}</span>}
      {(!compact || level === 'over' || level === 'none') && <span>{s.word}</span>}
    </span>
  );
}
