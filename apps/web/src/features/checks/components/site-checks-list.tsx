import { useState } from 'react';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { SiteSetting } from '@kerfline/domain/settings/schema';
import { CHECK_TARGET_RULE_LABELS, type SiteCheck, type SiteCheckValues } from '@kerfline/domain/site-checks/schema';
import { formatDate, formatNumber } from '../../../lib/format';
import { Button } from '../../../lib/ui/button';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { limitsWords, whenDueWords } from './check-words';
import { SiteCheckEditor } from './site-check-editor';

type Editing = { kind: 'new' } | { kind: 'change'; id: string } | null;

/**
 * A site's list of checks: what each measures, how its target is found and where its limits come from (the
 * site's settings, named in words, or figures set on the list), when it falls due and how often it was recorded.
 * Those who may change the list add, change, retire and bring back checks; one never recorded may be deleted.
 */
export function SiteChecksList({
  checks,
  settings,
  system,
  timeZone,
  canEdit,
  settingsHref,
  onAdd,
  onChange,
  onAction,
}: {
  checks: SiteCheck[];
  settings: readonly SiteSetting[];
  system: UnitSystem;
  timeZone: string;
  canEdit: boolean;
  settingsHref: string;
  onAdd: (values: SiteCheckValues) => Promise<unknown>;
  onChange: (id: string, values: SiteCheckValues) => Promise<unknown>;
  onAction: (id: string, action: 'retire' | 'restore' | 'delete') => Promise<unknown>;
}) {
  const [editing, setEditing] = useState<Editing>(null);
  const [actionError, setActionError] = useState<string | null>(null);
  const nextPosition = checks.reduce((max, c) => Math.max(max, c.position + 1), 0);
  const act = async (id: string, action: 'retire' | 'restore' | 'delete') => {
    setActionError(null);
    try {
      await onAction(id, action);
    } catch (err) {
      setActionError(err instanceof Error ? err.message : 'That did not work. Try again.');
    }
  };

  return (
    <Card aria-labelledby="site-checks-heading">
      <div className="flex flex-wrap items-center justify-between gap-3 border-b border-rule px-4 py-3 sm:px-5">
        <h2 id="site-checks-heading" className="text-lg font-bold text-ink">
          Checks on the list
        </h2>
        {canEdit && editing?.kind !== 'new' ? (
          <Button variant="primary" onClick={() => setEditing({ kind: 'new' })}>
            Add a check
          </Button>
        ) : null}
      </div>
      {actionError ? (
        <div className="px-4 pt-3 sm:px-5">
          <Notice title="Not done">{actionError}</Notice>
        </div>
      ) : null}
      {editing?.kind === 'new' ? (
        <div className="border-b border-rule bg-paper px-4 py-4 sm:px-5">
          <SiteCheckEditor
            check={null}
            system={system}
            position={nextPosition}
            settingsHref={settingsHref}
            onSave={async (values) => {
              await onAdd(values);
              setEditing(null);
            }}
            onCancel={() => setEditing(null)}
          />
        </div>
      ) : null}
      <ul className="divide-y divide-rule">
        {checks.map((check) => (
          <li key={check.id} className={`px-4 py-4 sm:px-5 ${check.retiredAt ? 'bg-paper-deep' : ''}`}>
            {editing?.kind === 'change' && editing.id === check.id ? (
              <SiteCheckEditor
                check={check}
                system={system}
                position={check.position}
                settingsHref={settingsHref}
                onSave={async (values) => {
                  await onChange(check.id, values);
                  setEditing(null);
                }}
                onCancel={() => setEditing(null)}
              />
            ) : (
              <article aria-label={check.name} className="grid gap-3 md:grid-cols-[minmax(0,1fr)_auto]">
                <div className="min-w-0 space-y-1">
                  <h3 className="text-base font-bold text-ink">
                    {check.name}
                    {check.retiredAt ? (
                      <span className="ml-2 rounded border border-ink-muted px-1.5 py-0.5 text-xs font-bold tracking-wider text-ink-muted uppercase">
                        Retired {formatDate(check.retiredAt, timeZone)}
                      </span>
                    ) : null}
                  </h3>
                  {check.measures ? <p className="text-sm text-ink-muted">{check.measures}</p> : null}
                  <dl className="grid gap-x-3 gap-y-1 text-sm sm:grid-cols-[9rem_minmax(0,1fr)]">
                    <dt className="font-semibold text-ink-muted">Target</dt>
                    <dd className="text-ink">{CHECK_TARGET_RULE_LABELS[check.targetRule]}</dd>
                    <dt className="font-semibold text-ink-muted">Limits</dt>
                    <dd className="text-ink">{limitsWords(check, settings, system, timeZone)}</dd>
                    <dt className="font-semibold text-ink-muted">When due</dt>
                    <dd className="text-ink">{whenDueWords(check)}</dd>
                    <dt className="font-semibold text-ink-muted">Recorded</dt>
                    <dd className="tabular text-ink">
                      {check.recordCount === 0 ? 'Never' : `${formatNumber(check.recordCount)} times`}
                      {check.updatedByName
                        ? ` · changed by ${check.updatedByName} on ${formatDate(check.updatedAt, timeZone)}`
                        : ''}
                    </dd>
                  </dl>
                </div>
                {canEdit ? (
                  <div className="flex flex-wrap items-start gap-2 md:justify-end">
                    {check.retiredAt ? (
                      <Button onClick={() => void act(check.id, 'restore')}>Bring back</Button>
                    ) : (
                      <>
                        <Button
                          onClick={() => setEditing({ kind: 'change', id: check.id })}
                          aria-label={`Change ${check.name}`}
                        >
                          Change
                        </Button>
                        <Button onClick={() => void act(check.id, 'retire')} aria-label={`Retire ${check.name}`}>
                          Retire
                        </Button>
                      </>
                    )}
                    {check.recordCount === 0 ? (
                      <Button
                        variant="danger"
                        onClick={() => void act(check.id, 'delete')}
                        aria-label={`Delete ${check.name}`}
                      >
                        Delete
                      </Button>
                    ) : null}
                  </div>
                ) : null}
              </article>
            )}
          </li>
        ))}
      </ul>
    </Card>
  );
}
