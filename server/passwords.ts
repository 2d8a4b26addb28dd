import { dictionary } from '@zxcvbn-ts/language-common';

import { passwordLength } from '@/shared/passwords';

export { maxPasswordLength, minPasswordLength } from '@/shared/passwords';

/** Common passwords (the zxcvbn-ts common list), compared without case. */
const common = new Set(dictionary['passwords-common'].map((p) => p.toLowerCase()));

/** True when the password is on the common-password list. */
export function isCommonPassword(password: string): boolean {
  return common.has(password.toLowerCase());
}

/** A password we accept: long enough, not only spaces or one repeated character, and not a common one. */
export const passwordSchema = passwordLength
  .refine((p) => p.trim() !== '', 'Use letters, digits or signs, not only spaces')
  .refine((p) => new Set(p).size > 1, 'Use more than one different character')
  .refine((p) => !isCommonPassword(p), 'This password is too common; choose another');
