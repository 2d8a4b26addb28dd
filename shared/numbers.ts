import { z } from 'zod';

/** A finite number within [min, max], with messages that give the range and unit. */
export function measure(label: string, unit: string, min: number, max: number) {
  const range = `${label} is between ${min} and ${max} ${unit}`;
  return z
    .number({ error: `${label} must be a number (${unit})` })
    .refine(Number.isFinite, `${label} must be a finite number`)
    .min(min, range)
    .max(max, range);
}

/** An optimistic-concurrency version: the one the client last read. */
export const versionSchema = z.number({ error: 'Send the version you edited' }).int('Version is a whole number').min(0);
