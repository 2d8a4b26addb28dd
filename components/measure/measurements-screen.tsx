import { Suspense } from 'react';
import { Stack } from 'expo-router';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { DEFAULT_CHECK_LIMITS } from '@/calc/check-limits';
import { Button } from '@/components/ui/button';
import { DegreeReadout } from '@/components/measure/degree-readout';
import { LobeBench } from '@/components/measure/lobe-bench';
import { degreeConfig, ptvConfig, pushrodConfig, springsConfig } from '@/lib/measure-configs';
import { MeasureForm } from '@/components/measure/measure-form';
import { draftNumber } from '@/lib/measure-fields';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { UnitToggle } from '@/components/ui/unit-toggle';
import { SheetChoice } from '@/components/sheet/sheet-choice';
import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';
import { useCheckedSheet } from '@/state/fit-check';
import { useJobQuery } from '@/hooks/use-jobs';
import { latestOfKind, useJobMeasurementsQuery } from '@/hooks/use-measurements';
import { useMeQuery } from '@/hooks/use-me';
import { useJobSheetsQuery } from '@/hooks/use-sheets';
import { useShopLimitsQuery } from '@/hooks/use-shop-limits';
import { revisionName } from '@/lib/degree-readout';
import { roleAllows } from '@/shared/roles';

export function MeasurementsScreen({ id }: { id: string }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const job = useJobQuery(id);
  const measurements = useJobMeasurementsQuery(id);
  const sheets = useJobSheetsQuery(id);
  const limits = useShopLimitsQuery();
  const role = useMeQuery().data?.activeShop?.role;
  const canWrite = roleAllows(role, { measurement: ['write'] });
  const sheetList = sheets.data ?? [];
  const [sheetId, setSheetId] = useCheckedSheet(
    id,
    sheetList.map((s) => s.id),
  );
  const sheet = sheetList.find((s) => s.id === sheetId) ?? null;
  const sheetName = sheet ? revisionName(sheet.title, sheet.current.number) : null;

  if (measurements.isPending || job.isPending) return <Pending label="Loading the measurements…" />;
  if (measurements.isError || job.isError) {
    return (
      <View style={styles.padded}>
        <ErrorNotice error={measurements.error ?? job.error} onRetry={() => void Promise.all([measurements.refetch(), job.refetch()])} />
      </View>
    );
  }
  const list = measurements.data;
  const threshold = limits.data?.resolved.wornLobe.max ?? DEFAULT_CHECK_LIMITS.wornLobe.max;

  const ptv = (
    <Section title="Piston-to-valve baseline">
      <Text style={styles.help}>
        Clearance measured with the old cam, intake and exhaust, at one or more crank angles around overlap TDC. The fit checks add the change in lift from the
        new profile.
      </Text>
      <MeasureForm jobId={id} config={ptvConfig} current={latestOfKind(list, 'ptv-baseline')} canWrite={canWrite} testID="ptv" />
    </Section>
  );
  const springs = (
    <Section title="Valve springs">
      <Text style={styles.help}>One row per valve (e.g. 3E), per head, or one for all. Heights at the installed position, in the units chosen above.</Text>
      <MeasureForm jobId={id} config={springsConfig} current={latestOfKind(list, 'springs')} canWrite={canWrite} testID="springs" />
    </Section>
  );
  const pushrod = (
    <Section title="Pushrod and preload">
      <Text style={styles.help}>
        The checking pushrod set to zero lash with the lifter on the base circle (and which cam it was on), the preload wanted and the lifter&apos;s plunger
        travel.
      </Text>
      <MeasureForm jobId={id} config={pushrodConfig} current={latestOfKind(list, 'pushrod')} canWrite={canWrite} testID="pushrod" />
    </Section>
  );
  const degree = (
    <Section title="Degree wheel">
      <Text style={styles.help}>
        Piston stops either side of TDC, then, with the pointer left where it was, the crank angles where the dial shows the same lift on the opening and
        closing flanks of the number 1 intake lobe.
      </Text>
      <MeasureForm
        jobId={id}
        config={degreeConfig}
        current={latestOfKind(list, 'degree')}
        canWrite={canWrite}
        testID="degree"
        aside={(draft) => (
          <DegreeReadout
            stopBefore={draftNumber(draft.stopBefore)}
            stopAfter={draftNumber(draft.stopAfter)}
            openingAngle={draftNumber(draft.openingAngle)}
            closingAngle={draftNumber(draft.closingAngle)}
            sheet={sheet && sheetName ? { icl: sheet.current.spec.icl, name: sheetName } : null}
          />
        )}
      />
    </Section>
  );
  const lobes = (
    <Section title="Measured lobes">
      <Suspense fallback={<Pending label="Loading the lobe reader…" />}>
        <LobeBench
          jobId={id}
          current={latestOfKind(list, 'lobes')}
          canWrite={canWrite}
          threshold={threshold}
          spec={sheet?.current.spec ?? null}
          specName={sheetName}
        />
      </Suspense>
    </Section>
  );

  return (
    <Screen
      title="Measurements"
      subtitle={`${job.data.vehicle} · what the tech measured on the engine`}
      back={{ href: { pathname: '/jobs/[id]', params: { id } }, label: 'Back to the job' }}
      actions={<Button label="Fit checks" variant="secondary" href={{ pathname: '/jobs/[id]/fit-checks', params: { id } }} testID="open-fit-checks" />}
      testID="measurements-screen"
    >
      <Stack.Screen options={{ title: `Measurements · ${job.data.vehicle}` }} />
      <SheetChoice sheets={sheetList} value={sheetId} onChange={setSheetId} />
      <UnitToggle volume={false} />
      {!canWrite ? <Text style={styles.help}>Your role in this shop can read measurements but not record them.</Text> : null}
      {wide ? (
        <View style={styles.columns}>
          <View style={styles.column}>
            {ptv}
            {springs}
          </View>
          <View style={styles.column}>
            {degree}
            {pushrod}
          </View>
        </View>
      ) : (
        <>
          {ptv}
          {springs}
          {pushrod}
          {degree}
        </>
      )}
      {lobes}
    </Screen>
  );
}

const styles = StyleSheet.create({
  padded: { padding: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  column: { flex: 1, gap: space.xl },
  help: { ...typeScale.small, color: colors.inkMuted },
});
