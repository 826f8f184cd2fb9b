import type { BladeRunRemove } from '@kerfline/domain/blade-runs/schema';
import type { CauseId } from '@kerfline/domain/diagnosis/likely-causes';
import type { RemovalReason } from '@kerfline/domain/diagnosis/schema';
import { MAX_PHOTO_BYTES, PHOTO_TYPES } from '@kerfline/domain/photos/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readCount, readQuantity } from '../../../lib/form-numbers';
import { readZonedTime, toZonedInput } from '../../../lib/zoned-time';

/** The take-the-blade-off form as typed: time on the site's clock, area in the site's unit (in² or cm²). */
export type BladeOffFormValues = {
  removedAt: string;
  reason: RemovalReason | '';
  /** The likely cause the technician confirms; blank when not sure. */
  cause: CauseId | '';
  areaCut: string;
  cuts: string;
  notes: string;
};
export type BladeOffField = keyof BladeOffFormValues;

const FIELD_BY_PATH: Record<string, BladeOffField> = {
  removedAt: 'removedAt',
  reason: 'reason',
  areaCutMm2: 'areaCut',
  cuts: 'cuts',
  notes: 'notes',
  cause: 'cause',
};

export function bladeOffFieldForPath(path: string): BladeOffField | undefined {
  return FIELD_BY_PATH[path];
}

export function bladeOffDefaults(timeZone: string, now = new Date()): BladeOffFormValues {
  return { removedAt: toZonedInput(now, timeZone), reason: '', cause: '', areaCut: '', cuts: '', notes: '' };
}

/** The form as the domain's removal input (SI), and what only the form can word. */
export function bladeOffInput(
  values: BladeOffFormValues,
  system: UnitSystem,
  timeZone: string,
  openedAt: Date = new Date(),
): { input: BladeRunRemove; fieldErrors: Partial<Record<BladeOffField, string>> } {
  const fieldErrors: Partial<Record<BladeOffField, string>> = {};
  const removedAt = readZonedTime(values.removedAt, timeZone, openedAt);
  if (!removedAt) fieldErrors.removedAt = 'Enter when the blade came off, such as 2026-03-04 15:10';
  if (values.reason === '') fieldErrors.reason = 'Choose why the blade came off';
  const area = readQuantity(values.areaCut, 'area', system, 'Area cut');
  if (!area.ok) fieldErrors.areaCut = area.message;
  const cuts = readCount(values.cuts, 'Cuts');
  if (!cuts.ok) fieldErrors.cuts = cuts.message;
  return {
    input: {
      removedAt: removedAt?.toISOString(),
      reason: (values.reason || undefined) as RemovalReason,
      areaCutMm2: area.ok && area.value !== null ? Math.round(area.value * 100) / 100 : null,
      cuts: cuts.ok ? cuts.value : null,
      notes: values.notes,
    },
    fieldErrors,
  };
}

/** Why a chosen file will not be sent, in words; null when it may go (the server checks its content again). */
export function photoProblem(file: Pick<File, 'name' | 'size' | 'type'>): string | null {
  if (!(PHOTO_TYPES as readonly string[]).includes(file.type)) return `${file.name} is not a JPEG, PNG or WebP photo.`;
  if (file.size > MAX_PHOTO_BYTES) return `${file.name} is larger than 10 MB; choose a smaller one.`;
  return null;
}
