import { LinkButton } from '../../../lib/ui/button';

export function NotFoundPage() {
  return (
    <div className="max-w-prose space-y-4">
      <title>Page not found · Kerfline</title>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">No page here</h1>
      <p className="text-ink-muted">The address may be mistyped, or the page may have moved.</p>
      <LinkButton to="/sites" variant="primary">
        Go to sites
      </LinkButton>
    </div>
  );
}
