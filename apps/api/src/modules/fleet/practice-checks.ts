import type { Sequelize } from 'sequelize';
import type { MonthPeriod } from '@kerfline/domain/fleet/period';
import type { FigureScope } from './fleet-figures.js';

export type ChecksPractice = {
  due: number;
  onTime: number;
  medianLifeOnTimeMm2: number | null;
  medianLifeLateMm2: number | null;
};

/**
 * Checks done on time per site in the period. Maintenance checks are not recorded in this version yet, so no
 * site has a figure (the screens say so) until the checks feature lands.
 */
export async function checksPractice(
  _sequelize: Sequelize,
  _scope: FigureScope,
  _period: MonthPeriod,
): Promise<Map<string, ChecksPractice>> {
  return new Map();
}
