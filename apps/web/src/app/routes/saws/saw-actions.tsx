import { subject } from '@casl/ability';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Saw } from '@kerfline/domain/saws/schema';
import { LinkButton, type ButtonVariant } from '../../../lib/ui/button';
import { recordCheckHref } from '../../../features/checks/components/due-checks-panel';

export type SawAction = { key: string; label: string; to: string; variant: ButtonVariant };

/**
 * The work that starts at a saw, for the signed-in person's role, most urgent first: a down saw's first action is
 * to end its stop; a saw without a blade, to put one on. Each is one tap from the saw page (and from the start
 * screen), the form the second. Recording a check comes straight after ending a stop while a check is overdue,
 * after the blade actions otherwise.
 */
export function sawActionsFor(
  saw: Saw,
  ability: AppAbility,
  /** Checks overdue on the saw: recording one comes straight after ending a stop. */
  checks: { overdue: number } = { overdue: 0 },
): SawAction[] {
  if (saw.status === 'retired') return [];
  const can = (action: 'create' | 'update', record: 'BladeRun' | 'Stop' | 'CutLog' | 'CheckRecord') =>
    ability.can(action, subject(record, { id: '', siteId: saw.siteId }));
  const actions: SawAction[] = [];
  const base = `/saws/${saw.id}`;
  if (saw.down && can('update', 'Stop'))
    actions.push({ key: 'end-stop', label: 'End the stop', to: `${base}/stop-end`, variant: 'primary' });
  const recordCheck: SawAction = {
    key: 'record-check',
    label: 'Record a check',
    to: recordCheckHref(saw.id),
    variant: 'secondary',
  };
  const mayRecord = can('create', 'CheckRecord');
  if (mayRecord && checks.overdue > 0) actions.push(recordCheck);
  if (saw.bladeOn && can('update', 'BladeRun') && can('create', 'BladeRun'))
    actions.push({ key: 'change-blade', label: 'Change blade', to: `${base}/blade-off?next=on`, variant: 'primary' });
  if (!saw.bladeOn && can('create', 'BladeRun'))
    actions.push({ key: 'blade-on', label: 'Put a blade on', to: `${base}/blade-on`, variant: 'primary' });
  if (saw.bladeOn && can('update', 'BladeRun'))
    actions.push({ key: 'blade-off', label: 'Take blade off', to: `${base}/blade-off`, variant: 'secondary' });
  if (mayRecord && checks.overdue === 0) actions.push(recordCheck);
  if (!saw.down && can('create', 'Stop'))
    actions.push({ key: 'log-stop', label: 'Log a stop', to: `${base}/stops/new`, variant: 'secondary' });
  if (can('create', 'CutLog'))
    actions.push({ key: 'log-cut', label: 'Log a cut', to: `${base}/cut-logs/new`, variant: 'secondary' });
  // One copper button per screen: the first action keeps it, the rest are plain.
  return actions.map((action, index) => ({ ...action, variant: index === 0 ? 'primary' : 'secondary' }));
}

/** The actions as large buttons: full width on a phone, a row on a wide screen. */
export function SawActionButtons({ actions }: { actions: SawAction[] }) {
  return (
    <>
      {actions.map((action) => (
        <LinkButton key={action.key} to={action.to} variant={action.variant} className="min-h-12 text-base">
          {action.label}
        </LinkButton>
      ))}
    </>
  );
}
