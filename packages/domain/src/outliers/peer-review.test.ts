import { describe, expect, it } from 'vitest';
import { PEER_MINIMUMS, peerValueText, reasonMix, reviewPeers, type SawForReview } from './peer-review.js';

const saw = (id: string, values: Partial<SawForReview['values']>, extra: Partial<SawForReview> = {}): SawForReview => ({
  id,
  kind: 'horizontal',
  mainMaterial: 'carbon_steel',
  bladesWithArea: 10,
  scheduledHours: 4000,
  values: { cost_per_area: null, blade_life: null, stop_hours: null, failure_rate: null, ...values },
  ...extra,
});

describe('reviewPeers: comparable saws, robust flags that explain themselves', () => {
  // Unplanned stop hours per 1 000 h of eight comparable saws; saw h is the planted bad one.
  const stopHours = [10, 11, 12, 12, 13, 14, 15, 40];
  const fleet = stopHours.map((v, i) => saw(`s${i + 1}`, { stop_hours: v }));

  it('flags the planted bad saw with its value, the peer median, the score and the method (worked by hand)', () => {
    const review = reviewPeers(fleet);
    // Median of the eight = (12 + 13) / 2 = 12.5. Absolute deviations 2.5 1.5 0.5 0.5 0.5 1.5 2.5 27.5 → sorted
    // 0.5 0.5 0.5 1.5 1.5 2.5 2.5 27.5 → MAD = (1.5 + 1.5) / 2 = 1.5. Saw s8: M = 0.6745 × 27.5 / 1.5 = 12.366.
    expect(review.flags).toHaveLength(1);
    const flag = review.flags[0]!;
    expect(flag).toMatchObject({ sawId: 's8', metric: 'stop_hours', value: 40, peerMedian: 12.5, peerCount: 8 });
    expect(flag.modifiedZ).toBeCloseTo((0.6745 * 27.5) / 1.5, 10);
    expect(flag.ratioToMedian).toBeCloseTo(3.2, 12);
    expect(flag.method).toContain('Modified z-score 12.4 against 8 comparable saws');
    expect(flag.method).toContain('±3.5');
    expect(flag.method).toContain('Iglewicz & Hoaglin');
    expect(flag.method).toContain('MAD 1.5');
    // The runner-up, s7: M = 0.6745 × 2.5 / 1.5 = 1.12, in line with its peers.
    expect(review.groups[0]!.metrics.stop_hours).toEqual({ judged: 8, median: 12.5, notice: null });
  });

  it('flags only the direction that costs: a saw with unusually long blade life is not flagged, a short one is', () => {
    const lives = [4.1e6, 4.3e6, 4.4e6, 4.5e6, 4.6e6, 4.8e6, 12e6, 1.2e6];
    const review = reviewPeers(lives.map((v, i) => saw(`b${i}`, { blade_life: v })));
    expect(review.flags.map((f) => [f.sawId, f.direction])).toEqual([['b7', 'low']]);
  });

  it('says when a saw has too few records, and when a group is too small to compare', () => {
    const review = reviewPeers([
      ...fleet,
      saw('new', { stop_hours: 99, blade_life: 1 }, { bladesWithArea: 2, scheduledHours: 300 }),
      saw('v1', { stop_hours: 5 }, { kind: 'vertical' }),
      saw('v2', { stop_hours: 50 }, { kind: 'vertical' }),
    ]);
    const reasons = (id: string) => review.notJudged.filter((n) => n.sawId === id);
    expect(reasons('new').find((n) => n.metric === 'stop_hours')?.reason).toBe(
      `Too few records to judge: 300 hours in service in the period; at least ${PEER_MINIMUMS.scheduledHours} (30 days) are needed.`,
    );
    expect(reasons('new').find((n) => n.metric === 'blade_life')?.reason).toMatch(
      /2 finished blades with the area cut recorded; at least 3/,
    );
    expect(reasons('v2').find((n) => n.metric === 'stop_hours')?.reason).toBe(
      'Only 2 comparable saws; at least 5 are needed before any is flagged.',
    );
    expect(review.flags.map((f) => f.sawId)).toEqual(['s8']);
    expect(review.groups.map((g) => g.key)).toEqual(['horizontal:carbon_steel', 'vertical:carbon_steel']);
  });

  it('keeps saws of another kind or another main material out of each other’s group', () => {
    const review = reviewPeers([
      ...fleet,
      saw('steel-vertical', { stop_hours: 40 }, { kind: 'vertical' }),
      saw('alu', { stop_hours: 400 }, { mainMaterial: 'aluminium' }),
    ]);
    expect(review.groups.find((g) => g.key === 'horizontal:carbon_steel')!.sawIds).not.toContain('alu');
    expect(review.flags.map((f) => f.sawId)).toEqual(['s8']);
  });
});

describe('reasonMix', () => {
  it('puts a saw’s reasons beside its peers’ and names the one in most excess (hand-worked shares)', () => {
    // Saw: 6 strippage, 2 worn out, 2 broken (10). Peers: 2 strippage, 16 worn out, 2 broken (20).
    // Strippage 0.6 vs 0.1 (+0.5), broken 0.2 vs 0.1 (+0.1): strippage stands out.
    const mix = reasonMix(
      { tooth_strippage: 6, worn_out: 2, broken: 2 },
      { tooth_strippage: 2, worn_out: 16, broken: 2 },
    );
    expect(mix.standout).toBe('tooth_strippage');
    expect(mix.rows.find((r) => r.reason === 'tooth_strippage')).toEqual({
      reason: 'tooth_strippage',
      saw: 6,
      sawShare: 0.6,
      peers: 2,
      peerShare: 0.1,
    });
    expect(mix.rows.map((r) => r.reason)).toEqual(['worn_out', 'tooth_strippage', 'broken']);
  });
  it('falls back to worn out when nothing else stands out, and to nothing without blades', () => {
    expect(reasonMix({ worn_out: 5, broken: 1 }, { worn_out: 5 }).standout).toBe('worn_out');
    expect(reasonMix({}, { worn_out: 5 }).standout).toBeNull();
  });
});

describe('peerValueText', () => {
  it('words each figure in the reader’s units', () => {
    // 4 500 000 mm² = 48.4 ft² = 4.5 m²; 0.0019 cents/mm² = $0.012/in² (see the display policy's own checks).
    expect(peerValueText('blade_life', 4_500_000, 'USD', 'imperial')).toBe('48.4 ft² per blade');
    expect(peerValueText('blade_life', 4_500_000, 'EUR', 'metric')).toBe('4.5 m² per blade');
    expect(peerValueText('cost_per_area', 0.0019, 'USD', 'imperial')).toBe('$0.012/in²');
    expect(peerValueText('stop_hours', 12.3456, 'USD', 'metric')).toBe('12.3 h per 1,000 h');
    expect(peerValueText('failure_rate', 0.5, 'USD', 'metric')).toBe('0.5 per 1,000 h');
  });
});
