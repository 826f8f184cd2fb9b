/** Long work shows progress: a bar with the share in words, announced politely to assistive technology. */
export function ProgressBar({ label, share }: { label: string; share: number }) {
  const percent = Math.max(0, Math.min(100, Math.round(share * 100)));
  return (
    <div className="space-y-1">
      <div className="flex justify-between text-sm font-semibold text-ink">
        <span>{label}</span>
        <span className="tabular" aria-hidden="true">
          {percent} %
        </span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-3 overflow-hidden rounded-sheet border border-rule bg-paper-deep"
      >
        <div className="h-full bg-accent transition-[width]" style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}
