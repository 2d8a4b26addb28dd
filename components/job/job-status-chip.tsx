import { jobStatusLabels, type JobStatus } from '@/shared/jobs';

import { Chip } from '@/components/ui/chip';

/** The job's stage as a compact tag. */
export function JobStatusChip({ status }: { status: JobStatus }) {
  return <Chip label={jobStatusLabels[status]} />;
}
