import * as z from 'zod';

/** Digits of a one-time code (RFC 6238 with the common authenticator-app settings). */
export const ONE_TIME_CODE_DIGITS = 6;

/** A one-time code from an authenticator app: six digits; spaces (as apps show "123 456") are ignored. */
export const oneTimeCodeSchema = z
  .string({ message: 'Enter the 6-digit code from your app.' })
  .max(20, 'Enter the 6-digit code from your app.')
  .transform((value) => value.replace(/\s+/g, ''))
  .pipe(z.string().regex(/^\d{6}$/, 'Enter the 6-digit code from your app.'))
  .describe('Six-digit one-time code from an authenticator app');

/** Symbols in a recovery code: 28 × 5 bits = 140 bits, above ASVS 5.0's 112 bits for fast-hashed lookup secrets (6.5.2) and 128 bits for random values (11.5.1). */
export const RECOVERY_CODE_SYMBOLS = 28;

/**
 * A recovery code as printed (`ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-2345`): 28 characters of Crockford's base32;
 * case, spaces and hyphens are ignored, and the look-alikes O, I and L read as 0, 1 and 1.
 */
export const recoveryCodeSchema = z
  .string({ message: 'Enter one of your recovery codes.' })
  .max(60, 'Enter one of your recovery codes.')
  .transform((value) => value.replace(/[\s-]+/g, '').toUpperCase().replace(/O/g, '0').replace(/[IL]/g, '1'))
  .pipe(z.string().regex(new RegExp(`^[0-9A-HJKMNP-TV-Z]{${RECOVERY_CODE_SYMBOLS}}$`), 'A recovery code has 28 letters and digits in groups of four, like ABCD-EFGH-JKMN-PQRS-TVWX-YZ01-2345.'))
  .describe('Unused recovery code');

/** Body of the calls that need a current one-time code (confirm enrolment, new recovery codes, switch off). */
export const oneTimeCodeRequestSchema = z.object({ code: oneTimeCodeSchema });
export type OneTimeCodeRequest = z.input<typeof oneTimeCodeRequestSchema>;

/** `POST /api/auth/second-factor/verify`: the second sign-in step, with an app code or a recovery code. */
export const secondFactorVerifySchema = z.discriminatedUnion('method', [
  z.object({ method: z.literal('one-time-code'), code: oneTimeCodeSchema }),
  z.object({ method: z.literal('recovery-code'), code: recoveryCodeSchema }),
]);
export type SecondFactorVerifyRequest = z.input<typeof secondFactorVerifySchema>;
