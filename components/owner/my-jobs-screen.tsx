import { Link } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { LoadMore } from '@/components/ui/load-more';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen } from '@/components/ui/screen';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import { useMyJobsQuery } from '@/hooks/use-owner-page';

/** A signed-in owner's vehicles: each summary a shop sent to their e-mail. */
export function MyJobsScreen() {
  const jobs = useMyJobsQuery();
  return (
    <Screen title="Your vehicles" subtitle="Summaries your shop sent to your e-mail address" testID="my-jobs-screen">
      {jobs.isPending ? (
        <Pending label="Loading your summaries…" />
      ) : jobs.isError ? (
        <ErrorNotice error={jobs.error} onRetry={() => jobs.refetch()} />
      ) : jobs.data.length === 0 ? (
        <EmptyState title="Nothing here yet">
          <Text style={styles.body}>When your shop sends you a summary by e-mail, it shows here too.</Text>
        </EmptyState>
      ) : (
        <View style={styles.list} role="list">
          {jobs.data.map((j) => (
            <Link key={j.jobId} href={`/my/${j.jobId}`} style={styles.card} role="listitem" testID="my-job">
              <Text style={styles.title}>{j.vehicle}</Text>
              {'\n'}
              <Text style={styles.body}>
                {j.shopName} · {j.paid ? 'Approved, deposit paid' : j.approved ? 'Approved, deposit to pay' : 'Waiting for your decision'}
              </Text>
            </Link>
          ))}
          <LoadMore hasMore={jobs.hasNextPage} loading={jobs.isFetchingNextPage} onLoadMore={() => void jobs.fetchNextPage()} />
        </View>
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  card: { padding: space.lg, borderRadius: radius.lg, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.surface },
  title: { ...typeScale.heading, color: colors.ink },
  body: { ...typeScale.body, color: colors.inkMuted },
});
