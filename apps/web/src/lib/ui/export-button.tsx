import { useRef, useState } from 'react';
import { downloadCsv, type CsvProgress } from '../csv-download';
import { isApiError } from '../api-client';
import { formatNumber } from '../format';
import { Button } from './button';

/**
 * "Export CSV" for a table: downloads the server's export of exactly what the screen shows (same filters, same
 * scope), with a progress bar while it streams and a way to stop it.
 */
export function ExportButton({ path, label = 'Export CSV' }: { path: string; label?: string }) {
  const [progress, setProgress] = useState<CsvProgress | null>(null);
  const [message, setMessage] = useState<{ tone: 'done' | 'error'; text: string } | null>(null);
  const abort = useRef<AbortController | null>(null);

  const start = async () => {
    abort.current = new AbortController();
    setMessage(null);
    setProgress({ rows: 0, total: null });
    try {
      const name = await downloadCsv(path, setProgress, abort.current.signal);
      setMessage({ tone: 'done', text: `Saved ${name}` });
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError')
        setMessage({ tone: 'error', text: 'Export stopped.' });
      else setMessage({ tone: 'error', text: isApiError(error) ? error.message : 'The export failed. Try again.' });
    } finally {
      setProgress(null);
      abort.current = null;
    }
  };

  const percent = progress?.total
    ? Math.min(100, Math.round((progress.rows / Math.max(1, progress.total)) * 100))
    : null;
  return (
    <div className="flex flex-wrap items-center gap-2">
      {progress ? (
        <>
          <div className="w-40">
            <div
              role="progressbar"
              aria-label="Export progress"
              aria-valuemin={0}
              aria-valuemax={progress.total ?? undefined}
              aria-valuenow={progress.rows}
              className="h-2 overflow-hidden rounded-full bg-paper-deep"
            >
              <div className="h-full bg-accent transition-all" style={{ width: `${percent ?? 10}%` }} />
            </div>
            <p className="mt-1 text-xs text-ink-muted tabular" aria-live="polite">
              {formatNumber(progress.rows)}
              {progress.total !== null ? ` of ${formatNumber(progress.total)}` : ''} rows
            </p>
          </div>
          <Button variant="quiet" onClick={() => abort.current?.abort()}>
            Stop
          </Button>
        </>
      ) : (
        <Button onClick={() => void start()}>
          <svg viewBox="0 0 20 20" aria-hidden="true" className="size-4">
            <path
              d="M10 3v10m0 0l-4-4m4 4l4-4M4 16h12"
              stroke="currentColor"
              strokeWidth="2"
              fill="none"
              strokeLinecap="round"
            />
          </svg>
          {label}
        </Button>
      )}
      {message ? (
        <p
          role={message.tone === 'error' ? 'alert' : 'status'}
          className={`text-sm ${message.tone === 'error' ? 'font-semibold text-signal-stop' : 'text-ink-muted'}`}
        >
          {message.text}
        </p>
      ) : null}
    </div>
  );
}
