import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { CHECK_KIND_IDS } from '../checks/schema.js';
import { BASE_WEIGHTS, CAUSE_IDS, rankLikelyCauses, type CauseId } from './likely-causes.js';
import { DIAGNOSIS_BASIS } from './likely-causes.js';
import { FAILURE_MODES, REMOVAL_REASONS, REMOVAL_REASON_LABELS, type DiagnosisEvidenceInput } from './schema.js';

// The weights are trade knowledge (common practice, no source); these tests check the ranking mechanics and
// the invariants the weights must keep, not the weights' values.

/** One piece of strong evidence per cause, where the evidence input can express one. */
const STRONG: Partial<Record<CauseId, DiagnosisEvidenceInput>> = {
  teeth_in_work_low: { cutLogs: [{ teethInWork: 2, bandSpeedMPerMin: null, recommendedMaxMPerMin: null }] },
  teeth_in_work_high: { cutLogs: [{ teethInWork: 30, bandSpeedMPerMin: null, recommendedMaxMPerMin: null }] },
  feed_high: { checks: [{ kind: 'feed_pressure', passed: false, overdue: false }] },
  band_speed_high: { cutLogs: [{ teethInWork: null, bandSpeedMPerMin: 120, recommendedMaxMPerMin: 90 }] },
  hard_spots: { hardSpotsReported: true },
  break_in_skipped: { breakInDone: false },
  tension_off: { checks: [{ kind: 'band_tension', passed: false, overdue: false }] },
  guides_worn: { checks: [{ kind: 'bearing_wear', passed: false, overdue: false }] },
  guides_too_far_apart: { guideArmsSetWide: true },
  guides_misaligned: { checks: [{ kind: 'guide_clearance', passed: false, overdue: false }] },
  tracking_off: { checks: [{ kind: 'tracking', passed: false, overdue: false }] },
  wheel_too_small: { bendingStressRatio: 1.4 },
  chip_brush_faulty: { checks: [{ kind: 'chip_brush', passed: false, overdue: false }] },
};

describe('rankLikelyCauses without evidence', () => {
  it('keeps the base order: weight first, then the fixed cause order for ties', () => {
    const d = rankLikelyCauses('fatigue_crack');
    expect(d.causes.map((c) => c.cause)).toEqual([
      'tension_off',
      'guides_too_far_apart',
      'wheel_too_small',
      'feed_high',
      'guides_worn',
    ]);
    expect(d.causes.map((c) => c.score)).toEqual([0.55, 0.45, 0.45, 0.4, 0.4]);
    expect(d.causes.every((c) => c.evidence.length === 0 && c.score === c.baseWeight)).toBe(true);
    expect(d.basis).toBe(DIAGNOSIS_BASIS);
    expect(d.basis).not.toMatch(/common practice|from memory/i);
    expect(d.modeLabel).toBe('Fatigue crack');
    expect(rankLikelyCauses('twist').modeLabel).toBe('Band twisted');
  });

  it('covers the trade causes named for each mode', () => {
    const causesOf = (m: Parameters<typeof rankLikelyCauses>[0]) => rankLikelyCauses(m).causes.map((c) => c.cause);
    expect(causesOf('tooth_strippage')).toEqual(
      expect.arrayContaining(['teeth_in_work_low', 'teeth_in_work_high', 'feed_high', 'hard_spots']),
    );
    expect(causesOf('fatigue_crack')).toEqual(
      expect.arrayContaining(['tension_off', 'feed_high', 'guides_too_far_apart', 'wheel_too_small', 'guides_worn']),
    );
    expect(causesOf('dulling')).toEqual(
      expect.arrayContaining(['band_speed_high', 'hard_spots', 'break_in_skipped', 'feed_low']),
    );
    expect(causesOf('crooked_cutting')).toEqual(
      expect.arrayContaining([
        'guides_worn',
        'guides_too_far_apart',
        'tension_off',
        'dull_band',
        'feed_high',
        'guides_misaligned',
        'tracking_off',
      ]),
    );
  });

  it('every base weight lies in [0.15, 0.6], so one strong evidence (+0.5) beats any cause without evidence', () => {
    for (const mode of FAILURE_MODES) {
      const ws = Object.values(BASE_WEIGHTS[mode]);
      expect(ws.length).toBeGreaterThan(0);
      for (const w of ws) {
        expect(w).toBeGreaterThanOrEqual(0.15);
        expect(w).toBeLessThanOrEqual(0.6);
      }
    }
  });
});

