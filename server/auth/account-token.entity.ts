import { defineEntity, p, type InferEntity } from '@mikro-orm/core';
import { baseProperties } from '../common/base.properties';
import { UserSchema } from '../users/user.entity';

/** How long a password-reset link works. */
export const RESET_MINUTES = 60;

/** A single-use password-reset link of an account (only the token's hash is kept). */
export const PasswordResetSchema = defineEntity({
  name: 'PasswordReset',
  tableName: 'password_reset',
  properties: {
    ...baseProperties,
    user: () => p.manyToOne(UserSchema).deleteRule('cascade').index(),
    tokenHash: p.string().length(64).unique(),
    expiresAt: p.datetime(),
    usedAt: p.datetime().nullable(),
  },
});
export type PasswordReset = InferEntity<typeof PasswordResetSchema>;

/** How long an address-confirmation link works. */
export const CONFIRM_HOURS = 24;

/**
 * A sign-up waiting for its address to be confirmed: the account is created only when the
 * link in the mail is opened, so an unconfirmed address can never sign in.
 */
export const PendingRegistrationSchema = defineEntity({
  name: 'PendingRegistration',
  tableName: 'pending_registration',
  properties: {
    ...baseProperties,
    email: p.string().length(254).index(),
    displayName: p.string().length(80),
    passwordHash: p.string().length(255).hidden(),
    tokenHash: p.string().length(64).unique(),
    expiresAt: p.datetime(),
  },
});
export type PendingRegistration = InferEntity<typeof PendingRegistrationSchema>;
