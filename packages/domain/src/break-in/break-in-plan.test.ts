import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ZodError } from 'zod';
import { in2ToMm2, mm2ToIn2 } from '../units/units.js';
import { breakInSettingsForSite, planBreakIn, planBreakInForSite } from './break-in-plan.js';
import { BREAK_IN_DEFAULTS, breakInPlanRequestSchema } from './schema.js';

describe('planBreakIn, time mode (common practice, no source)', () => {
  it('defaults to full band speed, a third of the feed for 10 min, then 50 % and 75 % for 5 min each', () => {
    const plan = planBreakIn();
    expect(plan.mode).toBe('time');
    expect(plan.steps.map((s) => [s.kind, s.feedFraction, s.durationMin, s.bandSpeedFraction])).toEqual([
      ['reduced', 1 / 3, 10, 1],
      ['ramp', 0.5, 5, 1],
      ['ramp', 0.75, 5, 1],
      ['normal', 1, null, 1],
    ]);
    expect(plan.totalDurationMin).toBe(20);
    expect(plan.totalAreaMm2).toBeNull();
    expect(plan.steps.every((s) => s.areaMm2 === null)).toBe(true);
    expect(plan.basis).toMatchObject({ kind: 'site_setting', settingKey: 'break_in', changedAt: null });
    expect(plan.bandSpeed).toBeNull();
    expect(plan.steps[0]?.note).toContain('33 % of normal for 10 min');
    expect(plan.steps[0]?.note).toContain('full normal band speed');
  });

  it('gives the area of each step from a known cutting rate (feed fraction × rate × minutes)', () => {
    // Worked by hand: rate 6 000 mm²/min. 1/3 × 6 000 × 10 = 20 000; 0.5 × 6 000 × 5 = 15 000;
    // 0.75 × 6 000 × 5 = 22 500; total 57 500 mm².
    const plan = planBreakIn({ mode: 'time' }, 6000);
    expect(plan.steps.map((s) => s.areaMm2)).toEqual([expect.closeTo(20000, 9), 15000, 22500, null]);
    expect(plan.totalAreaMm2).toBeCloseTo(57500, 9);
    expect(plan.normalCuttingRateMm2PerMin).toBe(6000);
  });

  it('takes custom steps and a reduced band speed', () => {
    const plan = planBreakIn({
      mode: 'time',
      bandSpeedFraction: 0.8,
      initialFeedFraction: 0.25,
      rampFeedFractions: [0.5],
      initialDurationMin: 15,
      rampStepDurationMin: 10,
    });
    expect(plan.steps.map((s) => [s.feedFraction, s.durationMin, s.bandSpeedFraction])).toEqual([
      [0.25, 15, 0.8],
      [0.5, 10, 0.8],
      [1, null, 1],
    ]);
    expect(plan.steps[0]?.note).toContain('80 % of normal band speed');
    expect(plan.totalDurationMin).toBe(25);
  });

  it('allows going straight from the reduced feed to normal (no ramp steps)', () => {
    const plan = planBreakIn({ mode: 'time', rampFeedFractions: [] });
    expect(plan.steps.map((s) => s.kind)).toEqual(['reduced', 'normal']);
    expect(plan.totalDurationMin).toBe(10);
  });
});

describe('planBreakIn, area mode (common practice, no source)', () => {
  it('defaults to 50 in² at the reduced feed, then 25 in² at each step: 100 in² in all', () => {
    const plan = planBreakIn({ mode: 'area' });
    // 50 in² = 32 258 mm² and 25 in² = 16 129 mm² exactly (1 in = 25.4 mm, NIST SP 811 B.8).
    expect(plan.steps.map((s) => s.areaMm2)).toEqual([
      expect.closeTo(32258, 9),
      expect.closeTo(16129, 9),
      expect.closeTo(16129, 9),
      null,
    ]);
    expect(mm2ToIn2(plan.totalAreaMm2 ?? 0)).toBeCloseTo(100, 9);
    expect(plan.totalDurationMin).toBeNull();
    expect(plan.steps[0]?.note).toContain('32,258 mm²');
  });

  it('gives the minutes of each step from a known cutting rate (area ÷ (feed fraction × rate))', () => {
    // Hand check: 32 258 / (1/3 × 6 451.6) = 15 min; 16 129 / (0.5 × 6 451.6) = 5 min;
    // 16 129 / (0.75 × 6 451.6) = 3.333… min; total 23.333… min.
    const plan = planBreakIn({ mode: 'area' }, 6451.6);
    expect(plan.steps[0]?.durationMin).toBeCloseTo(15, 9);
    expect(plan.steps[1]?.durationMin).toBeCloseTo(5, 9);
    expect(plan.steps[2]?.durationMin).toBeCloseTo(10 / 3, 9);
    expect(plan.totalDurationMin).toBeCloseTo(70 / 3, 9);
  });

  it('uses a site-set area', () => {
    const plan = planBreakIn({
      mode: 'area',
      initialAreaMm2: in2ToMm2(80),
      rampFeedFractions: [0.6],
      rampStepAreaMm2: 10000,
    });
    expect(plan.steps.map((s) => s.areaMm2)).toEqual([expect.closeTo(51612.8, 6), 10000, null]);
  });
});

