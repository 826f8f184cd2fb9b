import { ForbiddenError, subject } from '@casl/ability';
import { Op, literal, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import {
  STOP_CATEGORY_LABELS,
  type Stop as StopDto,
  type StopCreateParsed,
  type StopEnd,
  type StopListQuery,
  type StopUpdate,
} from '@kerfline/domain/stops/schema';
import type { RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import {
  auditCopy,
  formatAt,
  namesOf,
  orderOf,
  pgError,
  sawForWrite,
  select,
  siteTimeZone,
} from '../records/record-support.js';
import { removeToKept } from '../removed-records/keep-records.js';
import { Stop } from './stop.model.js';

const DERIVED = {
  include: [[literal(`(SELECT asset_tag FROM saws WHERE saws.id = "Stop".saw_id)`), 'sawAssetTag']] as [
    ReturnType<typeof literal>,
    string,
  ][],
};

const auditValues = (stop: Stop) => auditCopy(stop, ['sawAssetTag']);

async function toDtos(stops: Stop[]): Promise<StopDto[]> {
  const names = await namesOf(stops.map((s) => s.createdById));
  const now = Date.now();
  return stops.map((s) => ({
    id: s.id,
    siteId: s.siteId,
    sawId: s.sawId,
    sawAssetTag: String(s.get('sawAssetTag') ?? ''),
    startedAt: s.startedAt.toISOString(),
    endedAt: s.endedAt ? s.endedAt.toISOString() : null,
    category: s.category,
    planned: s.planned,
    notes: s.notes,
    durationMin: Math.max(0, ((s.endedAt?.getTime() ?? now) - s.startedAt.getTime()) / 60000),
    createdById: s.createdById,
    createdByName: s.createdById ? (names.get(s.createdById) ?? null) : null,
    endedById: s.endedById,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
  }));
}

/** Stops the caller may read, newest first by default, paged. */
export async function listStops(ability: AppAbility, q: StopListQuery): Promise<Page<StopDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.sawId) filter.push({ sawId: q.sawId });
  if (q.category) filter.push({ category: q.category });
  if (q.planned !== undefined) filter.push({ planned: q.planned });
  if (q.open === true) filter.push({ endedAt: null });
  if (q.open === false) filter.push({ endedAt: { [Op.ne]: null } });
  if (q.from) filter.push({ startedAt: { [Op.gte]: q.from } });
  if (q.to) filter.push({ startedAt: { [Op.lt]: q.to } });
  const { rows, count } = await Stop.findAndCountAll({
    where: scopedWhere(ability, 'read', 'Stop', Stop, { [Op.and]: filter }),
    attributes: DERIVED,
    order: orderOf(q.sort),
    limit: q.limit,
    offset: q.offset,
  });
  return { items: await toDtos(rows), total: count, limit: q.limit, offset: q.offset };
}

async function findReadableStop(ability: AppAbility, id: string): Promise<Stop> {
  const stop = await Stop.findOne({ where: scopedWhere(ability, 'read', 'Stop', Stop, { id }), attributes: DERIVED });
  if (!stop) throw AppError.notFound('Stop');
  return stop;
}

export async function getStop(ability: AppAbility, id: string): Promise<StopDto> {
  const [dto] = await toDtos([await findReadableStop(ability, id)]);
  return dto!;
}

/** A 409 that names the stop these times collide with, in the site's time zone. */
async function stopConflict(
  err: unknown,
  sawId: string,
  selfId: string | null,
  from: Date,
  to: Date | null,
  siteId: string,
) {
  const { constraint } = pgError(err);
  if (constraint !== 'stops_no_overlap' && constraint !== 'stops_one_open_per_saw') return err;
  const [other] = await select<{
    id: string;
    started_at: Date;
    ended_at: Date | null;
    category: keyof typeof STOP_CATEGORY_LABELS;
  }>(
    `SELECT id, started_at, ended_at, category FROM stops
      WHERE saw_id = :sawId AND (:selfId::uuid IS NULL OR id <> :selfId::uuid)
        AND tstzrange(started_at, ended_at, '[)') && tstzrange(:from, :to, '[)')
      ORDER BY started_at LIMIT 1`,
    { sawId, selfId, from, to },
  );
  if (!other) return new AppError('CONFLICT', 'Another stop on this saw overlaps these times; reload and try again');
  const tz = await siteTimeZone(siteId);
  const what = STOP_CATEGORY_LABELS[other.category].toLowerCase();
  const span = other.ended_at
    ? `from ${formatAt(other.started_at, tz)} to ${formatAt(other.ended_at, tz)}`
    : `open since ${formatAt(other.started_at, tz)}`;
  const fix = other.ended_at ? 'change the times so they do not overlap' : 'end that stop first or change these times';
  return new AppError('CONFLICT', `This stop overlaps stop ${other.id} (${what}, ${span}); ${fix}`, [
    { path: 'startedAt', message: 'overlaps another stop on this saw' },
  ]);
}

