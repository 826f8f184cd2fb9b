import type { ButtonHTMLAttributes } from 'react';
import { Link, type LinkProps } from 'react-router-dom';

export type ButtonVariant = 'primary' | 'secondary' | 'danger' | 'quiet';

const base =
  'inline-flex min-h-11 items-center justify-center gap-2 rounded-sheet px-4 text-sm font-semibold whitespace-nowrap transition-colors disabled:cursor-not-allowed disabled:opacity-60';

const variants: Record<ButtonVariant, string> = {
  // Copper is kept for the one action a screen is for.
  primary: 'bg-accent text-card hover:bg-accent-dark',
  secondary: 'border border-ink-muted bg-card text-ink hover:bg-paper-deep',
  danger: 'border border-signal-stop bg-card text-signal-stop hover:bg-signal-stop-soft',
  quiet: 'text-ink hover:bg-paper-deep underline-offset-4 hover:underline',
};

export function buttonClass(variant: ButtonVariant = 'secondary', extra = ''): string {
  return `${base} ${variants[variant]} ${extra}`.trim();
}

export function Button({
  variant = 'secondary',
  className = '',
  type = 'button',
  ...rest
}: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: ButtonVariant }) {
  return <button type={type} className={buttonClass(variant, className)} {...rest} />;
}

export function LinkButton({
  variant = 'secondary',
  className = '',
  ...rest
}: LinkProps & { variant?: ButtonVariant }) {
  return <Link className={buttonClass(variant, className)} {...rest} />;
}
