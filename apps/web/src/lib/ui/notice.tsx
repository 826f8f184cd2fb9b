import type { ReactNode } from 'react';

type Tone = 'stop' | 'caution' | 'info';

const tones: Record<Tone, string> = {
  stop: 'border-signal-stop bg-signal-stop-soft text-signal-stop',
  caution: 'border-signal-caution-bg bg-signal-caution-soft text-ink',
  info: 'border-signal-info bg-signal-info-soft text-signal-info',
};

const roles: Record<Tone, 'alert' | 'note' | 'status'> = { stop: 'alert', caution: 'note', info: 'status' };

/** A message in words, with a bar on the left so it does not rely on its colour alone. */
export function Notice({ tone = 'stop', title, children }: { tone?: Tone; title?: string; children?: ReactNode }) {
  return (
    <div role={roles[tone]} className={`rounded-sheet border-l-4 px-4 py-3 text-sm break-words ${tones[tone]}`}>
      {title ? (
        <p className="font-bold">
          {tone === 'caution' ? <span aria-hidden="true">⚠ </span> : null}
          {title}
        </p>
      ) : null}
      {children ? <div className={title ? 'mt-1' : ''}>{children}</div> : null}
    </div>
  );
}
