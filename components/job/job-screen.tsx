import { Stack } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { JobChecklist } from '@/components/job/job-checklist';
import { JobForm } from '@/components/job/job-form';
import { JobPhotos } from '@/components/job/job-photos';
import { OwnerSection } from '@/components/owner/lazy-owner';
import { EngineSummary, JobProfiles, JobSheets } from '@/components/job/job-sections';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { JobStatusChip } from '@/components/job/job-status-chip';
import { JobTimeline } from '@/components/job/job-timeline';
import { formatDateTime, formatMiles } from '@/constants/format';
import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useJobQuery, useSaveJobMutation } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import type { Job } from '@/shared/jobs';
import { roleAllows } from '@/shared/roles';

export function JobScreen({ id }: { id: string }) {
  const job = useJobQuery(id);
  if (job.isPending) return <Pending label="Loading the job…" />;
  if (job.isError) {
    const gone = job.error instanceof ApiError && job.error.status === 404;
    return (
      <View style={styles.padded}>
        <ErrorNotice
          error={gone ? new Error('This job is not in your shop, or it no longer exists.') : job.error}
          onRetry={gone ? undefined : () => job.refetch()}
        />
      </View>
    );
  }
  return <JobDetail job={job.data} />;
}

function JobDetail({ job }: { job: Job }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const role = useMeQuery().data?.activeShop?.role;
  const canEdit = roleAllows(role, { job: ['update'] });
  const canWrite = roleAllows(role, { sheet: ['write'] });
  const canMeasure = roleAllows(role, { measurement: ['write'] });
  const save = useSaveJobMutation(job.id);
  const [editing, setEditing] = useState(false);

  return (
    <Screen
      title={job.vehicle}
      subtitle={`${job.customerName} · ${formatMiles(job.mileage)}`}
      actions={canEdit && !editing ? <Button label="Edit" variant="secondary" onPress={() => setEditing(true)} testID="edit-job" /> : null}
      back={{ href: '/jobs', label: 'All jobs' }}
      testID="job-screen"
    >
      <Stack.Screen options={{ title: job.vehicle }} />
      {editing ? (
        <Section title="Edit job">
          <JobForm
            job={job}
            submitLabel="Save changes"
            busy={save.isPending}
            onCancel={() => setEditing(false)}
            onSubmit={async (values) => {
              await save.mutateAsync({ ...values, version: job.version });
              setEditing(false);
            }}
          />
        </Section>
      ) : (
        <View style={wide ? styles.columns : styles.stack}>
          <View style={[wide ? styles.column : undefined, styles.stack]}>
            <Section title="Complaint">
              <Text style={styles.body} testID="job-complaint-text">
                {job.complaint || 'No complaint recorded yet.'}
              </Text>
            </Section>
            <Section title="Findings">
              <Text style={styles.body} testID="job-findings-text">
                {job.findings || 'Nothing recorded from teardown yet.'}
              </Text>
            </Section>
            <JobTimeline jobId={job.id} />
            <JobPhotos jobId={job.id} canWrite={canMeasure} />
            <Section title="Record">
              <JobStatusChip status={job.status} />
              <Text style={styles.meta}>Checked in {formatDateTime(job.createdAt)}</Text>
              <Text style={styles.meta}>
                Last saved {formatDateTime(job.updatedAt)} (version {job.version})
              </Text>
            </Section>
          </View>
          <View style={[wide ? styles.column : undefined, styles.stack]}>
            <Section title="On the bench">
              <Text style={styles.meta}>Measurements from the engine, the fit checks against a spec sheet, and the job checklist.</Text>
              <View style={styles.links}>
                <Button label="Measurements" href={{ pathname: '/jobs/[id]/measurements', params: { id: job.id } }} testID="open-measurements" />
                <Button label="Fit checks" variant="secondary" href={{ pathname: '/jobs/[id]/fit-checks', params: { id: job.id } }} testID="open-fit-checks" />
              </View>
            </Section>
            <EngineSummary jobId={job.id} canWrite={canWrite} />
            <JobProfiles jobId={job.id} canWrite={canWrite} />
            <JobSheets jobId={job.id} />
            <OwnerSection jobId={job.id} />
            <JobChecklist jobId={job.id} canWrite={canMeasure} />
          </View>
        </View>
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  padded: { padding: space.lg },
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  column: { flex: 1 },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  links: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