describe('rankLikelyCauses with evidence', () => {
  it('tooth strippage: a failed feed-pressure check lifts "feed too high" to the top, with the line behind it', () => {
    const d = rankLikelyCauses('tooth_strippage', {
      checks: [{ kind: 'feed_pressure', passed: false, overdue: false }],
    });
    expect(d.causes[0]).toMatchObject({ cause: 'feed_high', baseWeight: 0.55, score: 1.05 });
    expect(d.causes[0]?.evidence).toEqual([{ text: 'Last head down-force check failed.', effect: 0.5 }]);
  });

  it('fatigue crack: a too-small wheel lifts wheel_too_small above tension', () => {
    const d = rankLikelyCauses('fatigue_crack', { bendingStressRatio: 1.3 });
    expect(d.causes[0]?.cause).toBe('wheel_too_small');
    expect(d.causes[0]?.evidence[0]?.text).toContain('1.30×');
  });

  it('dulling: skipped break-in and cut logs above the recommended speed', () => {
    const d = rankLikelyCauses('dulling', {
      breakInDone: false,
      cutLogs: [
        { teethInWork: 8, bandSpeedMPerMin: 100, recommendedMaxMPerMin: 80 },
        { teethInWork: 8, bandSpeedMPerMin: 70, recommendedMaxMPerMin: 80 },
      ],
    });
    expect(d.causes[0]?.cause).toBe('band_speed_high');
    // 0.6 + (0.25 + 0.25 × 1/2) = 0.975; break-in 0.45 + 0.5 = 0.95.
    expect(d.causes[0]?.score).toBe(0.975);
    expect(d.causes[0]?.evidence[0]?.text).toBe(
      '1 of 2 cut logs ran above the recommended band speed (up to 25 % over).',
    );
    expect(d.causes[1]).toMatchObject({ cause: 'break_in_skipped', score: 0.95 });
  });

  it('each cause with strong evidence ranks above every cause without evidence, in every mode', () => {
    for (const mode of FAILURE_MODES) {
      for (const cause of Object.keys(BASE_WEIGHTS[mode]) as CauseId[]) {
        const ev = STRONG[cause];
        if (ev === undefined) continue;
        const d = rankLikelyCauses(mode, ev);
        const idx = d.causes.findIndex((c) => c.cause === cause);
        const firstWithout = d.causes.findIndex((c) => c.evidence.length === 0);
        expect(idx, `${mode}/${cause}`).toBeLessThan(firstWithout === -1 ? Infinity : firstWithout);
        // Evidence that speaks for this cause alone puts it on top.
        if (d.causes.filter((c) => c.evidence.some((l) => l.effect > 0)).length === 1)
          expect(d.causes[0]?.cause).toBe(cause);
      }
    }
  });

  it('an overdue check adds less than a failed one, and a current passed check lowers the cause', () => {
    const overdue = rankLikelyCauses('fatigue_crack', {
      checks: [{ kind: 'band_tension', passed: true, overdue: true }],
    });
    expect(overdue.causes[0]).toMatchObject({ cause: 'tension_off', score: 0.8 });
    const passed = rankLikelyCauses('fatigue_crack', {
      checks: [{ kind: 'band_tension', passed: true, overdue: false }],
    });
    expect(passed.causes.find((c) => c.cause === 'tension_off')?.score).toBe(0.4);
    expect(passed.causes[0]?.cause).toBe('guides_too_far_apart');
  });

  it('for several records of one check kind, the worst counts once', () => {
    const d = rankLikelyCauses('fatigue_crack', {
      checks: [
        { kind: 'band_tension', passed: true, overdue: false },
        { kind: 'band_tension', passed: false, overdue: false },
        { kind: 'band_tension', passed: null, overdue: true },
      ],
    });
    const t = d.causes.find((c) => c.cause === 'tension_off');
    expect(t?.evidence).toHaveLength(1);
    expect(t?.score).toBe(1.05);
  });

  it('teeth in work outside 3–24 speak for the matching cause, scaled by the share of logs', () => {
    const logs = [2, 8, 10, 12].map((t) => ({ teethInWork: t, bandSpeedMPerMin: null, recommendedMaxMPerMin: null }));
    const d = rankLikelyCauses('tooth_strippage', { cutLogs: logs });
    const low = d.causes.find((c) => c.cause === 'teeth_in_work_low');
    expect(low?.score).toBe(0.9125); // 0.6 + 0.25 + 0.25 × 1/4
    const high = d.causes.find((c) => c.cause === 'teeth_in_work_high');
    expect(high?.score).toBe(0.25); // 0.4 − 0.15: every log had at most 24
  });

  it('facts reported as fine lower their causes, never below 0', () => {
    const d = rankLikelyCauses('broken', {
      guideArmsSetWide: false,
      hardSpotsReported: false,
      bendingStressRatio: 0.7,
      breakInDone: true,
    });
    expect(d.causes.find((c) => c.cause === 'hard_spots')?.score).toBe(0.05);
    expect(d.causes.find((c) => c.cause === 'guides_too_far_apart')?.score).toBe(0.2);
    expect(d.causes.find((c) => c.cause === 'wheel_too_small')?.evidence[0]?.text).toContain('within the limit');
    const floor = rankLikelyCauses('other', {
      checks: [{ kind: 'band_tension', passed: true, overdue: false }],
      cutLogs: [{ teethInWork: 5, bandSpeedMPerMin: 50, recommendedMaxMPerMin: 60 }],
    });
    expect(floor.causes.every((c) => c.score >= 0)).toBe(true);
  });
});

