import { z } from 'zod';
import { REMOVAL_REASONS, type RemovalReason } from '../diagnosis/schema.js';
import type { SawKind } from '../saws/schema.js';
import type { MaterialGroup } from '../band-speed/schema.js';
import { MODIFIED_Z_FACTOR, findOutliers } from './robust-outliers.js';
import { OUTLIER_DEFAULTS } from './schema.js';
import type { UnitSystem } from '../sites/schema.js';
import { largeAreaToDisplay, moneyPerAreaToDisplay } from '../units/display.js';

/**
 * Saws compared with their peers: saws of the same kind (horizontal or vertical) that mostly cut the same material
 * group. Each figure is judged with `findOutliers` (modified z-score, Iglewicz & Hoaglin; NIST/SEMATECH
 * §1.3.5.17) within the peer group, and only the direction that costs money or hours is a flag. A saw with too
 * few records for a figure is not judged on it and says so.
 */
export const PEER_METRICS = ['cost_per_area', 'blade_life', 'stop_hours', 'failure_rate'] as const;
export type PeerMetric = (typeof PEER_METRICS)[number];

export const PEER_METRIC_INFO: Record<
  PeerMetric,
  { label: string; bad: 'high' | 'low'; unit: string; description: string }
> = {
  cost_per_area: {
    label: 'Cost per area cut',
    bad: 'high',
    unit: 'reporting-currency minor units per mm²',
    description: 'Cost of the blades taken off in the period ÷ the area they cut.',
  },
  blade_life: {
    label: 'Blade life',
    bad: 'low',
    unit: 'mm² per blade',
    description: 'Median area cut by the blades taken off in the period.',
  },
  stop_hours: {
    label: 'Unplanned stop hours',
    bad: 'high',
    unit: 'hours per 1,000 scheduled hours',
    description: 'Hours of unplanned stops per 1,000 hours in service in the period.',
  },
  failure_rate: {
    label: 'Failures',
    bad: 'high',
    unit: 'failures per 1,000 scheduled hours',
    description: 'Unplanned failure stops begun in the period per 1,000 hours in service.',
  },
};

/**
 * Least evidence before a saw is judged on a figure (our choice): three finished blades with their area for the
 * blade figures; 30 days in service for the stop figures.
 */
export const PEER_MINIMUMS = { finishedBlades: 3, scheduledHours: 720 } as const;

export type SawForReview = {
  id: string;
  kind: SawKind;
  mainMaterial: MaterialGroup | null;
  /** Finished blades with their area recorded, and hours in service, in the period. */
  bladesWithArea: number;
  scheduledHours: number;
  /** Each figure's value; null when it could not be computed (then `missingReason` says why). */
  values: Record<PeerMetric, number | null>;
  missingReason?: Partial<Record<PeerMetric, string>>;
};

export type PeerFlag = {
  sawId: string;
  metric: PeerMetric;
  groupKey: string;
  value: number;
  peerMedian: number;
  /** Saws judged on this figure in the group, the flagged one included. */
  peerCount: number;
  modifiedZ: number;
  direction: 'high' | 'low';
  /** value ÷ peer median; null when the median is 0. */
  ratioToMedian: number | null;
  threshold: number;
  scale: 'mad' | 'mean_absolute_deviation';
  /** How the flag was reached, in words without units (the screens add the value and median in the reader's units). */
  method: string;
};

export type PeerGroupSummary = {
  key: string;
  kind: SawKind;
  mainMaterial: MaterialGroup | null;
  sawIds: string[];
  metrics: Record<PeerMetric, { judged: number; median: number | null; notice: string | null }>;
};

export type NotJudged = { sawId: string; metric: PeerMetric; reason: string };

export type PeerReview = { groups: PeerGroupSummary[]; flags: PeerFlag[]; notJudged: NotJudged[] };

export const peerGroupKey = (kind: SawKind, mainMaterial: MaterialGroup | null): string =>
  `${kind}:${mainMaterial ?? 'unknown'}`;

function enoughRecords(saw: SawForReview, metric: PeerMetric): string | null {
  if (metric === 'cost_per_area' || metric === 'blade_life') {
    if (saw.bladesWithArea < PEER_MINIMUMS.finishedBlades)
      return `Too few records to judge: ${saw.bladesWithArea} finished blade${saw.bladesWithArea === 1 ? '' : 's'} with the area cut recorded; at least ${PEER_MINIMUMS.finishedBlades} are needed.`;
  } else if (saw.scheduledHours < PEER_MINIMUMS.scheduledHours) {
    return `Too few records to judge: ${Math.round(saw.scheduledHours)} hours in service in the period; at least ${PEER_MINIMUMS.scheduledHours} (30 days) are needed.`;
  }
  return null;
}

const fmt = (x: number) => String(Number(x.toPrecision(3)));