/** Logs a stop. With no end the saw is down from its start; the database keeps stops of one saw apart. */
export async function createStop({ ability, userId }: Actor, input: StopCreateParsed): Promise<StopDto> {
  const saw = await sawForWrite(ability, input.sawId, 'create', 'Stop', { path: 'sawId' });
  const startedAt = input.startedAt ?? new Date();
  if (input.endedAt && input.endedAt.getTime() <= startedAt.getTime())
    throw AppError.validation('The end must be after the start', [
      { path: 'endedAt', message: 'must be after the start' },
    ]);
  const stop = await inTransaction(async (transaction) => {
    const created = await Stop.create(
      {
        siteId: saw.siteId,
        sawId: saw.id,
        startedAt,
        endedAt: input.endedAt,
        category: input.category,
        planned: input.planned,
        notes: input.notes,
        createdById: userId,
        endedById: input.endedAt ? userId : null,
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: created.siteId, entity: 'Stop', entityId: created.id, action: 'create', after: auditValues(created) },
    ]);
    return created;
  }).catch(async (err: unknown) => {
    throw await stopConflict(err, saw.id, null, startedAt, input.endedAt, saw.siteId);
  });
  return getStop(ability, stop.id);
}

async function stopForWrite(ability: AppAbility, id: string, action: 'update' | 'delete'): Promise<Stop> {
  const stop = await findReadableStop(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot change this stop')
    .throwUnlessCan(action, subject('Stop', auditValues(stop) as { id: string; siteId: string }));
  await sawForWrite(ability, stop.sawId, action, 'Stop');
  return stop;
}

/** Ends an open stop (the saw is no longer down). A conditional update: ending twice answers 409. */
export async function endStop({ ability, userId }: Actor, id: string, input: StopEnd): Promise<StopDto> {
  const stop = await stopForWrite(ability, id, 'update');
  const tz = await siteTimeZone(stop.siteId);
  if (stop.endedAt) throw new AppError('CONFLICT', `This stop already ended on ${formatAt(stop.endedAt, tz)}`);
  const endedAt = input.endedAt ?? new Date();
  if (endedAt.getTime() <= stop.startedAt.getTime())
    throw AppError.validation('The end must be after the start', [
      { path: 'endedAt', message: `must be after ${formatAt(stop.startedAt, tz)}, when the stop began` },
    ]);
  await inTransaction(async (transaction) => {
    const before = auditValues(stop);
    const [count] = await Stop.update({ endedAt, endedById: userId }, { where: { id, endedAt: null }, transaction });
    if (count === 0) throw new AppError('CONFLICT', 'This stop was ended by someone else just now; reload to see it');
    await stop.reload({ transaction });
    await writeAudit(transaction, userId, [
      { siteId: stop.siteId, entity: 'Stop', entityId: stop.id, action: 'update', before, after: auditValues(stop) },
    ]);
  });
  return getStop(ability, id);
}

/** Corrections to a stop's times, category, planned flag or notes; `endedAt: null` reopens it. */
export async function updateStop({ ability, userId }: Actor, id: string, patch: StopUpdate): Promise<StopDto> {
  const stop = await stopForWrite(ability, id, 'update');
  const startedAt = patch.startedAt ?? stop.startedAt;
  const endedAt = patch.endedAt !== undefined ? patch.endedAt : stop.endedAt;
  if (endedAt && endedAt.getTime() <= startedAt.getTime())
    throw AppError.validation('The end must be after the start', [
      { path: patch.endedAt ? 'endedAt' : 'startedAt', message: 'the end must be after the start' },
    ]);
  await inTransaction(async (transaction) => {
    const before = auditValues(stop);
    const endedBy = patch.endedAt === undefined ? {} : { endedById: patch.endedAt ? userId : null };
    await stop.update({ ...patch, ...endedBy }, { transaction });
    await writeAudit(transaction, userId, [
      { siteId: stop.siteId, entity: 'Stop', entityId: stop.id, action: 'update', before, after: auditValues(stop) },
    ]);
  }).catch(async (err: unknown) => {
    throw await stopConflict(err, stop.sawId, stop.id, startedAt, endedAt, stop.siteId);
  });
  return getStop(ability, id);
}

/** Removes a stop entered by mistake to the kept records (it can be put back); site admins only. */
export async function deleteStop({ ability, userId }: Actor, id: string, { reason }: RemoveRecordInput): Promise<void> {
  const stop = await stopForWrite(ability, id, 'delete');
  await inTransaction((transaction) =>
    removeToKept(transaction, null, { subject: 'Stop', recordId: stop.id, reason, userId }),
  );
}
