import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { MailKind } from '@kerfline/domain/mail/schema';
import { Notice } from '../../../lib/ui/notice';
import { mailPreferencesQuery } from '../api/queries';
import { useSetMailPreference } from '../api/mutations';

/**
 * The optional mail a person's role gets, each with a switch. Invitations and password resets are not
 * listed: they answer something the person did and always go out.
 */
export function MailPreferences() {
  const preferences = useQuery(mailPreferencesQuery());
  const set = useSetMailPreference();
  // The switch moves as it is clicked; if the server refuses, it goes back to what the server holds.
  const [choices, setChoices] = useState<Partial<Record<MailKind, boolean>>>({});
  const choose = (kind: MailKind, enabled: boolean) => {
    setChoices((current) => ({ ...current, [kind]: enabled }));
    set.mutate({ kind, enabled }, { onSettled: () => setChoices(({ [kind]: _done, ...rest }) => rest) });
  };
  if (preferences.isPending) return <p className="text-ink-muted">Loading…</p>;
  if (preferences.isError) return <Notice>{preferences.error.message}</Notice>;
  if (preferences.data.length === 0)
    return (
      <p className="text-sm text-ink-muted">
        Your role gets no regular mail from Kerfline, only the links you ask for (a new password, say).
      </p>
    );
  return (
    <div className="space-y-3">
      {set.isError ? <Notice>{set.error.message}</Notice> : null}
      <ul className="space-y-2">
        {preferences.data.map((preference) => (
          <li key={preference.kind}>
            <label className="flex min-h-11 cursor-pointer items-start gap-3 rounded-sheet border border-ink-muted bg-card px-3 py-2.5 has-checked:border-accent has-checked:bg-accent-soft">
              <input
                type="checkbox"
                className="mt-0.5 size-5 shrink-0 cursor-pointer accent-accent"
                checked={choices[preference.kind] ?? preference.enabled}
                onChange={(event) => choose(preference.kind, event.target.checked)}
              />
              <span>
                <span className="block font-semibold text-ink">
                  {preference.label}: {(choices[preference.kind] ?? preference.enabled) ? 'on' : 'off'}
                </span>
                <span className="block text-sm text-ink-muted">{preference.description}</span>
              </span>
            </label>
          </li>
        ))}
      </ul>
    </div>
  );
}
