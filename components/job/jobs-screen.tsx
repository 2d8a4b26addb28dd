import { useRouter } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { JobCard } from '@/components/job/job-card';
import { JobForm } from '@/components/job/job-form';
import { LoadMore } from '@/components/ui/load-more';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { breakpoints, space } from '@/constants/theme';
import { useCreateJobMutation, useJobsQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { roleAllows } from '@/shared/roles';

export function JobsScreen() {
  const router = useRouter();
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const me = useMeQuery().data;
  const canCreate = roleAllows(me?.activeShop?.role, { job: ['create'] });
  const jobs = useJobsQuery();
  const createJob = useCreateJobMutation();
  const [creating, setCreating] = useState(false);

  const form =
    canCreate && creating ? (
      <Section title="New job">
        <JobForm
          submitLabel="Create job"
          busy={createJob.isPending}
          onCancel={() => setCreating(false)}
          onSubmit={async (values) => {
            const job = await createJob.mutateAsync({
              vehicle: values.vehicle,
              customerName: values.customerName,
              complaint: values.complaint,
              mileage: values.mileage,
            });
            setCreating(false);
            router.push({ pathname: '/jobs/[id]', params: { id: job.id } });
          }}
        />
      </Section>
    ) : null;

  return (
    <Screen
      title="Jobs"
      subtitle={me?.activeShop?.name}
      actions={canCreate && !creating ? <Button label="New job" onPress={() => setCreating(true)} testID="new-job" /> : null}
      testID="jobs-screen"
    >
      <View style={wide ? styles.columns : styles.stack}>
        <View style={[styles.list, wide && styles.listWide]} role="list" aria-label="Jobs">
          {jobs.isPending ? (
            <Pending label="Loading jobs…" />
          ) : jobs.isError ? (
            <ErrorNotice error={jobs.error} onRetry={() => jobs.refetch()} />
          ) : jobs.data.length === 0 ? (
            <EmptyState title="No jobs yet">
              {canCreate ? <Button label="Check in the first vehicle" variant="secondary" onPress={() => setCreating(true)} testID="empty-new-job" /> : null}
            </EmptyState>
          ) : (
            <>
              {jobs.data.map((job) => (
                <View key={job.id} role="listitem">
                  <JobCard job={job} />
                </View>
              ))}
              <LoadMore hasMore={jobs.hasNextPage} loading={jobs.isFetchingNextPage} onLoadMore={() => void jobs.fetchNextPage()} />
            </>
          )}
        </View>
        {form ? <View style={wide ? styles.side : undefined}>{form}</View> : null}
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg, flexDirection: 'column-reverse' },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  list: { gap: space.md },
  listWide: { flex: 3 },
  side: { flex: 2 },
});
