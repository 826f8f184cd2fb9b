import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import type { AddressInfo } from 'node:net';
import { request as httpRequest } from 'node:http';
import { brotliCompressSync, brotliDecompressSync, gunzipSync, gzipSync } from 'node:zlib';
import supertest from 'supertest';
import { signedInAgent, startTestApp, type TestContext } from '../test-support/test-db.js';
import { buildWorld, PASSWORD, type World } from '../test-support/fixtures.js';
import { Saw } from '../modules/saws/saw.model.js';

const PUBLIC_URL = 'https://kerfline.plant.example';
let ctx: TestContext;
let world: World;

beforeAll(() => {
  ctx = startTestApp({ publicUrl: PUBLIC_URL });
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
});

const admin = () => signedInAgent(ctx.app, 'admin@test.example', PASSWORD);

describe('a state-changing request from another origin (CSRF)', () => {
  it('is refused: a form on a sibling origin posting "retire this saw" gets 403 and the saw stays in service', async () => {
    const agent = await admin();
    const saw = world.saws.A![0]!;
    const forged = await agent
      .post(`/api/saws/${saw.id}/retire`)
      .set('Host', 'kerfline.plant.example')
      .set('Origin', 'https://tools.plant.example')
      .set('Sec-Fetch-Site', 'same-site')
      .type('form')
      .send('confirm=1');
    expect(forged.status).toBe(403);
    expect(forged.body.error.code).toBe('FORBIDDEN');
    expect(forged.body.error.message).toMatch(/came from another web address \(https:\/\/tools\.plant\.example\)/);
    expect((await Saw.findByPk(saw.id))!.status).not.toBe('retired');
    expect((await agent.get(`/api/saws/${saw.id}`)).body.status).toBe('in_service');
  });

  it('is refused on Sec-Fetch-Site alone when the browser sent no Origin, and for an opaque "null" origin', async () => {
    const agent = await admin();
    const saw = world.saws.A![0]!;
    const bySite = await agent.post(`/api/saws/${saw.id}/retire`).set('Sec-Fetch-Site', 'cross-site');
    expect(bySite.status).toBe(403);
    const opaque = await agent.post(`/api/saws/${saw.id}/retire`).set('Origin', 'null');
    expect(opaque.status).toBe(403);
    expect((await Saw.findByPk(saw.id))!.status).not.toBe('retired');
  });

  it('lets the same origin through: the request’s own host, or the configured public address', async () => {
    const agent = await admin();
    const [first, second] = world.saws.B!;
    const own = await agent
      .post(`/api/saws/${first!.id}/retire`)
      .set('Host', 'kerfline.internal:8080')
      .set('Origin', 'http://kerfline.internal:8080')
      .set('Sec-Fetch-Site', 'same-origin');
    expect(own.status).toBe(200);
    expect(own.body.status).toBe('retired');
    const viaPublic = await agent
      .patch(`/api/saws/${second!.id}`)
      .set('Origin', PUBLIC_URL)
      .send({ name: 'Renamed from the public address' });
    expect(viaPublic.status).toBe(200);
  });

  it('reads the origin from X-Forwarded-Host and -Proto only behind TRUST_PROXY', async () => {
    const proxied = startTestApp({ trustProxy: true });
    const direct = startTestApp();
    try {
      const send = (app: TestContext['app']) =>
        supertest(app)
          .post('/api/auth/sign-in')
          .set('Host', '10.0.0.5:3000')
          .set('X-Forwarded-Host', 'kerfline.example.com')
          .set('X-Forwarded-Proto', 'https')
          .set('Origin', 'https://kerfline.example.com')
          .send({ email: 'admin@test.example', password: PASSWORD });
      expect((await send(proxied.app)).status).toBe(200);
      expect((await send(direct.app)).status).toBe(403);
    } finally {
      await proxied.close();
      await direct.close();
    }
  });

  it('lets requests without Origin or Sec-Fetch-Site through (scripts, server to server)', async () => {
    const agent = await admin();
    expect((await agent.post(`/api/saws/${world.saws.C![0]!.id}/retire`)).status).toBe(200);
  });
});