/** Compares every saw with its peers on each figure. Pure: the caller brings the figures, already scoped. */
export function reviewPeers(saws: readonly SawForReview[]): PeerReview {
  const byGroup = new Map<string, SawForReview[]>();
  for (const saw of saws) {
    const key = peerGroupKey(saw.kind, saw.mainMaterial);
    const members = byGroup.get(key);
    if (members) members.push(saw);
    else byGroup.set(key, [saw]);
  }
  const groups: PeerGroupSummary[] = [];
  const flags: PeerFlag[] = [];
  const notJudged: NotJudged[] = [];

  for (const [key, members] of [...byGroup.entries()].sort(([a], [b]) => a.localeCompare(b))) {
    const metrics = {} as PeerGroupSummary['metrics'];
    for (const metric of PEER_METRICS) {
      const judged: { id: string; value: number }[] = [];
      for (const saw of members) {
        const lacking = enoughRecords(saw, metric);
        const value = saw.values[metric];
        if (lacking) notJudged.push({ sawId: saw.id, metric, reason: lacking });
        else if (value === null)
          notJudged.push({
            sawId: saw.id,
            metric,
            reason: saw.missingReason?.[metric] ?? 'Not enough recorded to work this figure out.',
          });
        else judged.push({ id: saw.id, value });
      }
      const result = findOutliers({ items: judged });
      metrics[metric] = { judged: judged.length, median: result.median, notice: result.notice };
      if (result.notice && result.scale === null) {
        // Too small a group (or no spread): every judged saw is told why it was not compared.
        for (const item of judged) notJudged.push({ sawId: item.id, metric, reason: result.notice });
        continue;
      }
      const bad = PEER_METRIC_INFO[metric].bad;
      for (const item of result.items) {
        if (!item.flagged || item.direction !== bad || item.modifiedZ === null) continue;
        const scale = result.scale!;
        const spread =
          scale === 'mad'
            ? `the median absolute deviation (MAD ${fmt(result.mad!)}), scaled by ${MODIFIED_Z_FACTOR}`
            : 'the mean absolute deviation, because more than half the peers share one value';
        flags.push({
          sawId: item.id,
          metric,
          groupKey: key,
          value: item.value,
          peerMedian: result.median!,
          peerCount: judged.length,
          modifiedZ: item.modifiedZ,
          direction: item.direction,
          ratioToMedian: item.ratioToMedian,
          threshold: result.threshold,
          scale,
          method: `Modified z-score ${fmt(item.modifiedZ)} against ${judged.length} comparable saws, beyond the limit of ±${fmt(result.threshold)} (Iglewicz & Hoaglin; NIST/SEMATECH e-Handbook §1.3.5.17); the spread is ${spread}.`,
        });
      }
    }
    const [kind, material] = key.split(':') as [SawKind, string];
    groups.push({
      key,
      kind,
      mainMaterial: material === 'unknown' ? null : (material as MaterialGroup),
      sawIds: members.map((m) => m.id),
      metrics,
    });
  }
  flags.sort((a, b) => Math.abs(b.modifiedZ) - Math.abs(a.modifiedZ));
  return { groups, flags, notJudged };
}

export type ReasonMixRow = { reason: RemovalReason; saw: number; sawShare: number; peers: number; peerShare: number };

/**
 * A saw's blades taken off by reason beside its peers' (the other saws of its group, pooled). `standout` is the
 * reason the saw has most in excess of its peers, counting only reasons it has at least twice; worn-out blades are
 * the normal end of life and stand out only when nothing else does.
 */
export function reasonMix(
  saw: Partial<Record<RemovalReason, number>>,
  peers: Partial<Record<RemovalReason, number>>,
): { rows: ReasonMixRow[]; standout: RemovalReason | null } {
  const total = (m: Partial<Record<RemovalReason, number>>) => REMOVAL_REASONS.reduce((t, r) => t + (m[r] ?? 0), 0);
  const sawTotal = total(saw);
  const peerTotal = total(peers);
  const rows = REMOVAL_REASONS.map((reason) => ({
    reason,
    saw: saw[reason] ?? 0,
    sawShare: sawTotal === 0 ? 0 : (saw[reason] ?? 0) / sawTotal,
    peers: peers[reason] ?? 0,
    peerShare: peerTotal === 0 ? 0 : (peers[reason] ?? 0) / peerTotal,
  }));
  const candidates = rows
    .filter((r) => r.saw >= 2 && r.reason !== 'worn_out')
    .sort((a, b) => b.sawShare - b.peerShare - (a.sawShare - a.peerShare) || b.saw - a.saw);
  const excess = candidates.find((r) => r.sawShare > r.peerShare);
  const standout = excess?.reason ?? (sawTotal > 0 ? 'worn_out' : null);
  return { rows: rows.filter((r) => r.saw > 0 || r.peers > 0), standout };
}

export const peerMetricSchema = z.enum(PEER_METRICS, { message: `must be one of ${PEER_METRICS.join(', ')}` });
export const OUTLIER_THRESHOLD = OUTLIER_DEFAULTS.threshold;

/**
 * A peer figure in words in a unit system: blade life in ft² or m² per blade, cost per area in the reporting
 * currency per in² or cm², stop hours and failures per 1,000 scheduled hours.
 */
export function peerValueText(metric: PeerMetric, value: number, currency: string, system: UnitSystem): string {
  switch (metric) {
    case 'blade_life':
      return `${largeAreaToDisplay(value, system).text} per blade`;
    case 'cost_per_area':
      return moneyPerAreaToDisplay(value, currency, system).text;
    case 'stop_hours':
      return `${Number(value.toPrecision(3))} h per 1,000 h`;
    case 'failure_rate':
      return `${Number(value.toPrecision(3))} per 1,000 h`;
  }
}
