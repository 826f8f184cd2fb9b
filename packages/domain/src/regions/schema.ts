import { z } from 'zod';
import { idSchema, text } from '../common/schema.js';

export const regionSchema = z.object({
  id: idSchema,
  name: z.string(),
});
export type Region = z.infer<typeof regionSchema>;

export const regionCreateSchema = z.object({ name: text(80) });
export type RegionCreate = z.infer<typeof regionCreateSchema>;

export const regionUpdateSchema = z.object({ name: text(80) }).strict();
export type RegionUpdate = z.infer<typeof regionUpdateSchema>;
