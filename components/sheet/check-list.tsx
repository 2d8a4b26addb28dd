import { StyleSheet, Text, View } from 'react-native';

import type { CheckResult, CheckStatus, SkippedCheck } from '@/calc/checks';
import { summarizeChecks, type CheckSummary } from '@/calc/check-summary';
import { colors, fonts, space, type as typeScale } from '@/constants/theme';

import { Chip } from '@/components/ui/chip';

const statusText: Record<CheckStatus, string> = { pass: 'Pass', watch: 'Watch', fail: 'Fail' };

const checkNames: Record<CheckResult['id'], string> = {
  coilBind: 'Coil-bind margin',
  retainerToSeal: 'Retainer-to-seal',
  ptvIntake: 'Piston-to-valve, intake',
  ptvExhaust: 'Piston-to-valve, exhaust',
  hydraulicPreload: 'Lifter preload',
  dynamicCompression: 'Dynamic compression',
  degreeing: 'Cam degreed in',
  wornLobe: 'Lobe wear',
  pressureAngle: 'Pressure angle',
  undercut: 'Cam radius (undercut)',
  grindingWheel: 'Concave flank vs wheel',
  finishingStock: 'Fits the core',
  cleanup: 'Cut cleans up damage',
  largestCut: 'Cut vs hardened layer',
};

/** A summary of several checks (calc's summarizeChecks): "Pass" only when every check ran and passed, else e.g. "5 of 8 checks run". */
export function CheckSummaryChip({ summary, testID }: { summary: CheckSummary; testID?: string }) {
  return (
    <Chip label={summary.label} tone={summary.status === 'incomplete' ? 'muted' : summary.status} look={summary.complete ? 'verdict' : 'tag'} testID={testID} />
  );
}

/** The summary chip of a list of results (a sheet revision's, a compared profile's), by the same one summary. */
export function ResultsSummaryChip({ results, testID }: { results: { checks: readonly CheckResult[]; skipped: readonly SkippedCheck[] }; testID?: string }) {
  return <CheckSummaryChip summary={summarizeChecks(results)} testID={testID} />;
}

/** A check's verdict (pass, watch, fail) as a chip. */
export function CheckStatusChip({ status, testID }: { status: CheckStatus; testID?: string }) {
  return <Chip label={statusText[status]} tone={status} look="verdict" testID={testID} />;
}

function number(v: number, unit: string) {
  return unit === 'in' ? `${v.toFixed(3)} in` : unit === ':1' ? `${v.toFixed(2)}:1` : `${v.toFixed(1)} ${unit}`;
}

/** Each check with its status, value, margin, and the rule and source it used; then what could not be checked yet. */
export function CheckList({ checks, skipped, testID }: { checks: readonly CheckResult[]; skipped: readonly SkippedCheck[]; testID?: string }) {
  return (
    <View style={styles.list} role="list" testID={testID}>
      {checks.map((c) => (
        <View key={`${c.id}-${c.subject}`} role="listitem" style={styles.item} testID={testID ? `${testID}-${c.id}-${c.subject}` : undefined}>
          <View style={styles.head}>
            <CheckStatusChip status={c.status} />
            <Text style={styles.name}>
              {checkNames[c.id]} <Text style={styles.subject}>({c.subject})</Text>
            </Text>
          </View>
          <Text style={styles.detail}>
            {number(c.value, c.unit)} · margin {number(c.margin, c.unit)}
          </Text>
          <Text style={styles.rule}>
            {c.rule} — {c.source}
          </Text>
        </View>
      ))}
      {skipped.map((s) => (
        <View key={`${s.id}-${s.subject}`} role="listitem" style={styles.item}>
          <View style={styles.head}>
            <Chip label="Not run" tone="muted" look="verdict" />
            <Text style={styles.name}>
              {checkNames[s.id]} <Text style={styles.subject}>({s.subject})</Text>
            </Text>
          </View>
          <Text style={styles.rule}>{s.note}</Text>
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.sm },
  item: { gap: 2, paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.grid },
  head: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  name: { ...typeScale.bodyStrong, color: colors.ink },
  subject: { fontFamily: fonts.regular, color: colors.inkMuted },
  detail: { ...typeScale.number, fontSize: 14, color: colors.ink },
  rule: { ...typeScale.small, color: colors.inkMuted },
});
