import { z } from 'zod';
import { emailSchema, passwordSchema, userSchema } from '../users/schema.js';

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

/** The secret from an e-mailed link (invitation or password reset): 32 random bytes, base64url. */
export const linkTokenSchema = z
  .string({ message: 'the link is incomplete' })
  .trim()
  .regex(/^[A-Za-z0-9_-]{43}$/, { message: 'the link is incomplete; copy the whole link from the e-mail' });

/** How long a password reset link works. */
export const PASSWORD_RESET_VALID_MINUTES = 60;

/** Asking for a reset link: the answer is the same whether or not an account uses the address. */
export const passwordResetRequestSchema = z.object({ email: emailSchema });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetSchema = z.object({
  token: linkTokenSchema,
  newPassword: passwordSchema,
});
export type PasswordReset = z.infer<typeof passwordResetSchema>;
