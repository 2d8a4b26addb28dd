import { StyleSheet, View } from 'react-native';

import { EngineForm } from '@/components/job/engine-form';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen } from '@/components/ui/screen';
import { space } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useEngineQuery } from '@/hooks/use-engine';
import { useJobQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { roleAllows } from '@/shared/roles';

export function EngineScreen({ id }: { id: string }) {
  const job = useJobQuery(id);
  const engine = useEngineQuery(id);
  const canSave = roleAllows(useMeQuery().data?.activeShop?.role, { sheet: ['write'] });
  const back = { href: { pathname: '/jobs/[id]' as const, params: { id } }, label: job.data?.vehicle ?? 'Back to the job' };

  if (job.isPending || engine.isPending) return <Pending label="Loading the engine…" />;
  const failed = job.error ?? engine.error;
  if (failed) {
    const gone = failed instanceof ApiError && failed.status === 404;
    return (
      <View style={styles.padded}>
        <ErrorNotice
          error={gone ? new Error('This job is not in your shop, or it no longer exists.') : failed}
          onRetry={gone ? undefined : () => void Promise.all([job.refetch(), engine.refetch()])}
        />
      </View>
    );
  }

  return (
    <Screen
      title="Engine"
      subtitle={
        engine.data
          ? 'Geometry and valve springs for this job. Every check and comparison uses these numbers.'
          : 'No engine saved on this job yet. Fill in every field from the teardown and save.'
      }
      back={back}
      testID="engine-screen"
    >
      <EngineForm
        jobId={id}
        record={engine.data ?? null}
        readOnly={!canSave}
        onReload={async () => {
          const latest = await engine.refetch({ throwOnError: true });
          return latest.data ?? null;
        }}
      />
    </Screen>
  );
}

const styles = StyleSheet.create({
  padded: { padding: space.lg },
});
