import { useEffect, useId, useMemo, useState } from 'react';
import { photoProblem } from './blade-off-values';

/** A file's size as people read it: `820 KB`, `3.4 MB`. */
export function sizeText(bytes: number): string {
  return bytes < 1024 * 1024 ? `${Math.max(1, Math.round(bytes / 1024))} KB` : `${(bytes / 1024 / 1024).toFixed(1)} MB`;
}

/** A chosen photo and how far its upload has gone (null before it starts). */
export type PendingPhoto = { key: string; file: File; progress: number | null; error: string | null; done: boolean };

/** The chosen photos as pending uploads, with a problem per file said in words. */
export function pendingFrom(files: FileList | File[]): { accepted: PendingPhoto[]; refused: string[] } {
  const accepted: PendingPhoto[] = [];
  const refused: string[] = [];
  for (const file of Array.from(files)) {
    const problem = photoProblem(file);
    if (problem) refused.push(problem);
    else
      accepted.push({
        key: `${file.name}-${file.size}-${file.lastModified}`,
        file,
        progress: null,
        error: null,
        done: false,
      });
  }
  return { accepted, refused };
}

function Preview({ file }: { file: File }) {
  const url = useMemo(() => (typeof URL.createObjectURL === 'function' ? URL.createObjectURL(file) : null), [file]);
  useEffect(() => () => (url ? URL.revokeObjectURL(url) : undefined), [url]);
  return url ? (
    <img src={url} alt="" className="size-14 shrink-0 rounded-sheet border border-rule object-cover" />
  ) : null;
}

/**
 * Photos of the failed blade or a worn guide: taken with the phone's camera or chosen from its pictures, each
 * with a bar that fills as it uploads. Files that are not JPEG, PNG or WebP or are over 10 MB are refused here
 * in words (the server checks the content again).
 */
export function PhotoPicker({
  photos,
  onChange,
  disabled,
}: {
  photos: PendingPhoto[];
  onChange: (photos: PendingPhoto[]) => void;
  disabled?: boolean;
}) {
  const id = useId();
  const [refused, setRefused] = useState<string[]>([]);
  return (
    <div className="space-y-2">
      <label htmlFor={id} className="block text-sm font-semibold text-ink">
        Photos
        <span className="block font-normal text-ink-muted">
          Of the blade or a worn guide: JPEG, PNG or WebP, up to 10 MB each.
        </span>
      </label>
      <input
        id={id}
        type="file"
        accept="image/jpeg,image/png,image/webp"
        multiple
        disabled={disabled}
        onChange={(event) => {
          const { accepted, refused: problems } = pendingFrom(event.target.files ?? []);
          setRefused(problems);
          const known = new Set(photos.map((p) => p.key));
          onChange([...photos, ...accepted.filter((p) => !known.has(p.key))]);
          event.target.value = '';
        }}
        className="block min-h-11 w-full text-sm text-ink file:mr-3 file:min-h-11 file:rounded-sheet file:border file:border-ink-muted file:bg-card file:px-4 file:font-semibold file:text-ink"
      />
      {refused.length > 0 ? (
        <ul className="text-sm font-semibold text-signal-stop">
          {refused.map((problem) => (
            <li key={problem}>{problem}</li>
          ))}
        </ul>
      ) : null}
      {photos.length > 0 ? (
        <ul className="space-y-2">
          {photos.map((photo) => (
            <li key={photo.key} className="flex items-center gap-3 rounded-sheet border border-rule bg-card p-2">
              <Preview file={photo.file} />
              <div className="min-w-0 flex-1 text-sm">
                <p className="truncate font-semibold text-ink">{photo.file.name}</p>
                {photo.progress !== null ? (
                  <>
                    <progress
                      max={1}
                      value={photo.progress}
                      aria-label={`Upload of ${photo.file.name}`}
                      className="h-2 w-full accent-accent"
                    />
                    <p className="text-ink-muted" aria-live="polite">
                      {photo.error ? null : photo.done ? 'Attached' : `Sending… ${Math.round(photo.progress * 100)} %`}
                    </p>
                  </>
                ) : (
                  <p className="text-ink-muted">{sizeText(photo.file.size)}</p>
                )}
                {photo.error ? <p className="font-semibold text-signal-stop">{photo.error}</p> : null}
              </div>
              {photo.progress === null && !disabled ? (
                <button
                  type="button"
                  onClick={() => onChange(photos.filter((p) => p.key !== photo.key))}
                  className="min-h-11 rounded-sheet px-3 text-sm font-semibold text-ink underline underline-offset-4"
                  aria-label={`Remove ${photo.file.name}`}
                >
                  Remove
                </button>
              ) : null}
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
