import type { HTMLAttributes } from 'react';

/** A white sheet with a thin rule: the panel every table, list and form sits on. */
export function Card({ className = '', ...rest }: HTMLAttributes<HTMLElement>) {
  return <section className={`rounded-sheet border border-rule bg-card ${className}`.trim()} {...rest} />;
}
