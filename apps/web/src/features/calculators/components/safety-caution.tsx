import { SafetyCaution as Caution, WarningTriangle } from '../../../lib/ui/safety-caution';

export { WarningTriangle };

/** The shop's cautions (one list, `lib/ui/safety-caution`), said of a calculator's figures. */
export function SafetyCaution({ id }: { id?: string }) {
  return (
    <Caution
      id={id}
      deference="These figures do not replace your employer’s procedures, local regulations (such as lockout/tagout rules) or the saw maker’s manual."
    />
  );
}

/**
 * One line at the top of a calculator for work on the saw: the first rule, and where the full cautions are. On a
 * phone the answer comes next and the full cautions after it, so neither is out of sight.
 */
export function SafetyCautionBrief({ fullId }: { fullId: string }) {
  return (
    <p className="flex items-center gap-3 rounded-sheet border-2 border-ink bg-signal-caution-soft px-3 py-2 text-sm text-ink">
      <WarningTriangle className="size-6" />
      <span>
        <strong>Caution:</strong> isolate and lock out the power before reaching into the saw.{' '}
        <a href={`#${fullId}`} className="font-semibold underline underline-offset-4">
          All the cautions
        </a>
      </span>
    </p>
  );
}
