import { useState } from 'react';
import type { CaughtMail } from '@kerfline/domain/mail/schema';
import { Button } from '../../../lib/ui/button';

const timeFormat = new Intl.DateTimeFormat('en-GB', { dateStyle: 'medium', timeStyle: 'medium', timeZone: 'UTC' });

/**
 * Mail the local mail catcher received, newest first: open one to read it as the person would, in its HTML
 * form (in a sandboxed frame: no scripts, no access to this page) or as plain text.
 */
export function OutboxList({ messages }: { messages: CaughtMail[] }) {
  const [openId, setOpenId] = useState<string | undefined>(messages[0]?.id);
  const [asText, setAsText] = useState(false);
  if (messages.length === 0) return <p className="px-5 py-8 text-center text-ink-muted">Nothing caught yet.</p>;
  const open = messages.find((m) => m.id === openId);
  return (
    <div className="grid gap-0 lg:grid-cols-[minmax(0,22rem)_minmax(0,1fr)]">
      <ul className="border-b border-rule lg:border-r lg:border-b-0" aria-label="Caught mail">
        {messages.map((m) => (
          <li key={m.id} className="border-b border-rule last:border-b-0">
            <button
              type="button"
              onClick={() => setOpenId(m.id)}
              aria-current={m.id === openId ? 'true' : undefined}
              className="block min-h-11 w-full px-5 py-3 text-left hover:bg-paper-deep aria-[current=true]:border-l-4 aria-[current=true]:border-accent aria-[current=true]:bg-accent-soft"
            >
              <span className="block font-semibold text-ink">{m.subject || '(no subject)'}</span>
              <span className="block text-sm break-all text-ink-muted">To {m.to.join(', ')}</span>
              <span className="tabular block text-xs text-ink-muted">
                {timeFormat.format(new Date(m.receivedAt))} UTC
              </span>
            </button>
          </li>
        ))}
      </ul>
      {open ? (
        <article aria-label={`Mail: ${open.subject}`} className="min-w-0 space-y-3 p-5">
          <div className="flex flex-wrap items-start justify-between gap-3">
            <dl className="text-sm">
              <div className="flex gap-2">
                <dt className="text-ink-muted">From</dt>
                <dd className="break-all text-ink">{open.from}</dd>
              </div>
              <div className="flex gap-2">
                <dt className="text-ink-muted">To</dt>
                <dd className="break-all text-ink">{open.to.join(', ')}</dd>
              </div>
              <div className="flex gap-2">
                <dt className="text-ink-muted">Subject</dt>
                <dd className="font-semibold text-ink">{open.subject}</dd>
              </div>
            </dl>
            {open.html ? (
              <Button onClick={() => setAsText((t) => !t)}>
                {asText ? 'Show as the mail looks' : 'Show plain text'}
              </Button>
            ) : null}
          </div>
          {open.html && !asText ? (
            <iframe
              title={`The mail as sent: ${open.subject}`}
              sandbox=""
              srcDoc={open.html}
              className="h-[36rem] w-full rounded-sheet border border-rule bg-paper"
            />
          ) : (
            <pre className="overflow-x-auto rounded-sheet border border-rule bg-paper p-4 text-sm whitespace-pre-wrap text-ink">
              {open.text}
            </pre>
          )}
        </article>
      ) : null}
    </div>
  );
}