describe('planBreakIn identities (fast-check)', () => {
  const rampArb = fc
    .uniqueArray(fc.double({ min: 0.4, max: 0.99, noNaN: true }), { maxLength: 4 })
    .map((a) => [...a].sort((x, y) => x - y));
  const rateArb = fc.double({ min: 1, max: 1e6, noNaN: true });

  it('a time plan turned into an area plan with the same areas gives back the same minutes', () => {
    fc.assert(
      fc.property(
        rampArb,
        fc.double({ min: 0.5, max: 60, noNaN: true }),
        fc.double({ min: 0.5, max: 60, noNaN: true }),
        rateArb,
        (ramp, firstMin, stepMin, rate) => {
          const timePlan = planBreakIn(
            { mode: 'time', rampFeedFractions: ramp, initialDurationMin: firstMin, rampStepDurationMin: stepMin },
            rate,
          );
          // The area plan has one area per ramp step, so give it the first ramp step's area; with one feed
          // fraction per step only that step is guaranteed to come back at `stepMin`.
          const areaPlan = planBreakIn(
            {
              mode: 'area',
              rampFeedFractions: ramp,
              initialAreaMm2: timePlan.steps[0]!.areaMm2!,
              rampStepAreaMm2: ramp.length > 0 ? timePlan.steps[1]!.areaMm2! : 1,
            },
            rate,
          );
          expect(areaPlan.steps[0]?.durationMin).toBeCloseTo(firstMin, 6);
          if (ramp.length > 0) expect(areaPlan.steps[1]?.durationMin).toBeCloseTo(stepMin, 6);
        },
      ),
    );
  });

  it('totals are the sums of the steps, and the feed never falls from one step to the next', () => {
    fc.assert(
      fc.property(rampArb, rateArb, fc.constantFrom('time' as const, 'area' as const), (ramp, rate, mode) => {
        const plan = planBreakIn({ mode, rampFeedFractions: ramp }, rate);
        const body = plan.steps.slice(0, -1);
        expect(plan.totalAreaMm2).toBeCloseTo(
          body.reduce((t, s) => t + (s.areaMm2 ?? NaN), 0),
          6,
        );
        expect(plan.totalDurationMin).toBeCloseTo(
          body.reduce((t, s) => t + (s.durationMin ?? NaN), 0),
          6,
        );
        for (let i = 1; i < plan.steps.length; i++) {
          expect(plan.steps[i]!.feedFraction).toBeGreaterThan(plan.steps[i - 1]!.feedFraction);
        }
        expect(plan.steps.at(-1)?.feedFraction).toBe(1);
      }),
    );
  });

  it('doubling the cutting rate doubles the areas in time mode and halves the minutes in area mode', () => {
    fc.assert(
      fc.property(rateArb, (rate) => {
        const t1 = planBreakIn({ mode: 'time' }, rate);
        const t2 = planBreakIn({ mode: 'time' }, rate * 2);
        expect(t2.totalAreaMm2).toBeCloseTo((t1.totalAreaMm2 ?? 0) * 2, 4);
        const a1 = planBreakIn({ mode: 'area' }, rate);
        const a2 = planBreakIn({ mode: 'area' }, rate * 2);
        expect((a2.totalDurationMin ?? 0) * 2).toBeCloseTo(a1.totalDurationMin ?? 0, 6);
      }),
    );
  });
});

describe('break-in settings validation', () => {
  it('rejects a feed that does not rise, with a message that says what to fix', () => {
    const run = () => planBreakIn({ mode: 'time', rampFeedFractions: [0.75, 0.5] });
    expect(run).toThrow(ZodError);
    expect(run).toThrow(/above the one before it/);
  });

  it('rejects a ramp step at or below the starting feed, a starting feed of 1, and a ramp step of 1', () => {
    expect(() => planBreakIn({ mode: 'time', initialFeedFraction: 0.5, rampFeedFractions: [0.5] })).toThrow(
      /above the one before/,
    );
    expect(() => planBreakIn({ mode: 'time', initialFeedFraction: 1, rampFeedFractions: [] })).toThrow(
      /must be below 1/,
    );
    expect(() => planBreakIn({ mode: 'area', rampFeedFractions: [1] })).toThrow(/below 1/);
  });

  it('rejects out-of-range numbers and an unknown mode', () => {
    expect(() => planBreakIn({ mode: 'time', initialDurationMin: 0 })).toThrow(/greater than 0/);
    expect(() => planBreakIn({ mode: 'time', bandSpeedFraction: 1.2 })).toThrow(/at most 1/);
    expect(() => planBreakIn({ mode: 'weekly' } as never)).toThrow(/must be time or area/);
    expect(() => planBreakIn({ mode: 'time' }, -5)).toThrow(/greater than 0 mm²\/min/);
    expect(() => planBreakIn({ mode: 'time' }, Number.NaN)).toThrow(/must be a number/);
  });

  it('the request schema fills in the time-mode defaults', () => {
    const parsed = breakInPlanRequestSchema.parse({});
    expect(parsed.settings).toEqual({
      mode: 'time',
      bandSpeedFraction: 1,
      initialFeedFraction: 1 / 3,
      rampFeedFractions: [0.5, 0.75],
      initialDurationMin: 10,
      rampStepDurationMin: 5,
    });
    expect(parsed.normalCuttingRateMm2PerMin).toBeNull();
    expect(BREAK_IN_DEFAULTS.initialAreaMm2).toBeCloseTo(32258, 9);
  });
});

