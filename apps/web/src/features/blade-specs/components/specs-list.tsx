import { Link } from 'react-router-dom';
import {
  BLADE_MATERIAL_LABELS,
  TOOTH_FORM_LABELS,
  TOOTH_SET_LABELS,
  pitchLabel,
  type BladeSpec,
} from '@kerfline/domain/blade-specs/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { formatLength, formatSmallLength } from '../../../lib/format';
import { formatMoney } from '../../../lib/money';
import { StatusMark } from '../../../lib/ui/status-mark';

/**
 * The blade-spec catalogue as cards: what a spec is in the trade's words (band size, pitch, tooth form and set,
 * material), who it is offered to, and its cost; a spec the viewer may change links to its form.
 */
export function SpecsList({
  specs,
  system,
  ownerName,
  editHref,
}: {
  specs: BladeSpec[];
  system: UnitSystem;
  ownerName: (siteId: string | null) => string;
  editHref: (spec: BladeSpec) => string | undefined;
}) {
  if (specs.length === 0) return <p className="text-ink-muted">No blade specs match.</p>;
  return (
    <ul className="grid gap-3 md:grid-cols-2 2xl:grid-cols-3">
      {specs.map((spec) => {
        const href = editHref(spec);
        return (
          <li key={spec.id} className="rounded-sheet border border-rule bg-card p-4">
            <div className="flex flex-wrap items-start justify-between gap-2">
              <h3 className="min-w-0 font-bold text-ink">
                {href ? (
                  <Link to={href} className="text-accent-dark underline-offset-4 hover:underline">
                    {spec.name}
                  </Link>
                ) : (
                  spec.name
                )}
              </h3>
              {spec.archived ? <StatusMark shape="dash">Archived</StatusMark> : null}
            </div>
            <p className="mt-1 text-sm text-ink-muted">{ownerName(spec.siteId)}</p>
            <dl className="mt-3 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
              <dt className="text-ink-muted">Band</dt>
              <dd className="tabular text-ink">
                {formatLength(spec.widthMm, system)} × {formatSmallLength(spec.thicknessMm, system)} ×{' '}
                {formatLength(spec.lengthMm, system)}
              </dd>
              <dt className="text-ink-muted">Pitch</dt>
              <dd className="tabular font-semibold text-ink">
                {pitchLabel(spec.pitch)} {spec.pitch.kind === 'variable' ? '(variable)' : '(constant)'}
              </dd>
              <dt className="text-ink-muted">Teeth</dt>
              <dd className="text-ink">
                {TOOTH_FORM_LABELS[spec.toothForm]} form, {TOOTH_SET_LABELS[spec.toothSet].toLowerCase()} set
              </dd>
              <dt className="text-ink-muted">Material</dt>
              <dd className="text-ink">{BLADE_MATERIAL_LABELS[spec.material]}</dd>
              <dt className="text-ink-muted">Cost</dt>
              <dd className="tabular text-ink">
                {formatMoney(spec.unitCostMinor, spec.currency.trim())} a blade
                {spec.supplier ? ` · ${spec.supplier}` : ''}
              </dd>
            </dl>
          </li>
        );
      })}
    </ul>
  );
}
