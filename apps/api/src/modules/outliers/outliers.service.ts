import { Op } from 'sequelize';
import type { AppAbility } from '@kerfline/domain/authz/ability';
import type { FleetQuery, PeriodQuery } from '@kerfline/domain/fleet/schema';
import type { OutlierReview, SawOutlier } from '@kerfline/domain/outliers/review-schema';
import { reasonMix } from '@kerfline/domain/outliers/peer-review';
import { REMOVAL_REASONS, type RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { addMonths, monthStartInstant } from '@kerfline/domain/fleet/period';
import type { FollowUpState } from '@kerfline/domain/follow-ups/schema';
import { scopedWhere } from '../../authz/sequelize-scope.js';
import { AppError } from '../../errors.js';
import { Saw } from '../saws/saw.model.js';
import { FollowUp } from '../follow-ups/follow-up.model.js';
import { diagnose } from '../records/trade.js';
import { reviewScope, sawCutLogs, type ReviewedSaw } from './review.js';

type Active = { id: string; state: FollowUpState; dueOn: string };

/** The newest follow-up not yet done of each saw the caller may read. */
async function activeFollowUps(ability: AppAbility, sawIds: string[]): Promise<Map<string, Active>> {
  if (sawIds.length === 0) return new Map();
  const rows = await FollowUp.findAll({
    where: scopedWhere(ability, 'read', 'FollowUp', FollowUp, {
      sawId: { [Op.in]: sawIds },
      state: { [Op.ne]: 'done' },
    }),
    order: [['createdAt', 'DESC']],
  });
  const map = new Map<string, Active>();
  for (const r of rows) if (!map.has(r.sawId)) map.set(r.sawId, { id: r.id, state: r.state, dueOn: r.dueOn });
  return map;
}

function reviewedDto(s: ReviewedSaw, active: Map<string, Active>) {
  return {
    saw: s.saw,
    site: {
      id: s.site.id,
      code: s.site.code,
      name: s.site.name,
      colourIndex: s.site.colourIndex,
      unitSystem: s.site.unitSystem,
    },
    values: s.values,
    bladesWithArea: s.figures.bladesWithArea,
    scheduledHours: s.figures.scheduledHours,
    activeFollowUp: active.get(s.saw.id) ?? null,
  };
}

/** Every saw in scope judged against its peers: the regional lead's home. */
export async function getOutlierReview(ability: AppAbility, q: FleetQuery, asOf = new Date()): Promise<OutlierReview> {
  const result = await reviewScope(ability, { from: q.from, to: q.to }, { asOf, siteIds: q.sites });
  const active = await activeFollowUps(
    ability,
    result.saws.map((s) => s.saw.id),
  );
  return {
    period: result.period,
    asOf: asOf.toISOString(),
    reportingCurrency: result.reportingCurrency,
    saws: result.saws.map((s) => reviewedDto(s, active)),
    groups: result.review.groups,
    flags: result.review.flags,
    notJudged: result.review.notJudged,
    warnings: result.warnings,
  };
}

/**
 * One saw among its peers: each figure's verdict, its blades taken off by reason beside its peers' pooled mix,
 * and the likely causes of the reason that stands out (the domain's diagnosis, fed with the saw's cut logs in
 * the period and how often its blades' break-in was skipped). 404 outside the caller's scope.
 */
export async function getSawOutlier(
  ability: AppAbility,
  sawId: string,
  q: PeriodQuery,
  asOf = new Date(),
): Promise<SawOutlier> {
  const saw = await Saw.findOne({ where: scopedWhere(ability, 'read', 'Saw', Saw, { id: sawId }) });
  if (!saw) throw AppError.notFound('Saw');
  const period = { from: q.from, to: q.to };
  const result = await reviewScope(ability, period, { asOf });
  const me = result.saws.find((s) => s.saw.id === saw.id);
  if (!me) throw AppError.notFound('Saw');
  const group = result.review.groups.find((g) => g.sawIds.includes(saw.id))!;
  const peers = result.saws.filter((s) => group.sawIds.includes(s.saw.id) && s.saw.id !== saw.id);
  const pooled: Partial<Record<RemovalReason, number>> = {};
  for (const p of peers) for (const r of REMOVAL_REASONS) pooled[r] = (pooled[r] ?? 0) + p.removalReasons[r];
  const mix = reasonMix(me.removalReasons, pooled);

  let likelyCauses: SawOutlier['likelyCauses'] = null;
  if (mix.standout) {
    const start = monthStartInstant(period.from, me.site.timeZone);
    const end = monthStartInstant(addMonths(period.to, 1), me.site.timeZone);
    const logs = await sawCutLogs(ability, saw.id, start, end);
    const f = me.figures;
    const skippedShare = f.breakInRecorded > 0 ? (f.breakInRecorded - f.breakInFollowed) / f.breakInRecorded : null;
    // Break-in as evidence: skipped on at least half of the blades speaks for it; on at most a tenth, against it.
    const breakInFollowed =
      skippedShare === null ? null : skippedShare >= 0.5 ? false : skippedShare <= 0.1 ? true : null;
    const diagnosis = diagnose(mix.standout, {
      cutLogs: logs.map((l) => ({
        teethInWorkMin: l.teeth_in_work_min,
        teethInWorkMax: l.teeth_in_work_max,
        bandSpeedMPerMin: l.band_speed_m_per_min,
        materialGroup: l.material_group,
      })),
      breakInFollowed,
    });
    likelyCauses = {
      mode: diagnosis.mode,
      modeLabel: diagnosis.modeLabel,
      basis: diagnosis.basis,
      causes: diagnosis.causes.slice(0, 4).map((c) => ({
        cause: c.cause,
        label: c.label,
        advice: c.advice,
        score: c.score,
        evidence: c.evidence,
      })),
      evidenceUsed: { cutLogs: logs.length, breakInSkippedShare: skippedShare },
    };
  }
  const active = await activeFollowUps(ability, [me.saw.id, ...peers.map((p) => p.saw.id)]);
  return {
    period,
    asOf: asOf.toISOString(),
    reportingCurrency: result.reportingCurrency,
    saw: reviewedDto(me, active),
    group,
    peers: peers.map((p) => reviewedDto(p, active)),
    flags: result.review.flags.filter((f) => f.sawId === saw.id),
    notJudged: result.review.notJudged
      .filter((n) => n.sawId === saw.id)
      .map(({ metric, reason }) => ({ metric, reason })),
    reasonMix: mix.rows,
    standoutReason: mix.standout,
    likelyCauses,
    warnings: result.warnings,
  };
}
