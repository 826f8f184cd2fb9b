import type { Change } from './figure-text';

const VERDICT_CLASS = { better: 'text-signal-safe', worse: 'text-signal-stop', neutral: 'text-ink-muted' } as const;
const VERDICT_WORD = { better: 'better', worse: 'worse', neutral: '' } as const;

/** "▲ up 12 % (worse)": a shape, words and a colour, so the change never rests on colour alone. */
export function ChangeNote({ change, against }: { change: Change | null; against: string }) {
  if (!change) return <span className="text-xs text-ink-muted">no comparison</span>;
  const mark = change.direction === 'up' ? '▲' : change.direction === 'down' ? '▼' : '●';
  return (
    <span className={`text-xs font-semibold ${VERDICT_CLASS[change.verdict]}`} title={`Against ${against}`}>
      <span aria-hidden="true">{mark} </span>
      {change.text}
      {change.verdict !== 'neutral' ? ` (${VERDICT_WORD[change.verdict]})` : ''}
      <span className="sr-only"> against {against}</span>
    </span>
  );
}
