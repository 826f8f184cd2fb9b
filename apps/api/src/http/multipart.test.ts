import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, signedInAgent, type TestContext } from '../test-support/test-db.js';
import { buildRecords, buildWorld, PASSWORD, type Records, type World } from '../test-support/fixtures.js';

// Found by the fuzz (tests/api/fuzz.test.ts): a form the parser cannot finish reading answered 500.

let ctx: TestContext;
let world: World;
let records: Records;
beforeAll(async () => {
  ctx = startTestApp();
  world = await buildWorld(ctx.sequelize);
  records = await buildRecords(world);
});
afterAll(async () => ctx.close());

const part = (name: string, value: string, file = false) =>
  `--b\r\nContent-Disposition: form-data; name="${name}"${file ? '; filename="x.png"' : ''}\r\n\r\n${value}\r\n`;

describe('an upload whose form cannot be read', () => {
  it('answers 400 saying to send it again, on every upload route, and stores nothing', async () => {
    const agent = await signedInAgent(ctx.app, 'siteadmin-a@test.example', PASSWORD);
    const count = async () =>
      (await ctx.sequelize.query('SELECT (SELECT count(*) FROM photos) + (SELECT count(*) FROM import_batches) AS n', {
        plain: true,
      }))!.n;
    const before = await count();
    const forms = (field: string): [string, string][] => [
      // Cut off before the closing boundary (a phone losing signal mid-upload).
      ['multipart/form-data; boundary=b', `${part('caption', 'x')}${part(field, 'abc', true)}`],
      // A form type without its boundary.
      ['multipart/form-data', `${part(field, 'abc', true)}--b--`],
      // Nothing at all.
      ['multipart/form-data; boundary=b', ''],
    ];
    for (const [path, field] of [
      [`/api/blade-runs/${records.A.run.id}/photos`, 'photo'],
      [`/api/check-records/${records.A.checkRecord.id}/photos`, 'photo'],
      ['/api/imports/check', 'file'],
      ['/api/imports', 'file'],
    ] as const) {
      for (const [type, body] of forms(field)) {
        const res = await agent.post(path).set('Content-Type', type).send(body);
        expect(res.status, `${path} ${type}`).toBe(400);
        expect(res.body.error.message).toMatch(
          /^The form could not be read \(it was cut off or is not well formed\); send the (photo|file) again$/,
        );
      }
    }
    expect(await count()).toBe(before);
  });
});
