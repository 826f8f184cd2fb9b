import type { z } from 'zod';
import { median } from 'simple-statistics';
import { in2ToMm2, cm2ToMm2 } from '../units/units.js';
import {
  bladeLifeInputSchema,
  costPerAreaInputSchema,
  spendAgainstBudgetInputSchema,
  type BladeRunLife,
  type CostPerAreaInput,
  type SpendAgainstBudgetInput,
} from './schema.js';

/** What `spendAgainstBudgetInputSchema` gives once it has checked an input. */
export type SpendAgainstBudgetValues = z.output<typeof spendAgainstBudgetInputSchema>;

export interface BladeLife {
  /** Removed blades: the lives that are finished. */
  bladeCount: number;
  /** Runs still on a saw; not part of the averages. */
  openRunCount: number;
  totalAreaMm2: number;
  totalCuts: number;
  /** Mean area per finished blade, mm²; null without finished blades. */
  meanAreaMm2PerBlade: number | null;
  medianAreaMm2PerBlade: number | null;
  meanCutsPerBlade: number | null;
}

/**
 * Blade life from blade runs: area (mm²) and cuts per blade, over removed blades only, since a blade still on
 * the saw has not finished its life. The median (simple-statistics) is given beside the mean because a few
 * early failures pull the mean down.
 */
export function bladeLife(runs: readonly BladeRunLife[]): BladeLife {
  const all = bladeLifeInputSchema.parse(runs);
  const done = all.filter((r) => r.removed);
  const totalAreaMm2 = done.reduce((t, r) => t + r.areaCutMm2, 0);
  const totalCuts = done.reduce((t, r) => t + r.cuts, 0);
  const n = done.length;
  return {
    bladeCount: n,
    openRunCount: all.length - n,
    totalAreaMm2,
    totalCuts,
    meanAreaMm2PerBlade: n === 0 ? null : totalAreaMm2 / n,
    medianAreaMm2PerBlade: n === 0 ? null : median(done.map((r) => r.areaCutMm2)),
    meanCutsPerBlade: n === 0 ? null : totalCuts / n,
  };
}

export interface CostPerArea {
  currency: string;
  costMinor: number;
  areaCutMm2: number;
  /**
   * Minor units of `currency` (e.g. cents) per unit area, as plain numbers, not rounded: a fraction of a cent
   * per mm² is the normal case. Null when no area was cut.
   */
  minorPerMm2: number | null;
  minorPerCm2: number | null;
  minorPerIn2: number | null;
  reason: string | null;
}

/**
 * Cost per area cut: blade cost (integer minor units, e.g. cents) ÷ area cut. Given per mm², per cm² (× 100)
 * and per in² (× 645.16, exact from 1 in = 25.4 mm) via the units module.
 */
export function costPerAreaCut(input: CostPerAreaInput): CostPerArea {
  const v = costPerAreaInputSchema.parse(input);
  if (v.areaCutMm2 === 0) {
    return {
      ...v,
      minorPerMm2: null,
      minorPerCm2: null,
      minorPerIn2: null,
      reason: 'No area cut: cost per area is not defined.',
    };
  }
  const perMm2 = v.costMinor / v.areaCutMm2;
  return {
    ...v,
    minorPerMm2: perMm2,
    minorPerCm2: perMm2 * cm2ToMm2(1),
    minorPerIn2: perMm2 * in2ToMm2(1),
    reason: null,
  };
}

export interface SpendAgainstBudget {
  currency: string;
  budgetMinor: number;
  /** Spend dated in [periodStart, min(asOf, periodEnd)], minor units. */
  spentMinor: number;
  /** Budget less spend; negative when over. */
  remainingMinor: number;
  overBudget: boolean;
  /** Spend as a percentage of the budget; null for a zero budget. */
  percentUsed: number | null;
  /** Share of the period elapsed at `asOf`, 0–1. */
  elapsedFraction: number;
  /** Spend at the current rate over the whole period, rounded to whole minor units; null before the period starts. */
  projectedMinor: number | null;
  projectedOverBudget: boolean | null;
  projectedPercent: number | null;
}

/**
 * Blade spend in a period against its budget, all money in integer minor units of one currency (a spend in
 * another currency is rejected: convert first). The projection assumes spending continues at the rate so far:
 * spent ÷ elapsed time × period length.
 */
export function bladeSpendAgainstBudget(input: SpendAgainstBudgetInput): SpendAgainstBudget {
  return spendAgainstBudgetChecked(spendAgainstBudgetInputSchema.parse(input));
}

/**
 * `bladeSpendAgainstBudget` without checking its input again, for a caller that built it from values already
 * checked (the budgets screen computes 12 months for each of 60 sites a request, and the check was most of that
 * request's time). The input must hold what the schema checks: whole minor units, every spend in `currency`,
 * `periodEnd` after `periodStart`.
 */
export function spendAgainstBudgetChecked(v: SpendAgainstBudgetValues): SpendAgainstBudget {
  const from = v.periodStart.getTime();
  const to = v.periodEnd.getTime();
  const until = Math.min(v.asOf.getTime(), to);
  const spentMinor = v.spends
    .filter((s) => s.at.getTime() >= from && s.at.getTime() <= until && s.at.getTime() < to)
    .reduce((t, s) => t + s.amountMinor, 0);
  const elapsedMs = Math.max(0, until - from);
  const elapsedFraction = elapsedMs / (to - from);
  const projectedMinor = elapsedMs === 0 ? null : Math.round((spentMinor * (to - from)) / elapsedMs);
  const pct = (x: number): number | null => (v.budgetMinor === 0 ? null : (x / v.budgetMinor) * 100);
  return {
    currency: v.currency,
    budgetMinor: v.budgetMinor,
    spentMinor,
    remainingMinor: v.budgetMinor - spentMinor,
    overBudget: spentMinor > v.budgetMinor,
    percentUsed: pct(spentMinor),
    elapsedFraction,
    projectedMinor,
    projectedOverBudget: projectedMinor === null ? null : projectedMinor > v.budgetMinor,
    projectedPercent: projectedMinor === null ? null : pct(projectedMinor),
  };
}