describe('break-in with the material to be cut', () => {
  it("puts the material's band speed range into the plan and its notes, at the break-in speed fraction", () => {
    // Shipped carbon steel reference 50–90 m/min; a 1 1/4 in length of cut runs 10 % faster (Machinery's
    // Handbook, 31st ed., p. 1245): 55–99 m/min; at 50 % band speed during break-in 27.5–49.5 m/min.
    const plan = planBreakIn({ mode: 'time', bandSpeedFraction: 0.5 }, null, {
      materialGroup: 'carbon_steel',
      lengthOfCutMm: 31.75,
    });
    expect(plan.bandSpeed?.normal.minMPerMin).toBeCloseTo(55, 9);
    expect(plan.bandSpeed?.normal.maxMPerMin).toBeCloseTo(99, 9);
    expect(plan.bandSpeed?.breakInMinMPerMin).toBeCloseTo(27.5, 9);
    expect(plan.bandSpeed?.breakInMaxMPerMin).toBeCloseTo(49.5, 9);
    expect(plan.bandSpeed?.normal.basis).toMatchObject({ kind: 'site_setting', settingKey: 'band_speed.carbon_steel' });
    expect(plan.steps[0]?.note).toContain('50 % of normal band speed (28–50 m/min)');
    expect(plan.steps.at(-1)?.note).toContain('normal band speed (55–99 m/min)');
  });

  it('reads the speeds in the site units', () => {
    const plan = planBreakIn({ mode: 'time' }, null, { materialGroup: 'stainless_steel', system: 'imperial' });
    // Shipped stainless 20–40 m/min = 66–131 ft/min (1 ft = 0.3048 m, NIST SP 811 B.8).
    expect(plan.steps[0]?.note).toContain('full normal band speed (66–131 ft/min)');
  });
});

describe('the break-in plan from a site’s setting', () => {
  it('the shipped setting gives the same plan as the shipped steps, and says it is Kerfline’s starting value', () => {
    const shipped = planBreakInForSite('time', 6000);
    const steps = planBreakIn({ mode: 'time' }, 6000);
    expect(shipped.steps).toEqual(steps.steps);
    expect(shipped.basis).toEqual({
      kind: 'site_setting',
      settingKey: 'break_in',
      changedByName: null,
      changedAt: null,
      note: expect.stringContaining('blade maker'),
    });
    expect(breakInSettingsForSite(undefined, 'area')).toEqual({ mode: 'area' });
  });

  it('a site’s own steps drive the plan, and the basis names who changed them', () => {
    const settings = {
      break_in: {
        key: 'break_in',
        values: {
          startFeedPercent: 25,
          secondFeedPercent: 50,
          thirdFeedPercent: 80,
          bandSpeedPercent: 80,
          startMinutes: 15,
          stepMinutes: 10,
          startAreaMm2: 40000,
          stepAreaMm2: 20000,
        },
        changedByName: 'Ines Carvalho',
        changedAt: '2026-10-01T08:00:00.000Z',
      },
    };
    // By hand: 15 + 10 + 10 = 35 min; with 8 000 mm²/min, 0.25 × 8 000 × 15 + 0.5 × 8 000 × 10 + 0.8 × 8 000 × 10
    // = 30 000 + 40 000 + 64 000 = 134 000 mm².
    const plan = planBreakInForSite('time', 8000, { settings });
    expect(plan.steps.map((s) => [s.feedFraction, s.durationMin, s.bandSpeedFraction])).toEqual([
      [0.25, 15, 0.8],
      [0.5, 10, 0.8],
      [0.8, 10, 0.8],
      [1, null, 1],
    ]);
    expect(plan.totalDurationMin).toBe(35);
    expect(plan.totalAreaMm2).toBeCloseTo(134000, 6);
    expect(plan.basis).toMatchObject({ kind: 'site_setting', changedByName: 'Ines Carvalho' });
  });
});
