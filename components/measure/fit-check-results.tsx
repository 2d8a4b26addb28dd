import type { ReactNode } from 'react';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import type { CheckId } from '@/calc/checks';
import { formatDateTime } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { productCautions } from '@/shared/cautions';
import { correctionText, iclText, revisionName, trueTdcText } from '@/lib/degree-readout';
import { pushrodAdviceText } from '@/shared/fits-core';
import type { FitCheckRun } from '@/shared/measurements';

import { Cautions } from '@/components/compare/cautions';
import { CheckList, CheckSummaryChip } from '@/components/sheet/check-list';

type Group = { key: string; title: string; ids: CheckId[] };

const groups: Group[] = [
  { key: 'ptv', title: 'Piston-to-valve', ids: ['ptvIntake', 'ptvExhaust'] },
  { key: 'springs', title: 'Springs', ids: ['coilBind', 'retainerToSeal'] },
  { key: 'preload', title: 'Lifter preload', ids: ['hydraulicPreload'] },
  { key: 'degree', title: 'Degreeing', ids: ['degreeing'] },
  { key: 'lobes', title: 'Measured lobes', ids: ['wornLobe'] },
  { key: 'other', title: 'Other', ids: ['dynamicCompression'] },
];

const inch = (v: number) => `${v.toFixed(3).replace(/^-/, '−')} in`;
const deg = (v: number) => `${v.toFixed(1).replace(/^-/, '−')}°`;

/** One run's results, grouped by what was measured, with the cautions beside PTV and springs. */
export function FitCheckResults({ run, sheetTitle }: { run: FitCheckRun; sheetTitle: string }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const r = run.results;

  const details: Record<string, ReactNode> = {
    ptv: (
      <>
        {(['intake', 'exhaust'] as const).map((valve) => {
          const s = r.ptv[valve];
          return s ? (
            <Text key={valve} style={styles.detail}>
              {valve === 'intake' ? 'Intake' : 'Exhaust'}: least {inch(s.minClearance)} at {deg(s.atAngle)} ATDC (valve lift {inch(s.liftAtMin)}), from the{' '}
              {inch(s.baseline.clearance)} reading at {deg(s.baseline.crankAngle)}
            </Text>
          ) : null;
        })}
      </>
    ),
    springs: (
      <>
        {r.springs.map((s) => (
          <Text key={s.where} style={styles.detail}>
            {s.where}: at {inch(s.valveLift)} lift, open load {s.openLoad.toFixed(0)} lbf, open height {inch(s.openHeight)}
          </Text>
        ))}
      </>
    ),
    preload: (
      <>
        {r.preload ? (
          <Text style={styles.detail}>
            Lifter drops {inch(r.preload.lifterDrop)}; preload with the same pushrods {inch(r.preload.newPreload)}.
          </Text>
        ) : null}
        {r.pushrod ? (
          <Text style={styles.detail} testID="fit-pushrod-advice">
            {r.pushrod.advice ? pushrodAdviceText(r.pushrod.advice) : `No pushrod advice yet: ${r.pushrod.missing ?? 'record the pushrod readings'}.`}
          </Text>
        ) : null}
      </>
    ),
    degree: r.degree ? (
      <Text style={styles.detail} testID="fit-degree-detail">
        Measured ICL <Text testID="fit-degree-icl">{iclText(r.degree)}</Text>. {correctionText(r.degree, revisionName(sheetTitle, run.revisionNumber))} True TDC{' '}
        {trueTdcText(r.degree.trueTdcOffset)}.
      </Text>
    ) : null,
    lobes: r.lobes ? (
      <Text style={styles.detail}>
        {r.lobes.analyses.length} lobes read
        {r.lobes.worn && r.lobes.worn.worn.length > 0 ? `; worn: ${r.lobes.worn.worn.join(', ')}` : '; none worn'}
      </Text>
    ) : null,
    other: null,
  };

  return (
    <View style={styles.run} testID="fit-check-results">
      <View style={styles.summary}>
        <CheckSummaryChip summary={run.summary} testID="fit-check-status" />
        <Text style={styles.summaryText} testID="fit-results-by">
          Revision {run.revisionNumber} · run {formatDateTime(run.createdAt)}
          {run.createdByName ? ` by ${run.createdByName}` : ''}
        </Text>
      </View>
      {groups.map((g) => {
        const all = r.checks.filter((c) => g.ids.includes(c.id));
        // Sixteen passing lobes say less than the one that is not: list the rest as a count.
        const checks = g.key === 'lobes' ? all.filter((c) => c.status !== 'pass') : all;
        const hiddenPasses = all.length - checks.length;
        const skipped = r.skipped.filter((s) => g.ids.includes(s.id));
        if (checks.length === 0 && skipped.length === 0 && !(g.key === 'preload' && r.pushrod)) return null;
        const caution =
          g.key === 'ptv' ? (
            <Cautions title="Before the engine turns over" items={[productCautions.measure]} testID="caution-ptv" />
          ) : g.key === 'preload' ? (
            <Cautions title="Pushrods and preload" items={[productCautions.measure, productCautions.manual]} testID="caution-preload" />
          ) : g.key === 'springs' ? (
            <Cautions title="Springs and parts" items={[productCautions.measure, productCautions.manual]} testID="caution-springs" />
          ) : null;
        return (
          <View key={g.key} style={styles.group} testID={`fit-group-${g.key}`}>
            <Text role="heading" aria-level={3} style={styles.groupTitle}>
              {g.title}
            </Text>
            <View style={wide && caution ? styles.beside : styles.stack}>
              <View style={[styles.stack, wide && caution ? styles.main : null]}>
                <CheckList checks={checks} skipped={skipped} testID={`fit-${g.key}`} />
                {hiddenPasses > 0 ? (
                  <Text style={styles.detail} testID={`fit-${g.key}-passing`}>
                    {hiddenPasses} other lobe{hiddenPasses === 1 ? '' : 's'} pass.
                  </Text>
                ) : null}
                {details[g.key]}
              </View>
              {caution ? <View style={wide ? styles.side : null}>{caution}</View> : null}
            </View>
          </View>
        );
      })}
    </View>
  );
}

const styles = StyleSheet.create({
  run: { gap: space.lg },
  summary: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  summaryText: { ...typeScale.bodyStrong, color: colors.ink },
  group: { gap: space.sm, paddingTop: space.md, borderTopWidth: 1, borderTopColor: colors.line },
  groupTitle: { ...typeScale.heading, color: colors.ink },
  stack: { gap: space.sm },
  beside: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  main: { flex: 3 },
  side: { flex: 2 },
  detail: { ...typeScale.small, color: colors.ink, fontFamily: fonts.regular, padding: space.sm, borderRadius: radius.sm, backgroundColor: colors.sunken },
});
