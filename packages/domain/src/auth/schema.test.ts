import { describe, expect, it } from 'vitest';
import { passwordChangeSchema, signInSchema } from './schema.js';

describe('sign-in and password inputs', () => {
  it('reads an e-mail address case- and space-insensitively', () => {
    expect(signInSchema.parse({ email: ' Someone@Example.TEST ', password: 'x' }).email).toBe('someone@example.test');
  });

  it('wants a new password of 12 characters that differs from the current one', () => {
    expect(
      passwordChangeSchema.safeParse({ currentPassword: 'old', newPassword: 'short' }).error?.issues[0]?.path,
    ).toEqual(['newPassword']);
    const same = passwordChangeSchema.safeParse({ currentPassword: 'same-password-1', newPassword: 'same-password-1' });
    expect(same.error?.issues[0]?.message).toBe('must differ from the current password');
    expect(
      passwordChangeSchema.safeParse({ currentPassword: 'old', newPassword: 'a-brand-new-password' }).success,
    ).toBe(true);
  });
});
