/** Buttons with a large touch target in the three tones the app uses. */
import type { ButtonHTMLAttributes, Ref } from 'react';

export type ButtonTone = 'primary' | 'secondary' | 'danger' | 'danger-outline';

const tones: Record<ButtonTone, string> = {
  primary: 'bg-hull text-paper hover:bg-hull-soft',
  secondary: 'border-2 border-hull bg-card text-hull hover:bg-sea-soft',
  danger: 'bg-danger text-paper hover:opacity-90',
  'danger-outline': 'border-2 border-danger bg-card text-danger hover:bg-danger-soft',
};

export const buttonClass = (tone: ButtonTone = 'primary', extra = '') =>
  `inline-flex min-h-touch items-center justify-center gap-2 rounded-lg px-5 font-bold disabled:cursor-not-allowed disabled:opacity-60 ${tones[tone]} ${extra}`;

export function Button({
  tone = 'primary',
  className = '',
  type = 'button',
  ref,
  ...props
}: ButtonHTMLAttributes<HTMLButtonElement> & { tone?: ButtonTone; ref?: Ref<HTMLButtonElement> }) {
  return <button ref={ref} type={type} className={buttonClass(tone, className)} {...props} />;
}
