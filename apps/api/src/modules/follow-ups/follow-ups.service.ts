import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type Transaction, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import {
  FOLLOW_UP_STATE_LABELS,
  type FollowUp as FollowUpDto,
  type FollowUpAssignee,
  type FollowUpCreateParsed,
  type FollowUpEntry as FollowUpEntryDto,
  type FollowUpFlag,
  type FollowUpListQuery,
  type FollowUpState,
  type FollowUpUpdate,
} from '@kerfline/domain/follow-ups/schema';
import { ROLE_LABELS } from '@kerfline/domain/users/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Saw } from '../saws/saw.model.js';
import { Site } from '../sites/site.model.js';
import { User } from '../users/user.model.js';
import { auditCopy, namesOf } from '../records/record-support.js';
import { reviewScope } from '../outliers/review.js';
import { FollowUp, FollowUpEntry } from './follow-up.model.js';

/** Today's date (`YYYY-MM-DD`) in a time zone. */
function todayIn(timeZone: string, now = new Date()): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(now);
}

async function toDtos(rows: FollowUp[], withEntries: boolean): Promise<FollowUpDto[]> {
  if (rows.length === 0) return [];
  const [saws, sites, entries] = await Promise.all([
    Saw.findAll({ where: { id: { [Op.in]: rows.map((r) => r.sawId) } }, attributes: ['id', 'assetTag', 'name'] }),
    Site.findAll({ where: { id: { [Op.in]: rows.map((r) => r.siteId) } }, attributes: ['id', 'name', 'timeZone'] }),
    withEntries
      ? FollowUpEntry.findAll({
          where: { followUpId: { [Op.in]: rows.map((r) => r.id) } },
          order: [[literal('seq'), 'DESC']],
        })
      : [],
  ]);
  const names = await namesOf([...rows.flatMap((r) => [r.assigneeId, r.createdById]), ...entries.map((e) => e.byId)]);
  const person = (id: string | null) => (id ? { id, name: names.get(id) ?? 'Someone no longer listed' } : null);
  const sawOf = new Map(saws.map((s) => [s.id, s]));
  const siteOf = new Map(sites.map((s) => [s.id, s]));
  return rows.map((r) => {
    const site = siteOf.get(r.siteId)!;
    const saw = sawOf.get(r.sawId)!;
    return {
      id: r.id,
      siteId: r.siteId,
      siteName: site.name,
      sawId: r.sawId,
      sawAssetTag: saw.assetTag,
      sawName: saw.name,
      title: r.title,
      flag: r.flag,
      assignee: person(r.assigneeId),
      dueOn: r.dueOn,
      state: r.state,
      overdue: r.state !== 'done' && r.dueOn < todayIn(site.timeZone),
      createdBy: person(r.createdById),
      createdAt: r.createdAt.toISOString(),
      updatedAt: r.updatedAt.toISOString(),
      doneAt: r.doneAt ? r.doneAt.toISOString() : null,
      entries: entries
        .filter((e) => e.followUpId === r.id)
        .map((e): FollowUpEntryDto => ({
          id: e.id,
          kind: e.kind,
          text: e.text,
          by: person(e.byId),
          at: e.createdAt.toISOString(),
        })),
    };
  });
}

/** Open and in-progress first (soonest due first), then done ones (latest first); paged in SQL. */
export async function listFollowUps(ability: AppAbility, q: FollowUpListQuery): Promise<Page<FollowUpDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.sawId) filter.push({ sawId: q.sawId });
  if (q.state === 'active') filter.push({ state: { [Op.ne]: 'done' } });
  else if (q.state) filter.push({ state: q.state });
  const { rows, count } = await FollowUp.findAndCountAll({
    where: scopedWhere(ability, 'read', 'FollowUp', FollowUp, { [Op.and]: filter }),
    order: [
      [literal(`CASE WHEN "FollowUp".state = 'done' THEN 1 ELSE 0 END`), 'ASC'],
      [literal(`CASE WHEN "FollowUp".state = 'done' THEN NULL ELSE "FollowUp".due_on END`), 'ASC'],
      ['doneAt', 'DESC'],
      ['id', 'ASC'],
    ],
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows, false), total: count, limit: q.limit, offset: q.offset };
}

