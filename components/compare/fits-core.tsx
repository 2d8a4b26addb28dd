import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { coreView, type CoreVerdict } from '@/shared/fits-core';
import { productCautions } from '@/shared/cautions';
import type { FeasibilityResults } from '@/shared/sheets';

import { Cautions } from '@/components/compare/cautions';
import { CheckList } from '@/components/sheet/check-list';
import { Chip, type ChipTone } from '@/components/ui/chip';
import { MarginPlot } from '@/components/ui/lazy-calc';

const verdictLabel: Record<CoreVerdict, string> = { pass: 'Fits', watch: 'Fits, watch', fail: 'Does not fit', 'not-run': 'Not run' };
const verdictTone: Record<CoreVerdict, ChipTone> = { pass: 'pass', watch: 'watch', fail: 'fail', 'not-run': 'muted' };

const grindCaution =
  "These figures are predictions from the old cam's measured lobes. The grinder confirms the core on the machine before grinding, and the lifter and engine maker's instructions come first.";

/**
 * "Fits the core?": can this profile be ground from the old cam, at what cut, with how much
 * metal to spare, and what the cut does to the lifters. Shows calc's figures only (the sheet's
 * stored results, or the compare screen's analysis), never works one out itself.
 */
export function FitsCorePanel({
  feasibility,
  missing,
  name,
  testID = 'fits-core',
}: {
  feasibility: FeasibilityResults | undefined;
  /** What the job lacks for its core, when known (the compare screen); a sheet without feasibility predates the core. */
  missing?: readonly string[];
  name?: string;
  testID?: string;
}) {
  const view = coreView(feasibility, missing);
  const hasPlot = Boolean(feasibility && (feasibility.intake.envelope || feasibility.exhaust.envelope));
  return (
    <View style={styles.panel} testID={testID} role="group" aria-label={`Fits the core?${name ? ` ${name}` : ''}`}>
      <View style={styles.head}>
        <Text role="heading" aria-level={3} style={styles.title}>
          Fits the core?{name ? ` ${name}` : ''}
        </Text>
        <Chip label={verdictLabel[view.verdict]} tone={verdictTone[view.verdict]} look="verdict" testID={`${testID}-verdict`} />
      </View>
      <Text style={styles.headline} testID={`${testID}-headline`}>
        {view.headline}
      </Text>
      {feasibility?.coreFrom ? <Text style={styles.small}>Old cam: {feasibility.coreFrom}.</Text> : null}
      {hasPlot && feasibility ? <MarginPlot feasibility={feasibility} testID={`${testID}-plot`} /> : null}
      {view.figures.length ? (
        <View style={styles.figures} role="list">
          {view.figures.map((f) => (
            <View key={f.key} style={styles.figure} role="listitem" testID={`${testID}-figure-${f.key}`}>
              <Text style={styles.small}>{f.label}</Text>
              <Text style={styles.value}>{f.value}</Text>
            </View>
          ))}
        </View>
      ) : null}
      <View style={styles.lifter}>
        <Text style={styles.strong}>Preload and pushrods</Text>
        <Text style={styles.body} testID={`${testID}-lifter`}>
          {view.lifter}
        </Text>
      </View>
      {view.checks.length || feasibility?.skipped.length ? (
        <CheckList checks={view.checks} skipped={feasibility?.skipped ?? []} testID={`${testID}-checks`} />
      ) : null}
      {feasibility ? <Text style={styles.small}>How it is judged: {feasibility.criterion}</Text> : null}
      {view.verdict !== 'not-run' ? (
        <Cautions title="Before grinding" items={[grindCaution, productCautions.manual, productCautions.practice]} testID={`${testID}-cautions`} />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  panel: {
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  head: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.sm },
  title: { ...typeScale.bodyStrong, color: colors.ink, flexShrink: 1 },
  headline: { fontFamily: fonts.semibold, fontSize: 16, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  strong: { ...typeScale.bodyStrong, color: colors.ink },
  small: { ...typeScale.small, color: colors.inkMuted },
  figures: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  figure: { flexGrow: 1, flexBasis: 160, gap: 2, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.sunken },
  value: { fontFamily: fonts.monoBold, fontSize: 15, color: colors.ink },
  lifter: { gap: space.xs },
});
