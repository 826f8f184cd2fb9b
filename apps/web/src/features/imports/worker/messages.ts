import type { ReadSettings } from '@kerfline/domain/imports/pipeline';
import type { ImportPlan } from '@kerfline/domain/imports/schema';
import type { ImportTarget } from '@kerfline/domain/imports/build';
import type { CheckResult, ScanResult } from './read-file';

export type WorkerRequest =
  | { type: 'scan'; file: File; settings: ReadSettings; maxRows: number }
  | { type: 'check'; file: File; plan: ImportPlan; target: ImportTarget; maxRows: number };

export type WorkerReply =
  | { type: 'progress'; share: number }
  | { type: 'scanned'; result: ScanResult }
  | { type: 'checked'; result: CheckResult }
  | { type: 'failed'; message: string };

/**
 * Runs one request in a fresh Web Worker and ends it when done (or when the signal aborts: the user dropped
 * another file). Progress goes to `onProgress` as a share of the file read.
 */
export function runInWorker<R>(
  request: WorkerRequest,
  onProgress: (share: number) => void,
  signal?: AbortSignal,
): Promise<R> {
  return new Promise<R>((resolve, reject) => {
    const worker = new Worker(new URL('./read-file.worker.ts', import.meta.url), { type: 'module' });
    const end = () => worker.terminate();
    signal?.addEventListener('abort', () => {
      end();
      reject(new DOMException('Reading was stopped', 'AbortError'));
    });
    worker.onmessage = (event: MessageEvent<WorkerReply>) => {
      const message = event.data;
      if (message.type === 'progress') onProgress(message.share);
      else if (message.type === 'failed') {
        end();
        reject(new Error(message.message));
      } else {
        end();
        resolve(message.result as R);
      }
    };
    worker.onerror = (event) => {
      end();
      reject(new Error(`The file reader stopped: ${event.message || 'unknown error'}`));
    };
    worker.postMessage(request);
  });
}
