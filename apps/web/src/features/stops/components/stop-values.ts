import { STOP_CATEGORIES, type StopCategory, type StopCreate } from '@kerfline/domain/stops/schema';
import { fromZonedInput, readZonedTime, toZonedInput } from '../../../lib/zoned-time';

/** Logging a stop as typed: times on the site's clock; "still stopped" leaves the end blank. */
export type StopFormValues = {
  category: StopCategory | '';
  planned: 'planned' | 'unplanned';
  startedAt: string;
  stillStopped: boolean;
  endedAt: string;
  notes: string;
};
export type StopField = keyof StopFormValues;

const FIELD_BY_PATH: Record<string, StopField> = {
  category: 'category',
  planned: 'planned',
  startedAt: 'startedAt',
  endedAt: 'endedAt',
  notes: 'notes',
};

export function stopFieldForPath(path: string): StopField | undefined {
  return FIELD_BY_PATH[path];
}

/** What a planned stop usually is, so the choice starts right: planned maintenance is planned, the rest not. */
export function plannedFor(category: StopCategory | ''): 'planned' | 'unplanned' {
  return category === 'planned_maintenance' ? 'planned' : 'unplanned';
}

export function stopDefaults(timeZone: string, now = new Date()): StopFormValues {
  return {
    category: '',
    planned: 'unplanned',
    startedAt: toZonedInput(now, timeZone),
    stillStopped: true,
    endedAt: '',
    notes: '',
  };
}

export function stopInput(
  values: StopFormValues,
  sawId: string,
  timeZone: string,
  openedAt: Date = new Date(),
): { input: StopCreate; fieldErrors: Partial<Record<StopField, string>> } {
  const fieldErrors: Partial<Record<StopField, string>> = {};
  const startedAt = readZonedTime(values.startedAt, timeZone, openedAt);
  if (!startedAt) fieldErrors.startedAt = 'Enter when the saw stopped, such as 2026-03-04 07:30';
  let endedAt: Date | null = null;
  if (!values.stillStopped) {
    endedAt = fromZonedInput(values.endedAt, timeZone);
    if (!endedAt) fieldErrors.endedAt = 'Enter when the saw ran again, or tick "still stopped"';
  }
  if (values.category === '') fieldErrors.category = 'Choose why the saw stopped';
  return {
    input: {
      sawId,
      startedAt: startedAt?.toISOString(),
      endedAt: endedAt?.toISOString() ?? null,
      category: (values.category || undefined) as StopCategory,
      planned: values.planned === 'planned',
      notes: values.notes,
    },
    fieldErrors,
  };
}

export { STOP_CATEGORIES };