async function findReadable(ability: AppAbility, id: string, transaction?: Transaction): Promise<FollowUp> {
  const row = await FollowUp.findOne({
    where: scopedWhere(ability, 'read', 'FollowUp', FollowUp, { id }),
    transaction,
    ...(transaction ? { lock: true } : {}),
  });
  if (!row) throw AppError.notFound('Follow-up');
  return row;
}

export async function getFollowUp(ability: AppAbility, id: string): Promise<FollowUpDto> {
  return (await toDtos([await findReadable(ability, id)], true))[0]!;
}

/** The people a follow-up at a site can go to: its active site admins and technicians. */
export async function listAssignees(ability: AppAbility, siteId: string): Promise<FollowUpAssignee[]> {
  const site = await Site.findOne({ where: scopedWhere(ability, 'read', 'Site', Site, { id: siteId }) });
  if (!site) throw AppError.notFound('Site');
  const people = await User.findAll({
    where: { siteId: site.id, active: true, role: { [Op.in]: ['site_admin', 'technician'] } },
    order: [['name', 'ASC']],
  });
  return people.map((p) => ({ id: p.id, name: p.name, role: ROLE_LABELS[p.role] }));
}

async function assigneeAt(siteId: string, assigneeId: string, transaction?: Transaction): Promise<User> {
  const person = await User.findOne({
    where: { id: assigneeId, siteId, active: true, role: { [Op.in]: ['site_admin', 'technician'] } },
    transaction,
  });
  if (!person)
    throw AppError.validation('Give the follow-up to someone who works at the saw’s site', [
      { path: 'assigneeId', message: 'choose an active site admin or technician of this site' },
    ]);
  return person;
}

function assertNotPast(dueOn: string, timeZone: string): void {
  if (dueOn < todayIn(timeZone))
    throw AppError.validation('The due date has passed; choose today or a later day', [
      { path: 'dueOn', message: `must be ${todayIn(timeZone)} or later` },
    ]);
}

/** What the flag said at the time, recomputed on the server for the period the lead looked at. */
async function flagSnapshot(
  ability: AppAbility,
  sawId: string,
  from: NonNullable<FollowUpCreateParsed['fromFlag']>,
): Promise<FollowUpFlag | null> {
  const result = await reviewScope(ability, { from: from.from, to: from.to });
  const me = result.saws.find((s) => s.saw.id === sawId);
  if (!me) return null;
  const value = me.values[from.metric];
  if (value === null) return null;
  const flag = result.review.flags.find((f) => f.sawId === sawId && f.metric === from.metric);
  const group = result.review.groups.find((g) => g.sawIds.includes(sawId));
  return {
    metric: from.metric,
    value,
    peerMedian: flag?.peerMedian ?? group?.metrics[from.metric].median ?? null,
    modifiedZ: flag?.modifiedZ ?? null,
    peerCount: flag?.peerCount ?? group?.metrics[from.metric].judged ?? 0,
    method:
      flag?.method ??
      result.review.notJudged.find((n) => n.sawId === sawId && n.metric === from.metric)?.reason ??
      'In line with its peers when the follow-up was opened.',
    period: { from: from.from, to: from.to },
    reportingCurrency: result.reportingCurrency,
  };
}

/**
 * Opens a follow-up on a saw for a person at its site (regional leads and administrators). The history starts
 * with the opening (and its notes); the whole write and its audit entry are one transaction.
 */
