/** Placeholder for the shop calculators; the navigation already links here. */
export function CalculatorsPage() {
  return (
    <div className="space-y-3">
      <title>Shop calculators · Kerfline</title>
      <h1 className="text-3xl font-extrabold tracking-tight text-ink">Shop calculators</h1>
      <p className="max-w-prose text-ink-muted">
        Band speed, teeth in the work, band length and the other shop-floor sums will be worked out here.
      </p>
    </div>
  );
}
