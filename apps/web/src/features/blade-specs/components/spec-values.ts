import type { BladeSpec, BladeSpecCreate, ToothForm, ToothSet } from '@kerfline/domain/blade-specs/schema';
import type { BladeMaterial } from '@kerfline/domain/checks/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import { quantityInput, readCount, readQuantity } from '../../../lib/form-numbers';
import { minorFromText, moneyInput } from '../../../lib/money';

/** A blade spec as typed: sizes in the viewer's units, pitch as the trade writes it (3, or 4/6), cost in major units. */
export type SpecFormValues = {
  /** '' for fleet-wide (admins only), else the site the spec belongs to. */
  owner: string;
  name: string;
  width: string;
  thickness: string;
  length: string;
  pitchKind: 'constant' | 'variable';
  tpi: string;
  coarseTpi: string;
  fineTpi: string;
  toothForm: ToothForm;
  toothSet: ToothSet;
  material: BladeMaterial | '';
  unitCost: string;
  currency: string;
  supplier: string;
  archived: boolean;
};
export type SpecField = keyof SpecFormValues;

const FIELD_BY_PATH: Record<string, SpecField> = {
  siteId: 'owner',
  name: 'name',
  widthMm: 'width',
  thicknessMm: 'thickness',
  lengthMm: 'length',
  'pitch.tpi': 'tpi',
  'pitch.coarseTpi': 'coarseTpi',
  'pitch.fineTpi': 'fineTpi',
  pitch: 'pitchKind',
  toothForm: 'toothForm',
  toothSet: 'toothSet',
  material: 'material',
  unitCostMinor: 'unitCost',
  currency: 'currency',
  supplier: 'supplier',
  archived: 'archived',
};

export function specFieldForPath(path: string): SpecField | undefined {
  return FIELD_BY_PATH[path];
}

export function emptySpecValues(owner: string, currency: string): SpecFormValues {
  return {
    owner,
    name: '',
    width: '',
    thickness: '',
    length: '',
    pitchKind: 'variable',
    tpi: '',
    coarseTpi: '',
    fineTpi: '',
    toothForm: 'regular',
    toothSet: 'raker',
    material: '',
    unitCost: '',
    currency,
    supplier: '',
    archived: false,
  };
}

export function specValuesFrom(spec: BladeSpec, system: UnitSystem): SpecFormValues {
  const currency = spec.currency.trim();
  return {
    owner: spec.siteId ?? '',
    name: spec.name,
    width: quantityInput(spec.widthMm, 'length', system),
    thickness: quantityInput(spec.thicknessMm, 'smallLength', system),
    length: quantityInput(spec.lengthMm, 'length', system),
    pitchKind: spec.pitch.kind,
    tpi: spec.pitch.kind === 'constant' ? String(spec.pitch.tpi) : '',
    coarseTpi: spec.pitch.kind === 'variable' ? String(spec.pitch.coarseTpi) : '',
    fineTpi: spec.pitch.kind === 'variable' ? String(spec.pitch.fineTpi) : '',
    toothForm: spec.toothForm,
    toothSet: spec.toothSet,
    material: spec.material,
    unitCost: moneyInput(spec.unitCostMinor, currency),
    currency,
    supplier: spec.supplier ?? '',
    archived: spec.archived,
  };
}

/** The form as the domain's spec input (sizes in mm), and what only the form can word. */
export function specInput(
  values: SpecFormValues,
  system: UnitSystem,
): { input: BladeSpecCreate & { archived: boolean }; fieldErrors: Partial<Record<SpecField, string>> } {
  const fieldErrors: Partial<Record<SpecField, string>> = {};
  const size = (field: 'width' | 'thickness' | 'length', kind: 'length' | 'smallLength', label: string) => {
    const read = readQuantity(values[field], kind, system, label, true);
    if (!read.ok) fieldErrors[field] = read.message;
    return read.ok && read.value !== null ? Math.round(read.value * 10_000) / 10_000 : undefined;
  };
  const tpi = (field: 'tpi' | 'coarseTpi' | 'fineTpi', label: string) => {
    const read = readCount(values[field], label);
    if (!read.ok) fieldErrors[field] = read.message;
    else if (read.value === null) fieldErrors[field] = `Enter the ${label.toLowerCase()} in teeth per inch`;
    return read.ok ? (read.value ?? undefined) : undefined;
  };
  const cost = minorFromText(values.unitCost, values.currency);
  if (!cost.ok) fieldErrors.unitCost = cost.message;
  else if (cost.value === null) fieldErrors.unitCost = `Enter the cost of one blade in ${values.currency}`;
  if (values.material === '') fieldErrors.material = 'Choose the blade material';
  const pitch =
    values.pitchKind === 'constant'
      ? { kind: 'constant' as const, tpi: tpi('tpi', 'Pitch') as number }
      : {
          kind: 'variable' as const,
          coarseTpi: tpi('coarseTpi', 'Coarse end') as number,
          fineTpi: tpi('fineTpi', 'Fine end') as number,
        };
  return {
    input: {
      siteId: values.owner === '' ? null : values.owner,
      name: values.name,
      widthMm: size('width', 'length', 'Width') as number,
      thicknessMm: size('thickness', 'smallLength', 'Thickness') as number,
      lengthMm: size('length', 'length', 'Length') as number,
      pitch,
      toothForm: values.toothForm,
      toothSet: values.toothSet,
      material: (values.material || undefined) as BladeMaterial,
      unitCostMinor: (cost.ok ? cost.value : undefined) as number,
      currency: values.currency,
      supplier: values.supplier.trim() === '' ? null : values.supplier,
      archived: values.archived,
    },
    fieldErrors,
  };
}
