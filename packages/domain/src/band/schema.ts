import { z } from 'zod';
import { shortestBandLengthMm } from './band-length.js';
import { STEEL_ELASTIC_MODULUS_PA } from './band-stress.js';

/** Calculator inputs for the band: lengths in mm, speeds in m/min, forces in N, stresses in Pa (SI inside). */

const positive = (label: string, unit: string, max: number) =>
  z
    .number({ message: `${label} must be a number (${unit})` })
    .positive({ message: `${label} must be greater than 0` })
    .max(max, { message: `${label} must be at most ${max} ${unit}` });

const wheelFields = {
  driveWheelDiameterMm: positive('Drive wheel diameter', 'mm', 3000),
  idlerWheelDiameterMm: positive('Idler wheel diameter', 'mm', 3000),
};

const touching = (v: { driveWheelDiameterMm: number; idlerWheelDiameterMm: number }) =>
  (v.driveWheelDiameterMm + v.idlerWheelDiameterMm) / 2;

/** Band length from two wheels and their centre distance. */
export const bandLengthInputSchema = z
  .object({ ...wheelFields, centreDistanceMm: positive('Centre distance', 'mm', 10000) })
  .refine((v) => v.centreDistanceMm > touching(v), {
    path: ['centreDistanceMm'],
    message: 'Centre distance must be more than half the sum of the wheel diameters, or the wheels overlap',
  });
export type BandLengthForm = z.infer<typeof bandLengthInputSchema>;

/** Centre distance for a band length on two wheels. */
export const centreDistanceInputSchema = z
  .object({ ...wheelFields, bandLengthMm: positive('Band length', 'mm', 30000) })
  .superRefine((v, ctx) => {
    // zod runs object refinements even when a field failed; the wheel messages already say what to fix.
    if (!(v.driveWheelDiameterMm > 0 && v.idlerWheelDiameterMm > 0)) return;
    const shortestMm = shortestBandLengthMm(v);
    if (v.bandLengthMm <= shortestMm) {
      ctx.addIssue({
        code: 'custom',
        path: ['bandLengthMm'],
        message: `Band length must be more than ${Math.ceil(shortestMm)} mm to go round these wheels without them overlapping`,
      });
    }
  });
export type CentreDistanceForm = z.infer<typeof centreDistanceInputSchema>;

/** Bending and tension stress of a band, with the threshold above which it is flagged. */
export const bandStressInputSchema = z
  .object({
    bandThicknessMm: positive('Band thickness', 'mm', 5),
    bandWidthMm: positive('Band width', 'mm', 200),
    wheelDiameterMm: positive('Wheel diameter', 'mm', 3000),
    tensionForceN: positive('Tension force', 'N', 500000),
    elasticModulusPa: positive('Elastic modulus', 'Pa', 1e12).default(STEEL_ELASTIC_MODULUS_PA),
    poissonRatio: z
      .number({ message: "Poisson's ratio must be a number" })
      .min(0, { message: "Poisson's ratio must be 0 or more" })
      .lt(0.5, { message: "Poisson's ratio must be below 0.5 (steel is about 0.29)" })
      .optional(),
    fatigueThresholdPa: positive('Fatigue threshold', 'Pa', 1e10),
  })
  .superRefine((v, ctx) => {
    if (v.bandThicknessMm >= v.bandWidthMm) {
      ctx.addIssue({
        code: 'custom',
        path: ['bandThicknessMm'],
        message: 'Band thickness must be smaller than the band width',
      });
    }
    if (v.bandThicknessMm >= v.wheelDiameterMm) {
      ctx.addIssue({
        code: 'custom',
        path: ['bandThicknessMm'],
        message: 'Band thickness must be far smaller than the wheel diameter',
      });
    }
  });
export type BandStressForm = z.input<typeof bandStressInputSchema>;

/** Passes and bending cycles per hour. */
export const flexCyclesInputSchema = z.object({
  bandSpeedMPerMin: positive('Band speed', 'm/min', 5000),
  bandLengthMm: positive('Band length', 'mm', 30000),
  wheelCount: z
    .number({ message: 'Wheels must be a number' })
    .int({ message: 'Wheels must be a whole number' })
    .min(2, { message: 'A band saw has at least 2 wheels' })
    .max(4, { message: 'Wheels must be at most 4' })
    .default(2),
});
export type FlexCyclesForm = z.input<typeof flexCyclesInputSchema>;
