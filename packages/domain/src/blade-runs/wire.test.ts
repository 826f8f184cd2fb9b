import { describe, expect, it } from 'vitest';
import { planBreakIn } from '../break-in/break-in-plan.js';
import { recommendedBandSpeed } from '../band-speed/speed-ranges.js';
import { rankLikelyCauses } from '../diagnosis/likely-causes.js';
import { breakInAdviceSchema, runDiagnosisSchema } from './wire.js';

const SAW = '3c9d7e2a-51b4-4f0a-8e6c-2d1b9a7f4e10';
const SPEC = '7a2e4c91-0d3b-4b6e-a1f5-9c8d2e6b3f22';

describe('the blade runs’ answers on the wire', () => {
  it('parse the break-in advice the API builds from the domain’s plan and band speeds, unchanged', () => {
    const recommended = recommendedBandSpeed('stainless_steel', { bladeMaterial: 'carbon' });
    const advice = {
      sawId: SAW,
      bladeSpecId: SPEC,
      materialGroup: 'stainless_steel',
      plan: planBreakIn({ mode: 'time' }, 5236, { materialGroup: 'stainless_steel', bladeMaterial: 'carbon' }),
      normalCuttingRateMm2PerMin: 5236,
      cuttingRateBasis: 'Median cutting rate of this saw’s timed cut logs for this material in the last 90 days.',
      bandSpeed: { recommended, reachableMPerMin: { minMPerMin: 18, maxMPerMin: 20 } },
      warnings: [{ code: 'length_mismatch', message: 'Too long.' }],
    };
    expect(breakInAdviceSchema.parse(advice)).toEqual(advice);
    const plain = { ...advice, materialGroup: null, plan: planBreakIn(), bandSpeed: null };
    expect(breakInAdviceSchema.parse(plain)).toEqual(plain);
  });

  it('parse the likely causes the API builds from the domain’s ranking, unchanged', () => {
    const diagnosis = {
      ...rankLikelyCauses('tooth_strippage', {
        cutLogs: [{ teethInWork: 2, bandSpeedMPerMin: 80, recommendedMaxMPerMin: 60 }],
        breakInDone: false,
      }),
      runId: SAW,
      confirmedCause: null,
      evidenceUsed: { cutLogs: 1, checks: 0, breakInFollowed: false },
    };
    expect(diagnosis.causes.length).toBeGreaterThan(1);
    expect(runDiagnosisSchema.parse(diagnosis)).toEqual(diagnosis);
    expect(runDiagnosisSchema.safeParse({ ...diagnosis, confirmedCause: 'gremlins' }).success).toBe(false);
  });
});
