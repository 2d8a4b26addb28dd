import { Link } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { formatDate, formatMiles } from '@/constants/format';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import type { Job } from '@/shared/jobs';

import { JobStatusChip } from '@/components/job/job-status-chip';

/** One job in the list: vehicle, owner, stage, odometer, last change. Opens the job page. */
export function JobCard({ job }: { job: Job }) {
  return (
    <Link href={{ pathname: '/jobs/[id]', params: { id: job.id } }} style={styles.card} testID={`job-card-${job.id}`}>
      <View style={styles.inner}>
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
      </View>
    </Link>
  );
}

const styles = StyleSheet.create({
  inner: { gap: space.xs, width: '100%' },
  card: {
    display: 'flex',
    padding: space.lg,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.line,
    borderLeftWidth: 5,
    borderLeftColor: colors.accent,
  },
  top: { flexDirection: 'row', justifyContent: 'space-between', alignItems: 'flex-start', gap: space.md },
  vehicle: { ...typeScale.heading, color: colors.ink, flexShrink: 1 },
  owner: { ...typeScale.bodyStrong, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  complaint: { ...typeScale.body, color: colors.inkMuted },
});
