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

/** Money in whole cents, $0 to $100,000: a grinder's quote and the owner's offer alike. */
export function centsSchema(label: string) {
  return z
    .number({ error: `${label} must be a number of cents` })
    .int(`${label} is in whole cents`)
    .min(0, `${label} cannot be negative`)
    .max(10_000_000, `${label} looks too high`);
}

/** A lead time in whole days, at most a year: a grinder's quote and the owner's offer alike. */
export const leadTimeDaysSchema = z
  .number({ error: 'Lead time must be a number of days' })
  .int('Lead time is whole days')
  .min(0, 'Lead time cannot be negative')
  .max(365, 'Lead time is at most 365 days');
