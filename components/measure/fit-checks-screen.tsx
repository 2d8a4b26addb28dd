import { Stack } from 'expo-router';
import { useState } from 'react';
import { Pressable, StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { CheckSummaryChip } from '@/components/sheet/check-list';
import { FitCheckResults } from '@/components/measure/fit-check-results';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { SheetChoice } from '@/components/sheet/sheet-choice';
import { formatDateTime } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, touchTarget, type as typeScale } from '@/constants/theme';
import { useCheckedSheet } from '@/state/fit-check';
import { useFitCheckRunsQuery, useRunFitChecksMutation } from '@/hooks/use-fit-checks';
import { useJobQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { useJobSheetsQuery } from '@/hooks/use-sheets';
import { roleAllows } from '@/shared/roles';

export function FitChecksScreen({ id }: { id: string }) {
  const job = useJobQuery(id);
  const sheets = useJobSheetsQuery(id);
  const sheetList = sheets.data ?? [];
  const [sheetId, setSheetId] = useCheckedSheet(
    id,
    sheetList.map((s) => s.id),
  );

  if (job.isPending || sheets.isPending) return <Pending label="Loading the job's spec sheets…" />;
  if (job.isError || sheets.isError) {
    return (
      <View style={styles.padded}>
        <ErrorNotice error={job.error ?? sheets.error} onRetry={() => void Promise.all([job.refetch(), sheets.refetch()])} />
      </View>
    );
  }

  return (
    <Screen
      title="Fit checks"
      subtitle={`${job.data.vehicle} · the spec sheet against what was measured`}
      back={{ href: { pathname: '/jobs/[id]', params: { id } }, label: 'Back to the job' }}
      actions={<Button label="Measurements" variant="secondary" href={{ pathname: '/jobs/[id]/measurements', params: { id } }} testID="open-measurements" />}
      testID="fit-checks-screen"
    >
      <Stack.Screen options={{ title: `Fit checks · ${job.data.vehicle}` }} />
      <SheetChoice sheets={sheetList} value={sheetId} onChange={setSheetId} />
      {sheetId ? <SheetRuns key={sheetId} sheetId={sheetId} sheetTitle={sheetList.find((s) => s.id === sheetId)?.title ?? 'the sheet'} /> : null}
    </Screen>
  );
}

function SheetRuns({ sheetId, sheetTitle }: { sheetId: string; sheetTitle: string }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const runs = useFitCheckRunsQuery(sheetId);
  const run = useRunFitChecksMutation(sheetId);
  const role = useMeQuery().data?.activeShop?.role;
  const canRun = roleAllows(role, { measurement: ['write'] });
  const [shownId, setShownId] = useState<string | null>(null);
  const list = runs.data ?? [];
  const shown = list.find((r) => r.id === shownId) ?? list[0] ?? null;

  const runButton = canRun ? (
    <View style={styles.stack}>
      <Button
        label={run.isPending ? 'Running the checks…' : 'Run fit checks'}
        onPress={() => run.mutate(undefined, { onSuccess: (r) => setShownId(r.id) })}
        busy={run.isPending}
        testID="run-fit-checks"
      />
      {run.isPending ? (
        <Text role="status" aria-live="polite" style={styles.meta}>
          Sweeping piston-to-valve through overlap and checking each spring…
        </Text>
      ) : null}
      {run.error ? <ErrorNotice error={run.error} /> : null}
    </View>
  ) : (
    <Text style={styles.meta}>Your role can read fit checks; a tech or builder runs them.</Text>
  );

  const history = (
    <Section title="Earlier runs">
      {list.length === 0 ? (
        <Text style={styles.meta}>No runs on this sheet yet.</Text>
      ) : (
        <View role="list" style={styles.history} testID="fit-check-history">
          {list.map((r) => {
            const active = shown?.id === r.id;
            return (
              <View key={r.id} role="listitem">
                <Pressable
                  role="button"
                  aria-pressed={active}
                  onPress={() => setShownId(r.id)}
                  style={[styles.historyItem, active && styles.historyActive]}
                  testID={`fit-run-${r.id}`}
                >
                  <CheckSummaryChip summary={r.summary} />
                  <Text style={styles.historyText}>
                    Revision {r.revisionNumber} · {formatDateTime(r.createdAt)}
                  </Text>
                </Pressable>
              </View>
            );
          })}
        </View>
      )}
    </Section>
  );

  const results = (
    <Section title="Results">
      {runButton}
      {runs.isPending ? (
        <Pending label="Loading earlier runs…" />
      ) : runs.isError ? (
        <ErrorNotice error={runs.error} onRetry={() => runs.refetch()} />
      ) : shown ? (
        <FitCheckResults run={shown} sheetTitle={sheetTitle} />
      ) : (
        <EmptyState title="Not run yet">
          <Text style={styles.meta}>Record the measurements, then run the checks against this sheet&apos;s current revision.</Text>
        </EmptyState>
      )}
    </Section>
  );

  return wide ? (
    <View style={styles.columns}>
      <View style={styles.main}>{results}</View>
      <View style={styles.side}>{history}</View>
    </View>
  ) : (
    <View style={styles.stack}>
      {results}
      {history}
    </View>
  );
}

const styles = StyleSheet.create({
  padded: { padding: space.lg },
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 2, gap: space.lg },
  side: { flex: 1, gap: space.lg },
  meta: { ...typeScale.small, color: colors.inkMuted },
  history: { gap: space.xs },
  historyItem: {
    minHeight: touchTarget,
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    paddingHorizontal: space.sm,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
  },
  historyActive: { backgroundColor: colors.accentSoft, borderColor: colors.accent },
  historyText: { fontFamily: fonts.medium, fontSize: 14, color: colors.ink, flexShrink: 1 },
});
