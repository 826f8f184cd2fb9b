import { randomUUID } from 'node:crypto';
import { mkdir, readFile, readdir, rename, writeFile } from 'node:fs/promises';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { SMTPServer } from 'smtp-server';
import { simpleParser, type AddressObject } from 'mailparser';
import type { CaughtMail } from '@kerfline/domain/mail/schema';

/**
 * The local mail catcher for development and tests: an SMTP server on loopback that accepts every message
 * (no TLS, no authentication) and keeps each one as a JSON file in a folder. The API's outbox page and the
 * tests read that folder; nothing is ever delivered anywhere.
 */
export type MailCatcher = { port: number; dir: string; close: () => Promise<void> };

export async function startMailCatcher(options: { dir: string; port?: number; host?: string }): Promise<MailCatcher> {
  const dir = path.resolve(options.dir);
  await mkdir(dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 5 * 1024 * 1024,
    onData(stream, _session, callback) {
      simpleParser(stream).then(
        (parsed) => keep(dir, parsed).then(() => callback(), callback),
        (error: Error) => callback(error),
      );
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port ?? 0, options.host ?? '127.0.0.1', () => resolve());
  });
  const port = (server.server.address() as AddressInfo).port;
  return { port, dir, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((a) => a.value.map((v) => v.address ?? '')).filter(Boolean);
}

async function keep(dir: string, parsed: Awaited<ReturnType<typeof simpleParser>>): Promise<void> {
  const receivedAt = new Date();
  // Sortable by name: the time first, then a random part so two messages in one millisecond both stay.
  const id = `${receivedAt.toISOString().replace(/[:.]/g, '-')}-${randomUUID().slice(0, 8)}`;
  const mail: CaughtMail = {
    id,
    receivedAt: receivedAt.toISOString(),
    from: addresses(parsed.from)[0] ?? '',
    to: addresses(parsed.to),
    subject: parsed.subject ?? '',
    text: parsed.text ?? '',
    html: typeof parsed.html === 'string' ? parsed.html : null,
  };
  // Written under a temporary name and renamed, so a reader never sees half a file.
  const file = path.join(dir, `${id}.json`);
  await writeFile(`${file}.tmp`, JSON.stringify(mail));
  await rename(`${file}.tmp`, file);
}

/** The caught messages, newest first, one page at a time. */
export async function readCaughtMail(
  dir: string,
  page: { limit: number; offset: number } = { limit: 50, offset: 0 },
): Promise<{ items: CaughtMail[]; total: number }> {
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith('.json'));
  } catch {
    return { items: [], total: 0 };
  }
  names.sort().reverse();
  const items = await Promise.all(
    names
      .slice(page.offset, page.offset + page.limit)
      .map(async (n) => JSON.parse(await readFile(path.join(dir, n), 'utf8')) as CaughtMail),
  );
  return { items, total: names.length };
}

/** Waits until a message to `to` that matches `where` has been caught (tests and scripts). */
export async function waitForCaughtMail(
  dir: string,
  to: string,
  where: (mail: CaughtMail) => boolean = () => true,
  timeoutMs = 15_000,
): Promise<CaughtMail> {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const { items } = await readCaughtMail(dir, { limit: 1000, offset: 0 });
    const found = items.find((m) => m.to.includes(to.toLowerCase()) && where(m));
    if (found) return found;
    if (Date.now() > until) throw new Error(`no mail to ${to} arrived within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 150));
  }
}
