import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import sharp from 'sharp';
import { startTestApp, signedInAgent, type TestContext } from '../../test-support/test-db.js';
import { buildWorld, minutesAgo, PASSWORD, specBody, type World } from '../../test-support/fixtures.js';

let ctx: TestContext;
let world: World;
let runA: string;
let runC: string;
const as = (email: string): Promise<supertest.Agent> => signedInAgent(ctx.app, email, PASSWORD);
const count = async (table: string) =>
  (await ctx.sequelize.query(`SELECT count(*)::int AS n FROM ${table}`, { plain: true }))!.n as number;

/** A 1200 × 800 test image in the given format, made here (a grey field with a darker band). */
async function image(format: 'png' | 'jpeg' | 'webp'): Promise<Buffer> {
  const base = sharp({ create: { width: 1200, height: 800, channels: 3, background: { r: 150, g: 150, b: 145 } } });
  const band = await sharp({ create: { width: 1200, height: 120, channels: 3, background: { r: 60, g: 60, b: 60 } } })
    .png()
    .toBuffer();
  const composed = base.composite([{ input: band, top: 340, left: 0 }]);
  return composed.toFormat(format).toBuffer();
}

beforeAll(() => {
  ctx = startTestApp();
});
afterAll(async () => ctx.close());
beforeEach(async () => {
  world = await buildWorld(ctx.sequelize);
  const admin = await as('admin@test.example');
  const spec = (await admin.post('/api/blade-specs').send(specBody(null))).body.id;
  runA = (
    await admin
      .post('/api/blade-runs')
      .send({ sawId: world.saws.A![0]!.id, bladeSpecId: spec, installedAt: minutesAgo(60) })
  ).body.run.id;
  runC = (
    await admin
      .post('/api/blade-runs')
      .send({ sawId: world.saws.C![0]!.id, bladeSpecId: spec, installedAt: minutesAgo(60) })
  ).body.run.id;
});