describe('rankLikelyCauses properties (fast-check)', () => {
  const checkArb = fc.record({
    kind: fc.constantFrom(...CHECK_KIND_IDS),
    passed: fc.option(fc.boolean(), { nil: null }),
    overdue: fc.boolean(),
  });
  const logArb = fc.record({
    teethInWork: fc.option(fc.double({ min: 0, max: 60, noNaN: true }), { nil: null }),
    bandSpeedMPerMin: fc.option(fc.double({ min: 5, max: 200, noNaN: true }), { nil: null }),
    recommendedMaxMPerMin: fc.option(fc.double({ min: 5, max: 200, noNaN: true }), { nil: null }),
  });
  const modeArb = fc.constantFrom(...FAILURE_MODES);

  it('is deterministic: the order of checks and cut logs does not change the result', () => {
    fc.assert(
      fc.property(
        modeArb,
        fc.array(checkArb, { maxLength: 8 }),
        fc.array(logArb, { maxLength: 8 }),
        fc.boolean(),
        (mode, checks, cutLogs, seedFlip) => {
          const a = rankLikelyCauses(mode, { checks, cutLogs });
          const b = rankLikelyCauses(mode, {
            checks: [...checks].reverse(),
            cutLogs: seedFlip ? [...cutLogs].reverse() : cutLogs,
          });
          expect(b.causes.map((c) => [c.cause, c.score])).toEqual(a.causes.map((c) => [c.cause, c.score]));
        },
      ),
    );
  });

  it('failed checks never lower any cause, and the list stays sorted', () => {
    fc.assert(
      fc.property(modeArb, fc.uniqueArray(fc.constantFrom(...CHECK_KIND_IDS)), (mode, kinds) => {
        const base = rankLikelyCauses(mode);
        const withFails = rankLikelyCauses(mode, {
          checks: kinds.map((kind) => ({ kind, passed: false, overdue: false })),
        });
        for (const c of withFails.causes) {
          expect(c.score).toBeGreaterThanOrEqual(base.causes.find((b) => b.cause === c.cause)!.score);
        }
        for (let i = 1; i < withFails.causes.length; i++) {
          expect(withFails.causes[i]!.score).toBeLessThanOrEqual(withFails.causes[i - 1]!.score);
        }
        expect(withFails.causes.map((c) => c.cause).sort()).toEqual(base.causes.map((c) => c.cause).sort());
      }),
    );
  });
});

describe('removal reasons and input errors', () => {
  it('exports the product removal reasons with labels', () => {
    expect(REMOVAL_REASONS).toEqual([
      'worn_out',
      'tooth_strippage',
      'fatigue_crack',
      'broken',
      'crooked_cutting',
      'other',
    ]);
    expect(REMOVAL_REASONS.map((r) => REMOVAL_REASON_LABELS[r])).toEqual([
      'Worn out',
      'Tooth strippage',
      'Fatigue crack',
      'Broken',
      'Crooked cutting',
      'Other',
    ]);
    expect(CAUSE_IDS).toHaveLength(new Set(CAUSE_IDS).size);
  });

  it('rejects an unknown mode and bad evidence with messages that say what to fix', () => {
    expect(() => rankLikelyCauses('melted' as never)).toThrow(/Failure mode must be one of worn_out/);
    expect(() =>
      rankLikelyCauses('broken', {
        cutLogs: [{ teethInWork: -1, bandSpeedMPerMin: null, recommendedMaxMPerMin: null }],
      }),
    ).toThrow(/Teeth in work must not be negative/);
    expect(() => rankLikelyCauses('broken', { teethInWorkRange: { min: 30, max: 3 } })).toThrow(
      /min must be below max/,
    );
  });
});
