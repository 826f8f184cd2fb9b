import type { ReactNode } from 'react';
import { useQuery } from '@tanstack/react-query';
import type { Photo } from '@kerfline/domain/photos/schema';
import { Notice } from '../../../lib/ui/notice';
import { runPhotosQuery } from '../api/queries';

/**
 * A run's photos as thumbnails, each opening the full picture (served only to people who may read the saw).
 * `actions` puts a control under each photo (removing it, for the site's admin); the photos then list wider.
 */
export function RunPhotos({ runId, actions }: { runId: string; actions?: (photo: Photo) => ReactNode }) {
  const photos = useQuery(runPhotosQuery(runId));
  if (photos.isPending)
    return (
      <p role="status" className="text-ink-muted">
        Loading photos…
      </p>
    );
  if (photos.isError) return <Notice title="The photos could not be loaded">{photos.error.message}</Notice>;
  if (photos.data.length === 0) return <p className="text-ink-muted">No photos yet.</p>;
  return (
    <ul className={actions ? 'grid grid-cols-1 gap-4 sm:grid-cols-3' : 'grid grid-cols-3 gap-2 sm:grid-cols-5'}>
      {photos.data.map((photo) => (
        <li key={photo.id}>
          <a href={photo.imageUrl} target="_blank" rel="noreferrer" className="block">
            <img
              src={photo.thumbnailUrl}
              alt={photo.caption ?? 'Photo of the blade'}
              className={`aspect-square w-full rounded-sheet border border-rule object-cover ${actions ? 'max-w-48' : ''}`}
              loading="lazy"
            />
          </a>
          {actions ? <div className="mt-2">{actions(photo)}</div> : null}
        </li>
      ))}
    </ul>
  );
}
