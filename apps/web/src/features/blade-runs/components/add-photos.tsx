import { useState } from 'react';
import { Button } from '../../../lib/ui/button';
import { useUploadRunPhoto } from '../api/mutations';
import { PhotoPicker, type PendingPhoto } from './photo-picker';

/** Attaching more photos to a run after the fact, each with its upload progress. */
export function AddPhotos({ runId }: { runId: string }) {
  const upload = useUploadRunPhoto();
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const [sending, setSending] = useState(false);
  const set = (key: string, change: Partial<PendingPhoto>) =>
    setPhotos((list) => list.map((p) => (p.key === key ? { ...p, ...change } : p)));
  const send = async () => {
    setSending(true);
    for (const photo of photos.filter((p) => !p.done)) {
      set(photo.key, { progress: 0, error: null });
      try {
        await upload.mutateAsync({ runId, file: photo.file, onProgress: (f) => set(photo.key, { progress: f }) });
        set(photo.key, { progress: 1, done: true });
      } catch (error) {
        set(photo.key, { error: error instanceof Error ? error.message : 'Not sent.' });
      }
    }
    setSending(false);
    setPhotos((list) => list.filter((p) => !p.done));
  };
  const waiting = photos.filter((p) => !p.done).length;
  return (
    <div className="space-y-3">
      <PhotoPicker photos={photos} onChange={setPhotos} disabled={sending} />
      {waiting > 0 ? (
        <Button variant="primary" onClick={() => void send()} disabled={sending}>
          {sending ? 'Sending…' : `Attach ${waiting} photo${waiting === 1 ? '' : 's'}`}
        </Button>
      ) : null}
    </div>
  );
}
