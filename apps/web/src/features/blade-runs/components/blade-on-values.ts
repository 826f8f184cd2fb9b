import type { BladeRun, BladeRunInstall } from '@kerfline/domain/blade-runs/schema';
import type { BladeSpec } from '@kerfline/domain/blade-specs/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { quantityInput, readQuantity } from '../../../lib/form-numbers';
import { readZonedTime, toZonedInput } from '../../../lib/zoned-time';

/** What the technician answers about break-in: followed, skipped, or not done yet (recorded later). */
export type BreakInAnswer = 'yes' | 'no' | 'later';

/** The put-a-blade-on form as typed: times on the site's clock, tension in the site's unit. */
export type BladeOnFormValues = {
  bladeSpecId: string;
  installedAt: string;
  tension: string;
  materialGroup: MaterialGroup | '';
  breakInFollowed: BreakInAnswer;
  notes: string;
};
export type BladeOnField = keyof BladeOnFormValues;

const FIELD_BY_PATH: Record<string, BladeOnField> = {
  bladeSpecId: 'bladeSpecId',
  installedAt: 'installedAt',
  tensionMpa: 'tension',
  materialGroup: 'materialGroup',
  breakInFollowed: 'breakInFollowed',
  notes: 'notes',
};

/** The form field a domain schema path (or the server's detail) belongs to. */
export function bladeOnFieldForPath(path: string): BladeOnField | undefined {
  return FIELD_BY_PATH[path];
}

/** Our tolerance for "this spec fits the saw's band": 1 % on length, 2 % on width and thickness (as the API warns). */
export function specFitsSaw(spec: Pick<BladeSpec, 'widthMm' | 'thicknessMm' | 'lengthMm'>, saw: Saw): boolean {
  const near = (a: number, b: number, share: number) => Math.abs(a - b) <= share * b;
  return (
    near(spec.lengthMm, saw.bandLengthMm, 0.01) &&
    near(spec.widthMm, saw.bandWidthMm, 0.02) &&
    near(spec.thicknessMm, saw.bandThicknessMm, 0.02)
  );
}

/**
 * The spec a blade for this saw most likely is: the one most often put on it lately (of the specs still
 * offered), the latest breaking a tie; failing that, the first offered spec that fits its band.
 */
export function usualSpecId(saw: Saw, recentRuns: readonly BladeRun[], offered: readonly BladeSpec[]): string {
  const offeredIds = new Set(offered.map((s) => s.id));
  const counts = new Map<string, { n: number; latest: number }>();
  for (const run of recentRuns) {
    if (!offeredIds.has(run.bladeSpecId)) continue;
    const seen = counts.get(run.bladeSpecId) ?? { n: 0, latest: 0 };
    counts.set(run.bladeSpecId, { n: seen.n + 1, latest: Math.max(seen.latest, Date.parse(run.installedAt)) });
  }
  const best = [...counts.entries()].sort((a, b) => b[1].n - a[1].n || b[1].latest - a[1].latest)[0];
  if (best) return best[0];
  return offered.find((spec) => specFitsSaw(spec, saw))?.id ?? '';
}

/**
 * Starting values: now on the site's clock, the saw's usual spec, and the tension and material of the latest
 * blade on it (what the technician most likely sets again).
 */
export function bladeOnDefaults(
  saw: Saw,
  recentRuns: readonly BladeRun[],
  offered: readonly BladeSpec[],
  system: UnitSystem,
  timeZone: string,
  now = new Date(),
): BladeOnFormValues {
  const latest = [...recentRuns].sort((a, b) => Date.parse(b.installedAt) - Date.parse(a.installedAt))[0];
  return {
    bladeSpecId: usualSpecId(saw, recentRuns, offered),
    installedAt: toZonedInput(now, timeZone),
    tension: latest?.tensionMpa != null ? quantityInput(latest.tensionMpa * 1e6, 'stress', system) : '',
    materialGroup: latest?.materialGroup ?? '',
    breakInFollowed: 'later',
    notes: '',
  };
}

/**
 * The form as the domain's install input (SI, an ISO time with its offset), and what only the form can word: a
 * time that is not one, a tension that is not a number. The schema says the rest.
 */
export function bladeOnInput(
  values: BladeOnFormValues,
  sawId: string,
  system: UnitSystem,
  timeZone: string,
  openedAt: Date = new Date(),
): { input: BladeRunInstall; fieldErrors: Partial<Record<BladeOnField, string>> } {
  const fieldErrors: Partial<Record<BladeOnField, string>> = {};
  const installedAt = readZonedTime(values.installedAt, timeZone, openedAt);
  if (!installedAt) fieldErrors.installedAt = 'Enter when the blade went on, such as 2026-03-04 07:30';
  const tension = readQuantity(values.tension, 'stress', system, 'Tension');
  if (!tension.ok) fieldErrors.tension = tension.message;
  const tensionMpa = tension.ok && tension.value !== null ? Math.round((tension.value / 1e6) * 1000) / 1000 : null;
  if (values.bladeSpecId === '') fieldErrors.bladeSpecId = 'Choose the blade spec';
  return {
    input: {
      sawId,
      bladeSpecId: values.bladeSpecId,
      installedAt: installedAt?.toISOString(),
      tensionMpa,
      materialGroup: values.materialGroup === '' ? null : values.materialGroup,
      breakInFollowed: values.breakInFollowed === 'later' ? null : values.breakInFollowed === 'yes',
      notes: values.notes,
    },
    fieldErrors,
  };
}
