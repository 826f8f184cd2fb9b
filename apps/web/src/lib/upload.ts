import type { z } from 'zod';
import { errorBodySchema } from '@kerfline/domain/errors';
import { ApiError } from './api-client';

/**
 * Sends a multipart form (a photo, say) to `/api{path}` and reports how much of it has gone, so a phone on a
 * slow shop network shows progress instead of a frozen button. `fetch` cannot report upload progress, hence
 * XMLHttpRequest. Rejects with the one `ApiError`, like every other request.
 */
export function uploadForm<T>(
  path: string,
  form: FormData,
  schema: z.ZodType<T>,
  onProgress: (fraction: number) => void,
): Promise<T> {
  return new Promise((resolve, reject) => {
    const request = new XMLHttpRequest();
    request.open('POST', `/api${path}`);
    request.withCredentials = true;
    request.setRequestHeader('Accept', 'application/json');
    request.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    request.onerror = () =>
      reject(
        new ApiError({
          code: 'UNAVAILABLE',
          status: 0,
          message: 'Kerfline could not be reached. Check the network connection and try again.',
        }),
      );
    request.onload = () => {
      let json: unknown;
      try {
        json = request.responseText ? JSON.parse(request.responseText) : undefined;
      } catch {
        json = undefined;
      }
      if (request.status < 200 || request.status >= 300) {
        const body = errorBodySchema.safeParse(json);
        reject(
          body.success
            ? new ApiError({ ...body.data.error, status: request.status })
            : new ApiError({
                code: request.status === 413 ? 'PAYLOAD_TOO_LARGE' : 'INTERNAL',
                status: request.status,
                message:
                  request.status === 413
                    ? 'That file is too large to send.'
                    : 'The upload failed on the server. Try again; if it keeps happening, tell your administrator.',
              }),
        );
        return;
      }
      const parsed = schema.safeParse(json);
      if (!parsed.success) {
        reject(
          new ApiError({
            code: 'INTERNAL',
            status: request.status,
            message: 'The server answered in a shape this page does not understand. Reload the page and try again.',
          }),
        );
        return;
      }
      onProgress(1);
      resolve(parsed.data);
    };
    request.send(form);
  });
}
