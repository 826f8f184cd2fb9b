/**
 * The bare HTTP server of `npm run bench`: the least any server can do for a signed-in read that checks its
 * session in the database, on this machine. Started by bench.ts as its own process (as the API is); not part of
 * the product.
 *
 * Plain `node:http` and a pg pool with the API's session settings, no framework: for each GET it sends the
 * statements every signed-in request of that person sends (the session read), then every statement of the
 * endpoint at once, over as many connections (one round trip, where the API's own logic may need two), and
 * answers with the API's own answer to that request, byte for byte, ready made. Nothing is checked, computed or
 * formatted. What to send and answer is given by a POST of `{ session, own, answer, contentType }`: the
 * statements as captured from the API (each `{ text, values }`), and the API's answer (base64) and its type.
 *
 * BENCH_BARE_PORT: the port (loopback); DATABASE_URL: the benchmark database. Prints "listening" when ready.
 */
import http from 'node:http';
import pg from 'pg';
import { SESSION_OPTIONS } from './sequelize.js';

type Statement = { text: string; values?: unknown[] };
const pool = new pg.Pool({ connectionString: process.env.DATABASE_URL, max: 10, options: SESSION_OPTIONS });
type Given = { session: Statement[]; own: Statement[]; answer: Buffer; contentType: string };
let given: Given = { session: [], own: [], answer: Buffer.from('[]'), contentType: 'application/json' };

async function answer(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
  if (req.method === 'POST') {
    const chunks: Buffer[] = [];
    for await (const chunk of req) chunks.push(chunk as Buffer);
    const posted = JSON.parse(Buffer.concat(chunks).toString('utf8')) as Omit<Given, 'answer'> & { answer: string };
    given = { ...posted, answer: Buffer.from(posted.answer, 'base64') };
    res.end();
    return;
  }
  const { session, own, answer, contentType } = given;
  for (const s of session) await pool.query(s.text, s.values);
  await Promise.all(own.map((s) => pool.query(s.text, s.values)));
  res.setHeader('Content-Type', contentType);
  res.end(answer);
}

const server = http.createServer((req, res) => {
  answer(req, res).catch((err: unknown) => {
    res.statusCode = 500;
    res.end(String(err));
  });
});
server.listen(Number(process.env.BENCH_BARE_PORT), '127.0.0.1', () => console.log('listening'));
process.on('SIGTERM', () => {
  server.close();
  void pool.end();
});
