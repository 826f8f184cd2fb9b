import { z } from 'zod';
import { passwordSchema, userSchema } from '../users/schema.js';

export const signInSchema = z.object({
  email: z.string().trim().toLowerCase().min(1, { message: 'enter your e-mail address' }),
  password: z.string().min(1, { message: 'enter your password' }),
});
export type SignIn = z.infer<typeof signInSchema>;

/** CASL raw rules as sent to the browser; the web app builds its ability from them. */
export const rawRuleSchema = z.object({
  action: z.union([z.string(), z.array(z.string())]),
  subject: z.union([z.string(), z.array(z.string())]),
  conditions: z.record(z.string(), z.unknown()).optional(),
  inverted: z.boolean().optional(),
  fields: z.union([z.string(), z.array(z.string())]).optional(),
});

export const meSchema = z.object({
  user: userSchema,
  /** Sites the user may read, resolved from the role's assignment. */
  siteIds: z.array(z.string()),
  rules: z.array(rawRuleSchema),
});
export type Me = z.infer<typeof meSchema>;

/** A signed-in person changing their own password: the current one proves it is them. */
export const passwordChangeSchema = z
  .object({
    currentPassword: z.string().min(1, { message: 'enter your current password' }),
    newPassword: passwordSchema,
  })
  .refine((v) => v.newPassword !== v.currentPassword, {
    path: ['newPassword'],
    message: 'must differ from the current password',
  });
export type PasswordChange = z.infer<typeof passwordChangeSchema>;
