import type { CutLogCreate } from '@kerfline/domain/cut-logs/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import type { StockShapeKind } from '@kerfline/domain/stock-area/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { readCount, readQuantity } from '../../../lib/form-numbers';
import { DIMENSION_KEYS, SHAPE_DIMENSIONS, type DimensionKey } from '../../../lib/stock-shapes';
import { readZonedTime, toZonedInput } from '../../../lib/zoned-time';

/** A cut log as typed: sizes and band speed in the site's units, the cut time in minutes. */
export type CutLogFormValues = {
  cutAt: string;
  shape: StockShapeKind;
  materialGroup: MaterialGroup | '';
  pieceCount: string;
  piecesAcross: string;
  quantity: string;
  bandSpeed: string;
  cutTimeMin: string;
  notes: string;
} & Record<DimensionKey, string>;
export type CutLogField = keyof CutLogFormValues;

export function cutLogFieldForPath(path: string): CutLogField | undefined {
  const parts = path.split('.');
  if (parts[0] === 'stock') {
    if (parts[1] === 'shape') {
      const key = parts[2];
      if (key && (DIMENSION_KEYS as readonly string[]).includes(key)) return key as DimensionKey;
      return 'shape';
    }
    if (parts[1] === 'pieceCount' || parts[1] === 'piecesAcross') return parts[1];
    return 'shape';
  }
  const direct: Record<string, CutLogField> = {
    cutAt: 'cutAt',
    materialGroup: 'materialGroup',
    quantity: 'quantity',
    bandSpeedMPerMin: 'bandSpeed',
    cutTimeS: 'cutTimeMin',
    notes: 'notes',
  };
  return direct[parts[0] ?? ''];
}

export function cutLogDefaults(
  timeZone: string,
  materialGroup: MaterialGroup | null,
  now = new Date(),
): CutLogFormValues {
  const dimensions = Object.fromEntries(DIMENSION_KEYS.map((key) => [key, ''])) as Record<DimensionKey, string>;
  return {
    cutAt: toZonedInput(now, timeZone),
    shape: 'round_bar',
    materialGroup: materialGroup ?? '',
    pieceCount: '1',
    piecesAcross: '1',
    quantity: '1',
    bandSpeed: '',
    cutTimeMin: '',
    notes: '',
    ...dimensions,
  };
}

/** The form as the domain's cut-log input, sizes in mm and speed in m/min; and what only the form can word. */
export function cutLogInput(
  values: CutLogFormValues,
  sawId: string,
  system: UnitSystem,
  timeZone: string,
  openedAt: Date = new Date(),
): { input: CutLogCreate; fieldErrors: Partial<Record<CutLogField, string>> } {
  const fieldErrors: Partial<Record<CutLogField, string>> = {};
  const cutAt = readZonedTime(values.cutAt, timeZone, openedAt);
  if (!cutAt) fieldErrors.cutAt = 'Enter when the cut was made, such as 2026-03-04 07:30';
  const shape: Record<string, unknown> = { kind: values.shape };
  for (const { key, label } of SHAPE_DIMENSIONS[values.shape]) {
    const read = readQuantity(values[key], 'length', system, label, true);
    if (!read.ok) fieldErrors[key] = read.message;
    else shape[key] = read.value === null ? undefined : Math.round(read.value * 10_000) / 10_000;
  }
  const count = (field: 'pieceCount' | 'piecesAcross' | 'quantity', label: string) => {
    const read = readCount(values[field], label);
    if (!read.ok) fieldErrors[field] = read.message;
    return read.ok ? (read.value ?? undefined) : undefined;
  };
  const speed = readQuantity(values.bandSpeed, 'bandSpeed', system, 'Band speed');
  if (!speed.ok) fieldErrors.bandSpeed = speed.message;
  const minutes = readCount(values.cutTimeMin, 'Cut time');
  if (!minutes.ok) fieldErrors.cutTimeMin = minutes.message;
  if (values.materialGroup === '') fieldErrors.materialGroup = 'Choose the material that was cut';
  return {
    input: {
      sawId,
      cutAt: cutAt?.toISOString(),
      stock: {
        shape: shape as CutLogCreate['stock']['shape'],
        pieceCount: count('pieceCount', 'Pieces'),
        piecesAcross: count('piecesAcross', 'Pieces side by side'),
      },
      materialGroup: (values.materialGroup || undefined) as MaterialGroup,
      quantity: count('quantity', 'Cuts'),
      bandSpeedMPerMin: speed.ok && speed.value !== null ? Math.round(speed.value * 1000) / 1000 : null,
      cutTimeS: minutes.ok && minutes.value !== null ? Math.round(minutes.value * 60 * 10) / 10 : null,
      notes: values.notes,
    },
    fieldErrors,
  };
}
