import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { addMonths, monthOf, monthsOf } from '@kerfline/domain/fleet/period';
import { DEMO_REFERENCE_DATE } from './demo-history.js';

/*
 * The demo's money and follow-ups, all invented: Corvane Metals reports in US dollars; an administrator entered a
 * monthly rate for each of the sites' other currencies (Canadian dollars, euros, Mexican pesos) up to the month
 * of the reference date, so the month after it shows the missing-rate warning; the operations
 * manager set each site's monthly blade budget a little above its usual spend for the last year and the month in
 * progress; and one follow-up is done and one open, so the screens have a history to show.
 */

/** Invented rates into USD at the start of the history and the drift per month (no real market's figures). */
const RATES: Record<string, { start: number; drift: number }> = {
  CAD: { start: 0.73, drift: -0.0006 },
  EUR: { start: 1.08, drift: 0.0011 },
  MXN: { start: 0.0558, drift: 0.00004 },
};

export async function loadDemoFleet(sequelize: Sequelize, transaction: Transaction): Promise<void> {
  const q = <T extends object>(sql: string, replacements: Record<string, unknown> = {}) =>
    sequelize.query<T>(sql, { type: QueryTypes.SELECT, transaction, replacements });
  const [admin] = await q<{ id: string }>(`SELECT id FROM users WHERE email = 'noor.haddad@corvane.example'`);
  const [manager] = await q<{ id: string }>(`SELECT id FROM users WHERE email = 'grace.okafor@corvane.example'`);
  const [lead] = await q<{ id: string }>(`SELECT id FROM users WHERE email = 'tomasz.wren@corvane.example'`);
  // The history ends on the reference date's month: rates up to it, none for the month after (in progress).
  const lastWhole = monthOf(DEMO_REFERENCE_DATE);
  const months = monthsOf({ from: addMonths(lastWhole, -24), to: lastWhole });

  await sequelize.query(`INSERT INTO reporting_currency (id, currency, set_by_id) VALUES (true, 'USD', :by)`, {
    transaction,
    replacements: { by: admin!.id },
  });
  const rateRows = Object.entries(RATES).flatMap(([currency, r]) =>
    months.map((month, i) => ({
      month: `${month}-01`,
      currency,
      reporting_currency: 'USD',
      // A gentle drift with a small wobble, rounded as a bank's sheet would print it.
      rate: Number((r.start + r.drift * i + r.start * 0.006 * Math.sin(i * 1.3)).toPrecision(5)),
      set_by_id: admin!.id,
    })),
  );
  await sequelize.getQueryInterface().bulkInsert('exchange_rates', rateRows, { transaction });

  // Budgets: each site's mean monthly spend over the last year, in its own currency, plus 5 %, in round hundreds.
  const spend = await q<{ site_id: string; currency: string; monthly: number }>(
    `SELECT s.id AS site_id, s.currency, coalesce(sum(r.cost_minor), 0) / 12.0 AS monthly
       FROM sites s LEFT JOIN blade_runs r ON r.site_id = s.id AND r.installed_at >= :from AND r.installed_at < :to
      GROUP BY s.id, s.currency`,
    { from: new Date(DEMO_REFERENCE_DATE.getTime() - 365 * 86_400_000), to: DEMO_REFERENCE_DATE },
  );
  const budgetMonths = monthsOf({ from: addMonths(lastWhole, -11), to: addMonths(lastWhole, 1) });
  await sequelize.getQueryInterface().bulkInsert(
    'budgets',
    spend.flatMap((s) =>
      budgetMonths.map((month) => ({
        site_id: s.site_id,
        month: `${month}-01`,
        amount_minor: Math.round((Number(s.monthly) * 1.05) / 10_000) * 10_000,
        currency: s.currency.trim(),
        set_by_id: manager!.id,
      })),
    ),
    { transaction },
  );

  // Two follow-ups from the regional lead: one done at Rotterdam, one open at Hammerfield.
  const sawAt = async (tag: string) =>
    (await q<{ id: string; site_id: string }>(`SELECT id, site_id FROM saws WHERE asset_tag = :tag`, { tag }))[0]!;
  const personAt = async (siteId: string) =>
    (
      await q<{ id: string; name: string }>(
        `SELECT id, name FROM users WHERE site_id = :siteId AND role = 'technician' ORDER BY email LIMIT 1`,
        { siteId },
      )
    )[0] ??
    (
      await q<{ id: string; name: string }>(
        `SELECT id, name FROM users WHERE site_id = :siteId AND role = 'site_admin' ORDER BY email LIMIT 1`,
        { siteId },
      )
    )[0]!;
  const day = (n: number) => new Date(DEMO_REFERENCE_DATE.getTime() - n * 86_400_000);
  const followUps = [
    {
      tag: 'RTM-S02',
      title: 'Band speed on the heavy bar saw: check it against the chart for the alloy work',
      opened: day(40),
      due: day(26),
      done: day(28),
      notes: [
        'Speed dial found at the top of the range for alloy bar.',
        'Set to the chart; blades lasting longer since.',
      ],
    },
    {
      tag: 'HAM-S03',
      title: 'Hydraulic head: find why it drops under load',
      opened: day(3),
      due: new Date(DEMO_REFERENCE_DATE.getTime() + 10 * 86_400_000),
      done: null,
      notes: ['Seal kit ordered.'],
    },
  ];
  for (const f of followUps) {
    const saw = await sawAt(f.tag);
    const person = await personAt(saw.site_id);
    const [row] = await q<{ id: string }>(
      `INSERT INTO follow_ups (site_id, saw_id, title, assignee_id, due_on, state, created_by_id, created_at, updated_at, done_at)
       VALUES (:site, :saw, :title, :assignee, :due, :state, :lead, :opened, :updated, :done) RETURNING id`,
      {
        site: saw.site_id,
        saw: saw.id,
        title: f.title,
        assignee: person.id,
        due: f.due.toISOString().slice(0, 10),
        state: f.done ? 'done' : 'in_progress',
        lead: lead!.id,
        opened: f.opened,
        updated: f.done ?? day(1),
        done: f.done,
      },
    );
    const entries = [
      {
        kind: 'opened',
        text: `Opened for ${person.name}, due ${f.due.toISOString().slice(0, 10)}`,
        by: lead!.id,
        at: f.opened,
      },
      { kind: 'state', text: 'Open → In progress', by: person.id, at: new Date(f.opened.getTime() + 86_400_000) },
      ...f.notes.map((text, i) => ({
        kind: 'note',
        text,
        by: person.id,
        at: new Date(f.opened.getTime() + (i + 2) * 86_400_000),
      })),
      ...(f.done ? [{ kind: 'state', text: 'In progress → Done', by: person.id, at: f.done }] : []),
    ];
    for (const e of entries)
      await sequelize.query(
        `INSERT INTO follow_up_entries (follow_up_id, site_id, kind, text, by_id, created_at)
         VALUES (:id, :site, :kind, :text, :by, :at)`,
        { transaction, replacements: { id: row!.id, site: saw.site_id, ...e } },
      );
  }
}
