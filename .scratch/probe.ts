import { createSequelize } from '../apps/api/src/db/sequelize.js';
import { initModels } from '../apps/api/src/db/models.js';
import { abilityFor } from '../apps/api/src/test-support/abilities.js';
import { User } from '../apps/api/src/modules/users/user.model.js';
import { getOutlierReview } from '../apps/api/src/modules/outliers/outliers.service.js';
const s = createSequelize(`postgres://postgres@127.0.0.1:${process.env.PGPORT}/${process.env.DB ?? 'kerfline'}`);
initModels(s);
for (const email of ['tomasz.wren@corvane.example', 'ana.quiroga@corvane.example', 'grace.okafor@corvane.example']) {
  const u = await User.findOne({ where: { email } });
  for (const [from, to] of [['2026-06', '2026-11'], ['2025-12', '2026-11']]) {
    const r = await getOutlierReview(await abilityFor(u!.id), { from, to } as never);
    const tag = new Map(r.saws.map((x) => [x.saw.id, x.saw.assetTag]));
    console.log(email.split('.')[0], from, r.flags.map((f) => `${tag.get(f.sawId)} ${f.metric} ${f.modifiedZ.toFixed(1)}`).join('; '));
  }
}
await s.close();
