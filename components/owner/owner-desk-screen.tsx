import { Stack } from 'expo-router';
import { StyleSheet, useWindowDimensions, View } from 'react-native';

import { OwnerOptions, OwnerStatus, OwnerWords, ShareLinks } from '@/components/owner/owner-desk';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen } from '@/components/ui/screen';
import { breakpoints, space } from '@/constants/theme';
import { useJobQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { useOwnerDeskQuery } from '@/hooks/use-owner-page';
import { roleAllows } from '@/shared/roles';

/** The builder's side of the owner's page: the words, the options and prices, the links, and what the owner did. */
export function OwnerDeskScreen({ id }: { id: string }) {
  const job = useJobQuery(id);
  const desk = useOwnerDeskQuery(id);
  const canEdit = roleAllows(useMeQuery().data?.activeShop?.role, { job: ['update'] });
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const title = "Owner's page";
  if (job.isPending || desk.isPending) return <Pending label="Loading the owner's page…" />;
  if (job.isError || desk.isError) return <ErrorNotice error={job.error ?? desk.error} onRetry={() => void Promise.all([job.refetch(), desk.refetch()])} />;
  return (
    <Screen title={title} subtitle={`${job.data.vehicle} · ${job.data.customerName}`} back={{ href: `/jobs/${id}`, label: 'Job' }} testID="owner-desk-screen">
      <Stack.Screen options={{ title }} />
      <View style={[styles.columns, wide && styles.wide]}>
        <View style={styles.column}>
          <OwnerStatus desk={desk.data} />
          <OwnerWords key={desk.data.version} jobId={id} desk={desk.data} findings={job.data.findings} canEdit={canEdit} />
        </View>
        <View style={styles.column}>
          <OwnerOptions jobId={id} desk={desk.data} canEdit={canEdit} />
          <ShareLinks jobId={id} desk={desk.data} canEdit={canEdit} />
        </View>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  columns: { gap: space.xl },
  wide: { flexDirection: 'row', alignItems: 'flex-start' },
  column: { flex: 1, gap: space.xl, minWidth: 0 },
});
