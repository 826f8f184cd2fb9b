import { MAIL_KIND_INFO, type MailLogEntry, type MailStatus } from '@kerfline/domain/mail/schema';

const STATUS_WORDS: Record<MailStatus, { mark: string; word: string }> = {
  queued: { mark: '○', word: 'Waiting to send' },
  sending: { mark: '○', word: 'Sending' },
  retrying: { mark: '△', word: 'Will try again' },
  sent: { mark: '●', word: 'Sent' },
  failed: { mark: '■', word: 'Not sent' },
  skipped: { mark: '—', word: 'Not needed' },
};

const timeFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'short', timeZone: 'UTC' });

/** Every mail Kerfline sent or tried to, newest first, with how it went. Times in UTC. */
export function MailLogTable({ entries }: { entries: MailLogEntry[] }) {
  if (entries.length === 0) return <p className="px-5 py-8 text-center text-ink-muted">No mail has been sent yet.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full min-w-[46rem] border-collapse text-left text-sm">
        <caption className="sr-only">Mail sent</caption>
        <thead>
          <tr className="border-b border-rule text-ink-muted">
            <th scope="col" className="py-3 pr-3 pl-5 font-semibold">
              Queued (UTC)
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Kind
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              To
            </th>
            <th scope="col" className="px-3 py-3 font-semibold">
              Subject
            </th>
            <th scope="col" className="py-3 pr-5 pl-3 font-semibold">
              How it went
            </th>
          </tr>
        </thead>
        <tbody>
          {entries.map((entry) => (
            <tr key={entry.id} className="border-b border-rule align-top last:border-b-0">
              <td className="tabular py-3 pr-3 pl-5 whitespace-nowrap text-ink">
                {timeFormat.format(new Date(entry.createdAt))}
              </td>
              <td className="px-3 py-3 text-ink">{MAIL_KIND_INFO[entry.kind].label}</td>
              <td className="px-3 py-3 text-ink">
                {entry.userName ? <span className="block font-semibold">{entry.userName}</span> : null}
                <span className="break-all">{entry.toAddress}</span>
              </td>
              <td className="px-3 py-3 text-ink">
                {entry.subject ?? <span className="text-ink-muted">not built yet</span>}
              </td>
              <td className="py-3 pr-5 pl-3 text-ink">
                <span className="font-semibold whitespace-nowrap">
                  <span aria-hidden="true" className="mr-1.5">
                    {STATUS_WORDS[entry.status].mark}
                  </span>
                  {STATUS_WORDS[entry.status].word}
                </span>
                <span className="block text-ink-muted">
                  {entry.attempts === 1 ? '1 attempt' : `${entry.attempts} attempts`}
                  {entry.lastError ? `: ${entry.lastError}` : ''}
                </span>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
