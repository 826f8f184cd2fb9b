import markUrl from '../../../public/kerfline-mark.svg?url';

/** Kerfline's mark: the same file the browser tab shows, so there is one drawing of it. */
export function KerflineMark({ className = 'size-8' }: { className?: string }) {
  return <img src={markUrl} alt="" width={32} height={32} className={className} />;
}