export async function createFollowUp({ ability, userId }: Actor, input: FollowUpCreateParsed): Promise<FollowUpDto> {
  const saw = await Saw.findOne({ where: scopedWhere(ability, 'read', 'Saw', Saw, { id: input.sawId }) });
  if (!saw)
    throw AppError.validation('That saw does not exist', [{ path: 'sawId', message: 'choose one of your saws' }]);
  ForbiddenError.from(ability)
    .setMessage('Only regional leads and administrators open follow-ups')
    .throwUnlessCan('create', subject('FollowUp', { id: '', siteId: saw.siteId }));
  const site = (await Site.findByPk(saw.siteId))!;
  assertNotPast(input.dueOn, site.timeZone);
  const flag = input.fromFlag ? await flagSnapshot(ability, saw.id, input.fromFlag) : null;
  const id = await inTransaction(async (transaction) => {
    const assignee = await assigneeAt(saw.siteId, input.assigneeId, transaction);
    const created = await FollowUp.create(
      {
        siteId: saw.siteId,
        sawId: saw.id,
        title: input.title,
        flag,
        assigneeId: assignee.id,
        dueOn: input.dueOn,
        createdById: userId,
      },
      { transaction },
    );
    await FollowUpEntry.create(
      {
        followUpId: created.id,
        siteId: saw.siteId,
        kind: 'opened',
        text: `Opened for ${assignee.name}, due ${input.dueOn}${input.notes ? `: ${input.notes}` : ''}`,
        byId: userId,
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: saw.siteId, entity: 'FollowUp', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created.id;
  });
  return getFollowUp(ability, id);
}

/**
 * Moves a follow-up along: a new state, another person at the site, another day, or a note. Each change checks the
 * field against the caller's rules (a technician moves it along and adds notes; the day and the person are for the
 * site admin and the lead) and adds a line to the history, in one transaction with its audit entry.
 */
export async function updateFollowUp(
  { ability, userId }: Actor,
  id: string,
  patch: FollowUpUpdate,
): Promise<FollowUpDto> {
  await inTransaction(async (transaction) => {
    const row = await findReadable(ability, id, transaction);
    const asSubject = subject('FollowUp', { id: row.id, siteId: row.siteId });
    const fields = (['state', 'assigneeId', 'dueOn', 'note'] as const).filter(
      (f) => patch[f] !== undefined && patch[f] !== null,
    );
    for (const field of fields)
      ForbiddenError.from(ability)
        .setMessage(
          field === 'state' || field === 'note'
            ? 'You cannot change this follow-up'
            : 'Only the site admin or the regional lead changes who does a follow-up and by when',
        )
        .throwUnlessCan('update', asSubject, field);
    const before = auditCopy(row);
    const lines: { kind: FollowUpEntry['kind']; text: string }[] = [];
    const site = (await Site.findByPk(row.siteId, { transaction }))!;
    if (patch.state && patch.state !== row.state) {
      lines.push({
        kind: 'state',
        text: `${FOLLOW_UP_STATE_LABELS[row.state as FollowUpState]} → ${FOLLOW_UP_STATE_LABELS[patch.state]}`,
      });
      row.state = patch.state;
      row.doneAt = patch.state === 'done' ? new Date() : null;
    }
    if (patch.assigneeId && patch.assigneeId !== row.assigneeId) {
      const person = await assigneeAt(row.siteId, patch.assigneeId, transaction);
      lines.push({ kind: 'assigned', text: `Given to ${person.name}` });
      row.assigneeId = person.id;
    }
    if (patch.dueOn && patch.dueOn !== row.dueOn) {
      assertNotPast(patch.dueOn, site.timeZone);
      lines.push({ kind: 'due', text: `Due ${row.dueOn} → ${patch.dueOn}` });
      row.dueOn = patch.dueOn;
    }
    if (patch.note) lines.push({ kind: 'note', text: patch.note });
    if (lines.length === 0)
      throw AppError.validation('Nothing changed: the follow-up already says that', [
        { path: 'state', message: 'change something or add a note' },
      ]);
    await row.save({ transaction });
    await FollowUpEntry.bulkCreate(
      lines.map((l) => ({ followUpId: row.id, siteId: row.siteId, kind: l.kind, text: l.text, byId: userId })),
      { transaction },
    );
    await writeAudit(transaction, userId, [
      {
        siteId: row.siteId,
        entity: 'FollowUp',
        entityId: row.id,
        action: 'update',
        before,
        after: { ...auditCopy(row), ...(patch.note ? { note: patch.note } : {}) },
      },
    ]);
  });
  return getFollowUp(ability, id);
}
