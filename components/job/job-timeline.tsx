import { StyleSheet, Text, View } from 'react-native';

import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { formatDateTime } from '@/constants/format';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import { useLifecycleQuery } from '@/hooks/use-jobs';
import type { LifecycleStage } from '@/shared/lifecycle';

/** Where the job stands, stage by stage from teardown to the owner, as the server reads it from the job's records. */
export function JobTimeline({ jobId }: { jobId: string }) {
  const lifecycle = useLifecycleQuery(jobId);
  return (
    <Section title="Where the job stands">
      {lifecycle.isPending ? (
        <Pending label="Reading the job's stages…" />
      ) : lifecycle.isError ? (
        <ErrorNotice error={lifecycle.error} onRetry={() => lifecycle.refetch()} />
      ) : (
        <View role="list" style={styles.list} testID="job-timeline">
          {lifecycle.data.stages.map((stage) => (
            <StageRow key={stage.key} stage={stage} next={stage.key === lifecycle.data.next} />
          ))}
        </View>
      )}
    </Section>
  );
}

function StageRow({ stage, next }: { stage: LifecycleStage; next: boolean }) {
  const state = stage.done ? 'Done' : next ? 'Next' : 'Not yet';
  return (
    <View role="listitem" style={styles.row} testID={`stage-${stage.key}`} aria-label={`${stage.label}: ${state}`}>
      <View style={[styles.mark, stage.done ? styles.markDone : next ? styles.markNext : styles.markOpen]}>
        <Text style={[styles.markText, stage.done && styles.markTextDone]}>{stage.done ? '✓' : ''}</Text>
      </View>
      <View style={styles.words}>
        <Text style={[styles.label, !stage.done && !next && styles.muted]}>
          {stage.label}
          <Text style={styles.state} testID={`stage-${stage.key}-state`}>
            {` · ${state}`}
          </Text>
        </Text>
        {stage.at ? <Text style={styles.meta}>{formatDateTime(stage.at)}</Text> : null}
        {stage.detail ? (
          <Text style={styles.meta} testID={`stage-${stage.key}-detail`}>
            {stage.detail}
          </Text>
        ) : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  row: { flexDirection: 'row', gap: space.md, alignItems: 'flex-start' },
  mark: { width: 22, height: 22, borderRadius: radius.pill, borderWidth: 2, alignItems: 'center', justifyContent: 'center', marginTop: 1 },
  markDone: { backgroundColor: colors.pass, borderColor: colors.pass },
  markNext: { backgroundColor: colors.accentSoft, borderColor: colors.accent },
  markOpen: { backgroundColor: colors.surface, borderColor: colors.lineStrong },
  markText: { ...typeScale.small, color: colors.ink, lineHeight: 16 },
  markTextDone: { color: colors.accentInk, fontWeight: '700' },
  words: { flex: 1, gap: 2 },
  label: { ...typeScale.label, color: colors.ink },
  muted: { color: colors.inkMuted },
  state: { ...typeScale.small, color: colors.inkMuted, fontWeight: '400' },
  meta: { ...typeScale.small, color: colors.inkMuted },
});
