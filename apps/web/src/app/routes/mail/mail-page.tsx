import { useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { abilityFromMeRules, useAppAbility } from '../../../lib/ability';
import { Card } from '../../../lib/ui/card';
import { Notice } from '../../../lib/ui/notice';
import { Pager } from '../../../lib/ui/pager';
import { meQuery } from '../../../features/auth/api/queries';
import { mailLogQuery, mailLogQueryFromSearch, outboxQuery } from '../../../features/mail/api/queries';
import { MailLogTable } from '../../../features/mail/components/mail-log-table';
import { OutboxList } from '../../../features/mail/components/outbox';

export function mailPageLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const me = await queryClient.ensureQueryData(meQuery());
    if (!abilityFromMeRules(me.rules).can('read', 'MailLog')) return null;
    const search = new URL(request.url).searchParams;
    await Promise.all([
      queryClient.ensureQueryData(mailLogQuery(mailLogQueryFromSearch(search))),
      queryClient.ensureQueryData(outboxQuery()),
    ]);
    return null;
  };
}

function MailLog() {
  const [search] = useSearchParams();
  const { data: log } = useSuspenseQuery(mailLogQuery(mailLogQueryFromSearch(search)));
  return (
    <Card aria-labelledby="log-heading">
      <div className="border-b border-rule px-5 py-4">
        <h2 id="log-heading" className="text-lg font-bold text-ink">
          Mail sent
        </h2>
        <p className="text-sm text-ink-muted">
          Every invitation, reset link, digest and notice, with its attempts. A mail the server refuses is tried again
          after 1, 2, 4… minutes.
        </p>
      </div>
      <MailLogTable entries={log.items} />
      <div className="border-t border-rule px-5 py-3">
        <Pager total={log.total} limit={log.limit} offset={log.offset} noun="mails" />
      </div>
    </Card>
  );
}

function CaughtMail() {
  const { data: outbox } = useSuspenseQuery(outboxQuery());
  if (!outbox.enabled) return null;
  return (
    <Card aria-labelledby="outbox-heading">
      <div className="border-b border-rule px-5 py-4">
        <h2 id="outbox-heading" className="text-lg font-bold text-ink">
          Outbox of the local mail catcher
        </h2>
        <p className="text-sm text-ink-muted">
          This installation sends to a mail catcher on its own machine, which delivers nothing: here is what it caught (
          {outbox.total}), newest first.
        </p>
      </div>
      <OutboxList messages={outbox.items} />
    </Card>
  );
}

/** Administrators: the record of mail sent and, on a development install, what the mail catcher caught. */
export function MailPage() {
  const ability = useAppAbility();
  return (
    <div className="space-y-6">
      <title>Mail · Kerfline</title>
      <div>
        <h1 className="text-3xl font-extrabold tracking-tight text-ink">Mail</h1>
        <p className="mt-1 text-ink-muted">What Kerfline sent, to whom, and how it went.</p>
      </div>
      {ability.can('read', 'MailLog') ? (
        <>
          <CaughtMail />
          <MailLog />
        </>
      ) : (
        <Notice tone="info" title="Not for your role">
          The record of mail is kept for administrators.
        </Notice>
      )}
    </div>
  );
}
