import { Link } from 'react-router-dom';

/** Where a drill-down page sits: fleet → site → saw → blade run. Each step keeps the filters of the address. */
export function Breadcrumbs({ trail }: { trail: { label: string; to?: string }[] }) {
  return (
    <nav aria-label="Breadcrumb" className="text-sm">
      <ol className="flex flex-wrap items-center gap-1 text-ink-muted">
        {trail.map((step, i) => (
          <li key={`${step.label}-${i}`} className="flex items-center gap-1">
            {i > 0 ? <span aria-hidden="true">›</span> : null}
            {step.to ? (
              <Link
                to={step.to}
                className="inline-flex min-h-11 items-center font-semibold text-ink underline decoration-accent underline-offset-4 hover:text-accent-dark"
              >
                {step.label}
              </Link>
            ) : (
              <span aria-current="page" className="inline-flex min-h-11 items-center font-semibold text-ink">
                {step.label}
              </span>
            )}
          </li>
        ))}
      </ol>
    </nav>
  );
}
