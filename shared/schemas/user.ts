import * as z from 'zod';
import { ROLES } from '../types/role';

/** Minimum password length (OWASP ASVS 5.0 §6.2.1 asks for at least 8; we ask 12). */
export const PASSWORD_MIN_LENGTH = 12;
/** Upper bound so hashing cost cannot be abused. */
export const PASSWORD_MAX_LENGTH = 128;

/** A new password, before the server's common-password check. */
export const passwordSchema = z
  .string()
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters.`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters.`);

/** E-mail addresses are compared case-insensitively; we store them lower-cased. */
export const emailSchema = z
  .string()
  .trim()
  .max(254)
  .email('Enter a valid e-mail address.')
  .transform((value) => value.toLowerCase());

export const displayNameSchema = z.string().trim().min(1, 'Enter a name.').max(120);

/** `POST /api/users` body (admin only). */
export const userCreateSchema = z.object({
  email: emailSchema,
  displayName: displayNameSchema,
  role: z.enum(ROLES, { message: 'Choose a role.' }),
  password: passwordSchema,
});
export type UserCreateRequest = z.input<typeof userCreateSchema>;

/** `PATCH /api/users/:id` body (admin only): any subset; `password` is a reset. */
export const userUpdateSchema = z
  .object({
    displayName: displayNameSchema.optional(),
    role: z.enum(ROLES, { message: 'Choose a role.' }).optional(),
    active: z.boolean().optional(),
    password: passwordSchema.optional(),
  })
  .refine((body) => Object.values(body).some((value) => value !== undefined), {
    message: 'Change at least one field.',
  });
export type UserUpdateRequest = z.input<typeof userUpdateSchema>;

/** A user as the API returns it. Never carries the password hash. */
export interface UserView {
  id: number;
  email: string;
  displayName: string;
  role: (typeof ROLES)[number];
  active: boolean;
  createdAt: string;
  lastSignInAt: string | null;
  /** One-time codes (the second sign-in factor) are switched on for this member. */
  secondFactorEnabled: boolean;
}

/** Said when a new password repeats the current one (the client says it before sending). */
export const SAME_PASSWORD_MESSAGE = 'Choose a password different from the current one.';

/**
 * `POST /api/auth/password` body: a member changes their own password, proving the current one
 * (OWASP ASVS 5.0 §6.2.2, §6.2.3). The new one must differ from it; the server also refuses
 * common passwords.
 */
export const passwordChangeSchema = z
  .object({
    currentPassword: z.string({ error: 'Enter your current password.' }).min(1, 'Enter your current password.').max(256),
    newPassword: passwordSchema,
  })
  .refine((body) => body.newPassword !== body.currentPassword, { path: ['newPassword'], message: SAME_PASSWORD_MESSAGE });
export type PasswordChange = z.infer<typeof passwordChangeSchema>;

/** Response of `POST /api/auth/password`. */
export interface PasswordChangeResult {
  /** How many other sessions of the member were ended (this one stays signed in). */
  endedSessions: number;
}
