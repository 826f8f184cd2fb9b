/// <reference lib="webworker" />
import { TableError } from '@kerfline/domain/imports/read-table';
import { checkFile, scanFile } from './read-file';
import type { WorkerRequest, WorkerReply } from './messages';

/**
 * The wizard's Web Worker: reads the dropped file off the page's thread, so a 50 MB file never freezes the
 * page, and reports progress as it streams.
 */
const scope = self as unknown as DedicatedWorkerGlobalScope;
const reply = (message: WorkerReply) => scope.postMessage(message);

scope.onmessage = async (event: MessageEvent<WorkerRequest>) => {
  const request = event.data;
  let last = 0;
  const onProgress = (share: number) => {
    // Enough updates for a smooth bar, few enough not to flood the page.
    if (share - last >= 0.01 || share === 1) {
      last = share;
      reply({ type: 'progress', share });
    }
  };
  try {
    if (request.type === 'scan') {
      const result = await scanFile(request.file, request.file.name, request.settings, request.maxRows, onProgress);
      reply({ type: 'scanned', result });
    } else {
      const result = await checkFile(
        request.file,
        request.file.name,
        request.plan,
        request.target,
        request.maxRows,
        onProgress,
      );
      reply({ type: 'checked', result });
    }
  } catch (err) {
    reply({
      type: 'failed',
      message:
        err instanceof TableError
          ? err.message
          : `The file could not be read (${err instanceof Error ? err.message : String(err)}). Save it again from the spreadsheet as CSV or .xlsx and drop it again.`,
    });
  }
};
