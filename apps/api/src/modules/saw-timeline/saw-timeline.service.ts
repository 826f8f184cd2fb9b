import { Op, literal, type Attributes, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import {
  timelineCursor,
  type SawTimeline,
  type SawTimelineQuery,
  type TimelineEntry,
} from '@kerfline/domain/saw-timeline/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { namesOf } from '../records/record-support.js';
import { Saw } from '../saws/saw.model.js';
import { BladeRun } from '../blade-runs/blade-run.model.js';
import { Stop } from '../stops/stop.model.js';
import { CheckRecord } from '../site-checks/check-record.model.js';

type Cursor = NonNullable<SawTimelineQuery['before']>;

/**
 * One kind of record on a saw's timeline: a page of its newest entries that started before the cursor (scoped
 * by the caller's ability in SQL), and how many the caller may read in all. Another record (checks, say) goes
 * on the timeline by adding a source here and its kind to `timelineEntrySchema`.
 */
type TimelineSource = {
  page: (ability: AppAbility, sawId: string, before: Cursor | undefined, limit: number) => Promise<TimelineEntry[]>;
  count: (ability: AppAbility, sawId: string) => Promise<number>;
};

/** Rows that start strictly before the cursor in the timeline's order (start, then id, both descending). */
function beforeCursor(startColumn: string, before: Cursor | undefined): WhereOptions {
  if (!before) return {};
  return {
    [Op.or]: [{ [startColumn]: { [Op.lt]: before.at } }, { [startColumn]: before.at, id: { [Op.lt]: before.id } }],
  };
}

const iso = (d: Date | null): string | null => (d ? d.toISOString() : null);

/**
 * A page is read as plain rows (`raw: true`): the entries are built from the columns straight away, and building
 * a model instance for each of a page's rows cost more than the statements' own time.
 */
type Plain<M extends BladeRun | Stop | CheckRecord, Extra = object> = Attributes<M> & Extra;
type Counted = { photoCount: number };

const bladeRuns: TimelineSource = {
  async page(ability, sawId, before, limit) {
    const rows = (await BladeRun.findAll({
      raw: true,
      where: scopedWhere(ability, 'read', 'BladeRun', BladeRun, {
        [Op.and]: [{ sawId }, beforeCursor('installedAt', before)],
      }),
      attributes: {
        include: [
          [literal(`(SELECT name FROM blade_specs WHERE blade_specs.id = "BladeRun".blade_spec_id)`), 'bladeSpecName'],
          [literal(`(SELECT count(*)::int FROM photos WHERE photos.blade_run_id = "BladeRun".id)`), 'photoCount'],
        ],
      },
      order: [
        ['installedAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit,
    })) as unknown as Plain<BladeRun, Counted & { bladeSpecName: string | null }>[];
    const names = await namesOf(rows.map((r) => r.installedById));
    return rows.map((r) => ({
      kind: 'blade_run' as const,
      id: r.id,
      startedAt: r.installedAt.toISOString(),
      endedAt: iso(r.removedAt),
      byName: r.installedById ? (names.get(r.installedById) ?? null) : null,
      bladeSpecId: r.bladeSpecId,
      bladeSpecName: r.bladeSpecName ?? '',
      removalReason: r.removalReason,
      confirmedCause: r.confirmedCause as Extract<TimelineEntry, { kind: 'blade_run' }>['confirmedCause'],
      breakInFollowed: r.breakInFollowed,
      areaCutMm2: r.areaCutMm2,
      cuts: r.cuts,
      photoCount: Number(r.photoCount ?? 0),
    }));
  },
  count: (ability, sawId) => BladeRun.count({ where: scopedWhere(ability, 'read', 'BladeRun', BladeRun, { sawId }) }),
};

const stops: TimelineSource = {
  async page(ability, sawId, before, limit) {
    const rows = (await Stop.findAll({
      raw: true,
      where: scopedWhere(ability, 'read', 'Stop', Stop, { [Op.and]: [{ sawId }, beforeCursor('startedAt', before)] }),
      order: [
        ['startedAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit,
    })) as unknown as Plain<Stop>[];
    const names = await namesOf(rows.map((s) => s.createdById));
    const now = Date.now();
    return rows.map((s) => ({
      kind: 'stop' as const,
      id: s.id,
      startedAt: s.startedAt.toISOString(),
      endedAt: iso(s.endedAt),
      byName: s.createdById ? (names.get(s.createdById) ?? null) : null,
      category: s.category,
      planned: s.planned,
      notes: s.notes,
      durationMin: Math.max(0, ((s.endedAt?.getTime() ?? now) - s.startedAt.getTime()) / 60000),
    }));
  },
  count: (ability, sawId) => Stop.count({ where: scopedWhere(ability, 'read', 'Stop', Stop, { sawId }) }),
};

const checks: TimelineSource = {
  async page(ability, sawId, before, limit) {
    const rows = (await CheckRecord.findAll({
      raw: true,
      where: scopedWhere(ability, 'read', 'CheckRecord', CheckRecord, {
        [Op.and]: [{ sawId }, beforeCursor('checkedAt', before)],
      }),
      attributes: {
        include: [
          [literal(`(SELECT name FROM site_checks c WHERE c.id = "CheckRecord".site_check_id)`), 'checkName'],
          [literal(`(SELECT count(*)::int FROM photos p WHERE p.check_record_id = "CheckRecord".id)`), 'photoCount'],
        ],
      },
      order: [
        ['checkedAt', 'DESC'],
        ['id', 'DESC'],
      ],
      limit,
    })) as unknown as Plain<CheckRecord, Counted & { checkName: string | null }>[];
    const names = await namesOf(rows.map((r) => r.checkedById));
    return rows.map((r) => ({
      kind: 'check' as const,
      id: r.id,
      startedAt: r.checkedAt.toISOString(),
      endedAt: null,
      byName: r.checkedById ? (names.get(r.checkedById) ?? null) : null,
      siteCheckId: r.siteCheckId,
      checkName: r.checkName ?? '',
      quantity: r.quantity,
      reading: r.reading,
      passed: r.passed,
      photoCount: Number(r.photoCount ?? 0),
    }));
  },
  count: (ability, sawId) =>
    CheckRecord.count({ where: scopedWhere(ability, 'read', 'CheckRecord', CheckRecord, { sawId }) }),
};

export const TIMELINE_SOURCES: TimelineSource[] = [bladeRuns, stops, checks];

/** Newest first; entries that start at the same moment are ordered by id, as the cursor is. */
function newestFirst(a: TimelineEntry, b: TimelineEntry): number {
  const byTime = Date.parse(b.startedAt) - Date.parse(a.startedAt);
  if (byTime !== 0) return byTime;
  return a.id < b.id ? 1 : a.id > b.id ? -1 : 0;
}

/**
 * A page of one saw's timeline. Each source gives at most `limit + 1` entries before the cursor; merged and cut
 * to `limit`, an entry left over means there is an older page. Never loads more than a page per source.
 */
export async function getSawTimeline(ability: AppAbility, sawId: string, q: SawTimelineQuery): Promise<SawTimeline> {
  const saw = await Saw.findOne({
    where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }),
    attributes: ['id'],
    raw: true,
  });
  if (!saw) throw AppError.notFound('Saw');
  const [pages, counts] = await Promise.all([
    Promise.all(TIMELINE_SOURCES.map((source) => source.page(ability, saw.id, q.before, q.limit + 1))),
    Promise.all(TIMELINE_SOURCES.map((source) => source.count(ability, saw.id))),
  ]);
  const merged = pages.flat().sort(newestFirst);
  const items = merged.slice(0, q.limit);
  const last = items[items.length - 1];
  return {
    sawId: saw.id,
    items,
    total: counts.reduce((sum, n) => sum + n, 0),
    nextBefore: merged.length > q.limit && last ? timelineCursor(last) : null,
  };
}
