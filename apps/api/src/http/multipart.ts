import { AppError } from '../errors.js';

/**
 * The error for a form multer could not read, other than its own limits (`MulterError`, which each upload route
 * words itself): with memory storage every such error comes from reading the request — a form cut off before its
 * closing boundary, a `multipart/form-data` type without a boundary, a malformed part header, a client that went
 * away. Each is the sender's to fix, so a 400 that says what to do, never a 500.
 */
export function unreadableForm(err: unknown, what: string): AppError {
  if (err instanceof AppError) return err;
  const reason = err instanceof Error && err.message ? err.message : 'unreadable';
  return AppError.validation(`The form could not be read (it was cut off or is not well formed); send ${what} again`, [
    { path: 'form', message: reason },
  ]);
}
