/**
 * Buttons with a large touch target in the tones the app uses: the one button kit of every screen
 * (the workspace, the review desk, the account forms). `buttonClass` gives the same look to a link.
 */
import type { ButtonHTMLAttributes, Ref } from 'react';

export type ButtonTone = 'primary' | 'secondary' | 'danger' | 'danger-outline' | 'link' | 'danger-link';

const tones: Record<ButtonTone, string> = {
  primary: 'bg-hull text-paper hover:bg-hull-soft',
  secondary: 'border-2 border-hull bg-card text-hull hover:bg-sea-soft',
  danger: 'bg-danger text-paper hover:opacity-90',
  'danger-outline': 'border-2 border-danger bg-card text-danger hover:bg-danger-soft',
  /** A quiet action inside text (reply, remove one row): still a full touch target. */
  link: 'text-sea underline',
  'danger-link': 'text-danger underline',
};

const SHAPE: Record<ButtonTone, string> = {
  primary: 'rounded-lg px-4',
  secondary: 'rounded-lg px-4',
  danger: 'rounded-lg px-4',
  'danger-outline': 'rounded-lg px-4',
  link: 'px-1 text-sm',
  'danger-link': 'px-1 text-sm',
};

export const buttonClass = (tone: ButtonTone = 'primary', extra = '') =>
  `inline-flex min-h-touch items-center justify-center gap-2 font-bold disabled:cursor-not-allowed disabled:opacity-60 ${SHAPE[tone]} ${tones[tone]} ${extra}`.trim();

export function Button({
  tone = 'primary',
  className = '',
  type = 'button',
  ref,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: ButtonTone; ref?: Ref<HTMLButtonElement> }) {
  return <button ref={ref} type={type} className={buttonClass(tone, className)} {...props} />;
}
