import { ForbiddenError, subject } from '@casl/ability';
import { Op, type WhereOptions } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { Page } from '@kerfline/domain/common/schema';
import type { CutLog as CutLogDto, CutLogCreateParsed, CutLogListQuery } from '@kerfline/domain/cut-logs/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import type { BladeMaterial } from '@kerfline/domain/checks/schema';
import type { RemoveRecordInput } from '@kerfline/domain/removed-records/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { writeAudit, type Actor } from '../../audit/write-audit.js';
import { inTransaction } from '../../db/models.js';
import { Site } from '../sites/site.model.js';
import { pitchOf } from '../blade-specs/blade-spec-dto.js';
import { auditCopy, orderOf, sawForWrite, select, siteEffectiveSettings } from '../records/record-support.js';
import { cutLogFigures } from '../records/trade.js';
import { removeToKept } from '../removed-records/keep-records.js';
import { CutLog } from './cut-log.model.js';

function toDto(log: CutLog): CutLogDto {
  return {
    id: log.id,
    siteId: log.siteId,
    sawId: log.sawId,
    bladeRunId: log.bladeRunId,
    cutAt: log.cutAt.toISOString(),
    shape: log.shape,
    pieceCount: log.pieceCount,
    piecesAcross: log.piecesAcross,
    materialGroup: log.materialGroup,
    quantity: log.quantity,
    bandSpeedMPerMin: log.bandSpeedMPerMin,
    feedMmPerMin: log.feedMmPerMin,
    cutTimeS: log.cutTimeS,
    areaPerCutMm2: log.areaPerCutMm2,
    areaCutMm2: log.areaCutMm2,
    teethInWorkMin: log.teethInWorkMin,
    teethInWorkMax: log.teethInWorkMax,
    warnings: log.warnings,
    notes: log.notes,
    createdById: log.createdById,
    createdAt: log.createdAt.toISOString(),
  };
}

export async function listCutLogs(ability: AppAbility, q: CutLogListQuery): Promise<Page<CutLogDto>> {
  const filter: WhereOptions[] = [];
  if (q.siteId) filter.push({ siteId: q.siteId });
  if (q.sawId) filter.push({ sawId: q.sawId });
  if (q.bladeRunId) filter.push({ bladeRunId: q.bladeRunId });
  if (q.materialGroup) filter.push({ materialGroup: q.materialGroup });
  if (q.from) filter.push({ cutAt: { [Op.gte]: q.from } });
  if (q.to) filter.push({ cutAt: { [Op.lt]: q.to } });
  const { rows, count } = await CutLog.findAndCountAll({
    where: scopedWhere(ability, 'read', 'CutLog', CutLog, { [Op.and]: filter }),
    order: orderOf(q.sort),
    limit: q.limit,
    offset: q.offset,
  });
  return { items: rows.map(toDto), total: count, limit: q.limit, offset: q.offset };
}

async function findReadableLog(ability: AppAbility, id: string): Promise<CutLog> {
  const log = await CutLog.findOne({ where: scopedWhere(ability, 'read', 'CutLog', CutLog, { id }) });
  if (!log) throw AppError.notFound('Cut log');
  return log;
}

export async function getCutLog(ability: AppAbility, id: string): Promise<CutLogDto> {
  return toDto(await findReadableLog(ability, id));
}

/**
 * Logs a cut. The log joins the blade run that was on the saw at `cutAt` (found through the runs' exclusion
 * index), whose spec gives the pitch for the teeth in the work. Warnings outside the trade's limits come back
 * with the stored record; they never refuse it.
 */
export async function createCutLog({ ability, userId }: Actor, input: CutLogCreateParsed): Promise<CutLogDto> {
  const saw = await sawForWrite(ability, input.sawId, 'create', 'CutLog', { path: 'sawId' });
  const cutAt = input.cutAt ?? new Date();
  const [run] = await select<{ id: string; coarse_tpi: number; fine_tpi: number | null; material: BladeMaterial }>(
    `SELECT r.id, b.coarse_tpi, b.fine_tpi, b.material FROM blade_runs r JOIN blade_specs b ON b.id = r.blade_spec_id
      WHERE r.saw_id = :sawId AND tstzrange(r.installed_at, r.removed_at, '[)') @> :cutAt::timestamptz
      LIMIT 1`,
    { sawId: saw.id, cutAt },
  );
  const site = await Site.findByPk(saw.siteId, { attributes: ['unitSystem'] });
  const figures = cutLogFigures({
    shape: input.stock.shape,
    pieceCount: input.stock.pieceCount,
    piecesAcross: input.stock.piecesAcross,
    quantity: input.quantity,
    materialGroup: input.materialGroup,
    bandSpeedMPerMin: input.bandSpeedMPerMin,
    pitch: run ? pitchOf({ coarseTpi: run.coarse_tpi, fineTpi: run.fine_tpi }) : null,
    bladeMaterial: run?.material ?? null,
    saw,
    unitSystem: (site?.unitSystem ?? 'metric') as UnitSystem,
    settings: await siteEffectiveSettings(saw.siteId),
  });
  const log = await inTransaction(async (transaction) => {
    const created = await CutLog.create(
      {
        siteId: saw.siteId,
        sawId: saw.id,
        bladeRunId: run?.id ?? null,
        cutAt,
        shape: input.stock.shape,
        pieceCount: input.stock.pieceCount,
        piecesAcross: input.stock.piecesAcross,
        materialGroup: input.materialGroup,
        quantity: input.quantity,
        bandSpeedMPerMin: input.bandSpeedMPerMin,
        feedMmPerMin: input.feedMmPerMin,
        cutTimeS: input.cutTimeS,
        ...figures,
        notes: input.notes,
        createdById: userId,
      },
      { transaction },
    );
    await writeAudit(transaction, userId, [
      { siteId: created.siteId, entity: 'CutLog', entityId: created.id, action: 'create', after: auditCopy(created) },
    ]);
    return created;
  });
  return toDto(log);
}

/** Removes a cut log entered by mistake to the kept records (it can be put back); site admins only. */
export async function deleteCutLog(
  { ability, userId }: Actor,
  id: string,
  { reason }: RemoveRecordInput,
): Promise<void> {
  const log = await findReadableLog(ability, id);
  ForbiddenError.from(ability)
    .setMessage('You cannot delete this cut log')
    .throwUnlessCan('delete', subject('CutLog', log.get({ plain: true })));
  await sawForWrite(ability, log.sawId, 'delete', 'CutLog');
  await inTransaction((transaction) =>
    removeToKept(transaction, null, { subject: 'CutLog', recordId: log.id, reason, userId }),
  );
}
