import type { BladeSpec } from '@kerfline/domain/blade-specs/schema';
import type { StockReceiptCreate } from '@kerfline/domain/blade-stock/schema';
import { minorFromText, moneyInput } from '../../../lib/money';
import { toZonedInput } from '../../../lib/zoned-time';

/** Receiving blades as typed: the cost in the site's currency's major units, the date on the site's calendar. */
export type ReceiveFormValues = {
  bladeSpecId: string;
  quantity: string;
  unitCost: string;
  receivedOn: string;
  reference: string;
  notes: string;
};
export type ReceiveField = keyof ReceiveFormValues;

const FIELD_BY_PATH: Record<string, ReceiveField> = {
  bladeSpecId: 'bladeSpecId',
  quantity: 'quantity',
  unitCostMinor: 'unitCost',
  receivedOn: 'receivedOn',
  reference: 'reference',
  notes: 'notes',
};

export function receiveFieldForPath(path: string): ReceiveField | undefined {
  return FIELD_BY_PATH[path];
}

/** Today on the site's calendar, no spec chosen yet. */
export function receiveDefaults(timeZone: string, now = new Date()): ReceiveFormValues {
  return {
    bladeSpecId: '',
    quantity: '',
    unitCost: '',
    receivedOn: toZonedInput(now, timeZone).slice(0, 10),
    reference: '',
    notes: '',
  };
}

/** The spec's catalogue price as the starting cost, when it is in the site's currency. */
export function catalogueCost(spec: BladeSpec | undefined, currency: string): string {
  return spec && spec.currency.trim() === currency ? moneyInput(spec.unitCostMinor, currency) : '';
}

export function receiveInput(
  values: ReceiveFormValues,
  siteId: string,
  currency: string,
): { input: StockReceiptCreate; fieldErrors: Partial<Record<ReceiveField, string>> } {
  const fieldErrors: Partial<Record<ReceiveField, string>> = {};
  if (values.bladeSpecId === '') fieldErrors.bladeSpecId = 'Choose the blade spec received';
  const quantity = values.quantity.trim() === '' ? undefined : Number(values.quantity.replaceAll(',', ''));
  if (values.quantity.trim() === '') fieldErrors.quantity = 'Enter how many blades came in';
  const cost = minorFromText(values.unitCost, currency);
  if (!cost.ok) fieldErrors.unitCost = cost.message;
  else if (cost.value === null) fieldErrors.unitCost = `Enter the cost of one blade in ${currency}`;
  return {
    input: {
      siteId,
      bladeSpecId: values.bladeSpecId,
      quantity: quantity as number,
      unitCostMinor: (cost.ok ? cost.value : undefined) as number,
      currency,
      receivedOn: values.receivedOn,
      reference: values.reference.trim() === '' ? null : values.reference,
      notes: values.notes,
    },
    fieldErrors,
  };
}
