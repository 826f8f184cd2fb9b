import { describe, expect, it } from 'vitest';
import { DOWNTIME_CATEGORIES, FAILURE_CATEGORIES, periodSchema } from './schema.js';

describe('metrics schemas', () => {
  it('a period needs its end after its start and accepts ISO strings', () => {
    const p = periodSchema.parse({ periodStart: '2025-01-01T00:00:00Z', periodEnd: '2025-02-01T00:00:00Z' });
    expect(p.periodEnd.getTime() - p.periodStart.getTime()).toBe(31 * 86_400_000);
    const bad = periodSchema.safeParse({ periodStart: '2025-02-01', periodEnd: '2025-01-01' });
    expect(bad.success).toBe(false);
    expect(bad.error?.issues[0]).toMatchObject({ path: ['periodEnd'], message: 'Period end must be after its start' });
  });

  it('failure categories are downtime categories, and exclude planned and external stops', () => {
    for (const c of FAILURE_CATEGORIES) expect(DOWNTIME_CATEGORIES).toContain(c);
    expect(FAILURE_CATEGORIES).not.toContain('no_material_operator');
    expect(FAILURE_CATEGORIES).not.toContain('blade_change');
  });
});
