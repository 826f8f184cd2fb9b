import type { ReactNode } from 'react';
import { KerflineMark } from '../../shell/kerfline-mark';

/** The frame of the pages people reach without being signed in: sign-in, a reset link, an invitation. */
export function PublicFrame({
  title,
  heading,
  children,
  below,
}: {
  title: string;
  heading: string;
  children: ReactNode;
  below?: ReactNode;
}) {
  return (
    <main className="flex min-h-screen items-start justify-center px-4 py-12 sm:items-center">
      <title>{`${title} · Kerfline`}</title>
      <div className="w-full max-w-md">
        <div className="mb-6 flex items-center gap-3">
          <KerflineMark className="size-10" />
          <div>
            <p className="text-2xl font-extrabold tracking-tight text-ink">Kerfline</p>
            <p className="text-sm text-ink-muted">Band saw records for every plant</p>
          </div>
        </div>
        <section aria-labelledby="public-heading" className="rounded-sheet border border-rule bg-card p-6">
          <h1 id="public-heading" className="mb-5 text-xl font-bold text-ink">
            {heading}
          </h1>
          {children}
        </section>
        {below ? <div className="mt-4 text-sm text-ink-muted">{below}</div> : null}
      </div>
    </main>
  );
}

/** The secret of an e-mailed link, from the address's fragment (#token=…), which never reaches a server log. */
export function tokenFromHash(hash: string): string | null {
  return new URLSearchParams(hash.replace(/^#/, '')).get('token');
}