describe('attaching photos to a blade run', () => {
  it.each([
    ['png', 'image/png'],
    ['jpeg', 'image/jpeg'],
    ['webp', 'image/webp'],
  ] as const)('accepts a %s recognised from its content, makes a thumbnail, and serves both', async (format, mime) => {
    const tech = await as('tech-a@test.example');
    const bytes = await image(format);
    // The name and the browser's claimed type are deliberately wrong: only the content counts.
    const res = await tech
      .post(`/api/blade-runs/${runA}/photos`)
      .field('caption', 'Teeth stripped on one side')
      .attach('photo', bytes, { filename: 'upload.bin', contentType: 'application/octet-stream' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({
      bladeRunId: runA,
      siteId: world.sites.A.id,
      contentType: mime,
      byteSize: bytes.length,
      widthPx: 1200,
      heightPx: 800,
      caption: 'Teeth stripped on one side',
      uploadedById: world.users.techA.id,
    });
    const full = await tech.get(res.body.imageUrl).buffer(true);
    expect(full.status).toBe(200);
    expect(full.headers['content-type']).toBe(mime);
    expect(full.headers['cache-control']).toBe('private, max-age=3600');
    expect(Buffer.compare(full.body as Buffer, bytes)).toBe(0);
    const thumb = await tech.get(res.body.thumbnailUrl).buffer(true);
    expect(thumb.headers['content-type']).toBe('image/webp');
    expect(await sharp(thumb.body as Buffer).metadata()).toMatchObject({ format: 'webp', width: 320, height: 213 });
    expect((await tech.get(`/api/blade-runs/${runA}`)).body.photoCount).toBe(1);
    expect((await tech.get(`/api/blade-runs/${runA}/photos`)).body.map((p: { id: string }) => p.id)).toEqual([
      res.body.id,
    ]);
  });

  it('refuses a file that is not a JPEG, PNG or WebP, whatever its name says, storing nothing', async () => {
    const tech = await as('tech-a@test.example');
    const text = await tech
      .post(`/api/blade-runs/${runA}/photos`)
      .attach('photo', Buffer.from('this is not a photo at all, just text'), {
        filename: 'blade.jpg',
        contentType: 'image/jpeg',
      });
    expect(text.status).toBe(400);
    expect(text.body.error.message).toBe(
      'The file is not a JPEG, PNG or WebP photo; send a photo in one of those formats',
    );
    const gif = await sharp({ create: { width: 4, height: 4, channels: 3, background: '#888' } })
      .gif()
      .toBuffer();
    const asGif = await tech
      .post(`/api/blade-runs/${runA}/photos`)
      .attach('photo', gif, { filename: 'blade.png', contentType: 'image/png' });
    expect(asGif.status).toBe(400);
    expect(asGif.body.error.message).toMatch(/its content is image\/gif/);
    // Magic bytes of a PNG but nothing behind them: recognised as PNG, refused as unreadable.
    const truncated = (await image('png')).subarray(0, 64);
    const broken = await tech.post(`/api/blade-runs/${runA}/photos`).attach('photo', truncated, 'x.png');
    expect(broken.status).toBe(400);
    expect(broken.body.error.message).toMatch(/could not be read/);
    const none = await tech.post(`/api/blade-runs/${runA}/photos`).field('caption', 'no file');
    expect(none.status).toBe(400);
    expect(none.body.error.message).toBe('Attach a photo in the form field "photo"');
    expect(await count('photos')).toBe(0);
    expect(await count('photo_blobs')).toBe(0);
  });

  it('answers 413 with a clear message for a file over 10 MB', async () => {
    const tech = await as('tech-a@test.example');
    const big = Buffer.alloc(10 * 1024 * 1024 + 1, 0x41);
    const res = await tech.post(`/api/blade-runs/${runA}/photos`).attach('photo', big, 'huge.jpg');
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'PAYLOAD_TOO_LARGE' });
    expect(res.body.error.message).toMatch(/larger than 10 MB/);
    expect(await count('photos')).toBe(0);
  });

  it('serves a photo only to people who may read its saw: 404 for anyone else, even with its id', async () => {
    const techA = await as('tech-a@test.example');
    const photo = (await techA.post(`/api/blade-runs/${runA}/photos`).attach('photo', await image('jpeg'), 'a.jpg'))
      .body;
    const techC = await as('tech-c@test.example');
    for (const url of [
      `/api/photos/${photo.id}`,
      photo.imageUrl,
      photo.thumbnailUrl,
      `/api/blade-runs/${runA}/photos`,
    ]) {
      const res = await techC.get(url);
      expect(res.status, url).toBe(404);
    }
    expect((await (await as('lead-north@test.example')).get(photo.imageUrl)).status).toBe(200);
    expect((await (await as('manager-ac@test.example')).get(photo.imageUrl)).status).toBe(200);
    // A technician at C cannot attach photos to A's run, nor a manager anywhere.
    expect(
      (await techC.post(`/api/blade-runs/${runA}/photos`).attach('photo', await image('png'), 'p.png')).status,
    ).toBe(404);
    const manager = await as('manager-all@test.example');
    expect(
      (await manager.post(`/api/blade-runs/${runC}/photos`).attach('photo', await image('png'), 'p.png')).status,
    ).toBe(403);
    expect(await count('photos')).toBe(1);
  });

  it('lets a site admin remove a photo to the kept records (bytes kept, audited), not the technician', async () => {
    const tech = await as('tech-a@test.example');
    const photo = (await tech.post(`/api/blade-runs/${runA}/photos`).attach('photo', await image('png'), 'a.png')).body;
    expect((await tech.delete(`/api/photos/${photo.id}`).send({ reason: 'Entered by mistake' })).status).toBe(403);
    expect(
      (
        await (
          await as('siteadmin-a@test.example')
        )
          .delete(`/api/photos/${photo.id}`)
          .send({ reason: 'Entered by mistake' })
      ).status,
    ).toBe(204);
    expect(await count('photo_blobs')).toBe(0);
    expect(await count('removed_photo_blobs')).toBe(1);
    expect(await count(`audit_entries WHERE entity = 'Photo'`)).toBe(2);
    expect(await count(`audit_entries WHERE entity = 'RemovedRecord' AND action = 'create'`)).toBe(1);
  });
});
