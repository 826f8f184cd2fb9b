import path from 'node:path';
import { startMailCatcher } from './catcher.js';

// Run by start.sh and test.sh: node apps/api/dist/mail/catcher-cli.js (SMTP_PORT, MAIL_CATCHER_DIR).
const port = Number(process.env.SMTP_PORT ?? 2525);
const dir = path.resolve(process.env.MAIL_CATCHER_DIR ?? '.data/mail');

const catcher = await startMailCatcher({ port, dir }).catch((error: NodeJS.ErrnoException) => {
  console.error(
    error.code === 'EADDRINUSE'
      ? `The local mail catcher cannot listen on 127.0.0.1:${port}: the port is taken. Set SMTP_PORT to a free port.`
      : `The local mail catcher did not start: ${error.message}`,
  );
  process.exit(1);
});
console.log(`Local mail catcher on 127.0.0.1:${catcher.port}, keeping mail in ${catcher.dir}`);

const stop = () => void catcher.close().then(() => process.exit(0));
process.on('SIGINT', stop);
process.on('SIGTERM', stop);
