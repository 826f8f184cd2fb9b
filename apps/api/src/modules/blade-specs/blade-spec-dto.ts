import type { BladeSpec as BladeSpecDto, BladeSpecRef } from '@kerfline/domain/blade-specs/schema';
import type { Pitch } from '@kerfline/domain/teeth-in-work/schema';
import type { BladeSpec } from './blade-spec.model.js';

/** A spec's pitch as the domain types it: constant when the fine end is not stored. */
export function pitchOf(spec: Pick<BladeSpec, 'coarseTpi' | 'fineTpi'>): Pitch {
  return spec.fineTpi === null
    ? { kind: 'constant', tpi: spec.coarseTpi }
    : { kind: 'variable', coarseTpi: spec.coarseTpi, fineTpi: spec.fineTpi };
}

export function pitchColumns(pitch: Pitch): { coarseTpi: number; fineTpi: number | null } {
  return pitch.kind === 'constant'
    ? { coarseTpi: pitch.tpi, fineTpi: null }
    : { coarseTpi: pitch.coarseTpi, fineTpi: pitch.fineTpi };
}

export function toBladeSpecDto(spec: BladeSpec): BladeSpecDto {
  return {
    id: spec.id,
    siteId: spec.siteId,
    name: spec.name,
    widthMm: spec.widthMm,
    thicknessMm: spec.thicknessMm,
    lengthMm: spec.lengthMm,
    pitch: pitchOf(spec),
    toothForm: spec.toothForm,
    toothSet: spec.toothSet,
    material: spec.material,
    unitCostMinor: spec.unitCostMinor,
    currency: spec.currency,
    supplier: spec.supplier,
    archived: spec.archived,
    createdAt: spec.createdAt.toISOString(),
    updatedAt: spec.updatedAt.toISOString(),
  };
}

export function toBladeSpecRef(spec: BladeSpec): BladeSpecRef {
  const { id, siteId, name, widthMm, thicknessMm, lengthMm, pitch, material } = toBladeSpecDto(spec);
  return { id, siteId, name, widthMm, thicknessMm, lengthMm, pitch, material };
}