describe('request bodies', () => {
  it('must be JSON on JSON routes: text/plain, form-urlencoded and multipart answer 415 before anything is read', async () => {
    const agent = await admin();
    const saw = world.saws.A![0]!;
    const plain = await agent
      .patch(`/api/saws/${saw.id}`)
      .set('Content-Type', 'text/plain')
      .send('{"name":"Sneaked in"}');
    expect(plain.status).toBe(415);
    expect(plain.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
    expect(plain.body.error.message).toMatch(/Content-Type: application\/json \(it was text\/plain\)/);
    const form = await agent.patch(`/api/saws/${saw.id}`).type('form').send('name=Sneaked');
    expect(form.status).toBe(415);
    const multipart = await agent.patch(`/api/saws/${saw.id}`).field('name', 'Sneaked');
    expect(multipart.status).toBe(415);
    expect(multipart.body.error.message).toMatch(/takes JSON, not a form upload/);
    expect((await Saw.findByPk(saw.id))!.name).toBe('Test bar saw');
    // Signing in is no exception.
    const signIn = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .type('form')
      .send(`email=admin%40test.example&password=${PASSWORD}`);
    expect(signIn.status).toBe(415);
  });

  it('may be multipart on the photo upload route, and may be absent on a bodiless POST', async () => {
    const agent = await admin();
    const upload = await agent
      .post(`/api/blade-runs/00000000-0000-4000-8000-000000000000/photos`)
      .attach('photo', Buffer.from('not an image'), 'x.png');
    expect(upload.status).not.toBe(415);
    expect((await agent.post(`/api/saws/${world.saws.A![1]!.id}/retire`)).status).toBe(200);
  });
});

describe('a request the server cannot read answers 4xx, never 500', () => {
  it('a malformed percent-encoding in the path: 400', async () => {
    const agent = await admin();
    const res = await agent.get('/api/saws/%E0%A4%A');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('VALIDATION_FAILED');
    expect(res.body.error.message).toMatch(/malformed percent-encoding/);
  });

  it('an unsupported charset or content encoding: 415', async () => {
    const latin1 = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json; charset=latin1')
      .send('{"email":"a@b.example","password":"x"}');
    expect(latin1.status).toBe(415);
    expect(latin1.body.error.message).toMatch(/UTF-8/);
    const compress = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .set('Content-Encoding', 'compress')
      .send('{"email":"a@b.example","password":"x"}');
    expect(compress.status).toBe(415);
    expect(compress.body.error.code).toBe('UNSUPPORTED_MEDIA_TYPE');
  });

  it('a corrupt gzip body: 400; a good one is read', async () => {
    // Raw bytes over a real socket: supertest would serialise a Buffer sent as JSON.
    const server = ctx.app.listen(0, '127.0.0.1');
    await new Promise((resolve) => server.once('listening', resolve));
    const { port } = server.address() as AddressInfo;
    const post = (body: Buffer) =>
      fetch(`http://127.0.0.1:${port}/api/auth/sign-in`, {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'Content-Encoding': 'gzip' },
        body,
      });
    try {
      const corrupt = await post(Buffer.from('this is not gzip at all'));
      expect(corrupt.status).toBe(400);
      expect(((await corrupt.json()) as { error: { message: string } }).error.message).toMatch(/decompressed/);
      const good = await post(gzipSync(JSON.stringify({ email: 'admin@test.example', password: PASSWORD })));
      expect(good.status).toBe(200);
    } finally {
      server.close();
    }
  });

  it('a body over the 1 MB limit: 413', async () => {
    const res = await supertest(ctx.app)
      .post('/api/auth/sign-in')
      .set('Content-Type', 'application/json')
      .send(JSON.stringify({ email: 'a@b.example', password: 'x'.repeat(1_100_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('PAYLOAD_TOO_LARGE');
    expect(res.body.error.message).toMatch(/larger than 1 MB/);
  });
});

describe('answers', () => {
  it('are never cached: every API answer says Cache-Control: no-store, errors and photos included', async () => {
    const agent = await admin();
    for (const url of ['/api/health', '/api/me', '/api/saws', '/api/no-such-route']) {
      const res = await agent.get(url);
      expect(res.headers['cache-control'], url).toBe('no-store');
      // Nor hashed for a validator no client keeps: an answer is never revalidated.
      expect(res.headers.etag, url).toBeUndefined();
    }
    const anonymous = await supertest(ctx.app).get('/api/me');
    expect(anonymous.status).toBe(401);
    expect(anonymous.headers['cache-control']).toBe('no-store');
  });

  it('do not include source maps of the web app', async () => {
    const dist = mkdtempSync(path.join(tmpdir(), 'kerfline-web-'));
    mkdirSync(path.join(dist, 'assets'));
    writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Kerfline</title>');
    writeFileSync(path.join(dist, 'assets', 'main.js'), 'console.log(1)');
    writeFileSync(path.join(dist, 'assets', 'main.js.map'), '{"version":3,"sources":["secret.ts"]}');
    const served = startTestApp({ webDist: dist });
    try {
      expect((await supertest(served.app).get('/assets/main.js')).status).toBe(200);
      const map = await supertest(served.app).get('/assets/main.js.map');
      expect(map.status).toBe(404);
      expect(map.text).not.toContain('secret.ts');
    } finally {
      await served.close();
    }
  });
});

describe('the web app’s files', () => {
  /** One GET on a listening copy of the app, the body as the bytes sent (not decompressed). */
  async function rawGet(app: TestContext['app'], url: string, acceptEncoding: string | null) {
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    try {
      const { port } = server.address() as AddressInfo;
      return await new Promise<{ status: number; headers: Record<string, unknown>; body: Buffer }>(
        (resolve, reject) => {
          const req = httpRequest(
            {
              host: '127.0.0.1',
              port,
              path: url,
              headers: acceptEncoding ? { 'accept-encoding': acceptEncoding } : {},
            },
            (res) => {
              const chunks: Buffer[] = [];
              res.on('data', (c: Buffer) => chunks.push(c));
              res.on('end', () =>
                resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }),
              );
            },
          );
          req.on('error', reject);
          req.end();
        },
      );
    } finally {
      server.close();
    }
  }

  it('are sent compressed to a browser that accepts it, kept for good when their name holds a hash, and the page asked for again', async () => {
    const dist = mkdtempSync(path.join(tmpdir(), 'kerfline-web-'));
    mkdirSync(path.join(dist, 'assets'));
    writeFileSync(path.join(dist, 'index.html'), '<!doctype html><title>Kerfline</title>');
    const script = Buffer.from('export const blades = "' + 'band saw blade '.repeat(400) + '";\n');
    writeFileSync(path.join(dist, 'assets', 'main-3f9a.js'), script);
    writeFileSync(path.join(dist, 'assets', 'main-3f9a.js.gz'), gzipSync(script));
    writeFileSync(path.join(dist, 'assets', 'main-3f9a.js.br'), brotliCompressSync(script));
    const served = startTestApp({ webDist: dist });
    try {
      const br = await rawGet(served.app, '/assets/main-3f9a.js', 'gzip, deflate, br');
      expect(br.status).toBe(200);
      expect(br.headers['content-encoding']).toBe('br');
      expect(br.headers['content-type']).toMatch(/^(text|application)\/javascript/);
      expect(String(br.headers.vary)).toMatch(/accept-encoding/i);
      expect(br.headers['cache-control']).toBe('public, max-age=31536000, immutable');
      expect(br.body.length).toBeLessThan(script.length / 10);
      expect(brotliDecompressSync(br.body).equals(script)).toBe(true);

      const gz = await rawGet(served.app, '/assets/main-3f9a.js', 'gzip');
      expect(gz.headers['content-encoding']).toBe('gzip');
      expect(gunzipSync(gz.body).equals(script)).toBe(true);

      const plain = await rawGet(served.app, '/assets/main-3f9a.js', null);
      expect(plain.headers['content-encoding']).toBeUndefined();
      expect(plain.body.equals(script)).toBe(true);

      // A page of the app is index.html, revalidated each time so that a new build shows at the next load.
      const page = await rawGet(served.app, '/fleet/overview', 'gzip, br');
      expect(page.status).toBe(200);
      expect(page.body.toString()).toContain('<title>Kerfline</title>');
      expect(page.headers['cache-control']).toBe('no-cache');
    } finally {
      await served.close();
    }
  });
});
