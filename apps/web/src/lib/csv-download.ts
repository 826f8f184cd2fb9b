import { errorBodySchema } from '@kerfline/domain/errors';
import { ApiError } from './api-client';

export type CsvProgress = { rows: number; total: number | null };

/** The file name a server named in `Content-Disposition`, or a fallback. */
function fileNameOf(response: Response, fallback: string): string {
  const header = response.headers.get('Content-Disposition') ?? '';
  return /filename="([^"]+)"/.exec(header)?.[1] ?? fallback;
}

/**
 * Downloads a CSV export of `/api{path}` while it streams, reporting rows read against the row count the server
 * announces (`X-Row-Count`), then hands the file to the browser. A transfer cut short (fewer rows than announced)
 * is an error, never a file that looks complete.
 */
export async function downloadCsv(
  path: string,
  onProgress: (progress: CsvProgress) => void,
  signal?: AbortSignal,
): Promise<string> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, { credentials: 'same-origin', headers: { Accept: 'text/csv' }, signal });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({ code: 'UNAVAILABLE', status: 0, message: 'Kerfline could not be reached for the export.' });
  }
  if (!response.ok) {
    const body = errorBodySchema.safeParse(await response.json().catch(() => undefined));
    throw new ApiError({
      code: body.success ? body.data.error.code : 'INTERNAL',
      status: response.status,
      message: body.success ? body.data.error.message : 'The export failed on the server.',
    });
  }
  const announced = response.headers.get('X-Row-Count');
  const total = announced === null ? null : Number(announced);
  const reader = response.body!.getReader();
  const chunks: Uint8Array[] = [];
  let lines = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    chunks.push(value);
    // Records end in CRLF; a line break inside a quoted note makes this an estimate, good enough for a bar.
    for (const byte of value) if (byte === 10) lines += 1;
    onProgress({ rows: Math.max(0, lines - 1), total });
  }
  if (total !== null && lines - 1 < total)
    throw new ApiError({
      code: 'UNAVAILABLE',
      status: 0,
      message: `The export stopped after ${Math.max(0, lines - 1)} of ${total} rows. Try again.`,
    });
  const name = fileNameOf(response, 'kerfline-export.csv');
  const url = URL.createObjectURL(new Blob(chunks as BlobPart[], { type: 'text/csv;charset=utf-8' }));
  const link = document.createElement('a');
  link.href = url;
  link.download = name;
  document.body.append(link);
  link.click();
  link.remove();
  setTimeout(() => URL.revokeObjectURL(url), 10_000);
  return name;
}
