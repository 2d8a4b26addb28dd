import { z } from 'zod';

export const jobStatuses = ['intake', 'teardown', 'awaiting-cam', 'assembly', 'delivered'] as const;
export type JobStatus = (typeof jobStatuses)[number];

export const jobStatusLabels: Record<JobStatus, string> = {
  intake: 'Checked in',
  teardown: 'Teardown',
  'awaiting-cam': 'Waiting on cam',
  assembly: 'Reassembly',
  delivered: 'Back with owner',
};

const text = (max: number, missing: string) => z.string({ error: missing }).trim().min(1, missing).max(max, `Keep it under ${max} characters`);
const longText = (max: number) => z.string({ error: 'Must be text' }).trim().max(max, `Keep it under ${max} characters`);

export const mileageSchema = z
  .number({ error: 'Mileage must be a number' })
  .int('Mileage is a whole number')
  .min(0, 'Mileage cannot be negative')
  .max(2_000_000, 'Mileage looks too high: check the odometer reading');

export const jobCreateSchema = z.strictObject({
  vehicle: text(200, 'Describe the vehicle'),
  customerName: text(120, "Enter the owner's name"),
  complaint: longText(4000).default(''),
  mileage: mileageSchema.nullable().default(null),
});
export type JobCreate = z.input<typeof jobCreateSchema>;

export const jobPatchSchema = z.strictObject({
  version: z.number({ error: 'Send the version you edited' }).int().min(1),
  vehicle: text(200, 'Describe the vehicle').optional(),
  customerName: text(120, "Enter the owner's name").optional(),
  complaint: longText(4000).optional(),
  findings: longText(8000).optional(),
  mileage: mileageSchema.nullable().optional(),
  status: z.enum(jobStatuses, { error: `Status is one of: ${jobStatuses.join(', ')}` }).optional(),
});
export type JobPatch = z.input<typeof jobPatchSchema>;

export type Job = {
  id: string;
  shopId: string;
  vehicle: string;
  customerName: string;
  complaint: string;
  findings: string;
  mileage: number | null;
  status: JobStatus;
  version: number;
  createdAt: string;
  updatedAt: string;
};
