import { StyleSheet, Text, View } from 'react-native';

import { formatDate, formatMiles } from '@/constants/format';
import { colors, space, type as typeScale } from '@/constants/theme';
import type { Job } from '@/shared/jobs';

import { JobStatusChip } from '@/components/job/job-status-chip';
import { LinkCard } from '@/components/ui/link-card';

/** One job in the list: vehicle, owner, stage, odometer, last change. Opens the job page. */
export function JobCard({ job }: { job: Job }) {
  return (
    <LinkCard href={{ pathname: '/jobs/[id]', params: { id: job.id } }} edge={colors.accent} testID={`job-card-${job.id}`}>
      <View style={styles.top}>
        <Text style={styles.vehicle} numberOfLines={2}>
          {job.vehicle}
        </Text>
        <JobStatusChip status={job.status} />
      </View>
      <Text style={styles.owner}>{job.customerName}</Text>
      <Text style={styles.meta}>
        {formatMiles(job.mileage)} · updated {formatDate(job.updatedAt)}
      </Text>
      {job.complaint ? (
        <Text style={styles.complaint} numberOfLines={2}>
          {job.complaint}
        </Text>
      ) : null}
    </LinkCard>
  );
}

const styles = StyleSheet.create({
  top: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  vehicle: { ...typeScale.heading, color: colors.ink, flexShrink: 1 },
  owner: { ...typeScale.bodyStrong, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  complaint: { ...typeScale.body, color: colors.inkMuted },
});
