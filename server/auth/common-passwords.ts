import { dictionary } from '@zxcvbn-ts/language-common';

let commonPasswords: Set<string> | undefined;

/**
 * True when the password (case-insensitively) is on zxcvbn-ts's list of ~49,000 common
 * passwords (OWASP ASVS 5.0 §6.2.4: check against a list of breached or common passwords).
 */
export function isCommonPassword(password: string): boolean {
  commonPasswords ??= new Set(dictionary['passwords-common'].map((word) => String(word).toLowerCase()));
  return commonPasswords.has(password.toLowerCase());
}
