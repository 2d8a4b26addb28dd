import { z } from 'zod';

/** The shortest password we take. */
export const minPasswordLength = 12;
export const maxPasswordLength = 128;

/** A password's length, as every form checks it before the server checks the rest. */
export const passwordLength = z
  .string()
  .min(minPasswordLength, `Use at least ${minPasswordLength} characters`)
  .max(maxPasswordLength, `Use at most ${maxPasswordLength} characters`);
