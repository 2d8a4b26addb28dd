import { Suspense, useMemo, useState } from 'react';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { Cautions } from '@/components/compare/cautions';
import { FitsCorePanel } from '@/components/compare/fits-core';
import { CompareTable } from '@/components/compare/compare-table';
import { LiftPlot, useCalc } from '@/components/ui/lazy-calc';
import { ProfilePicker } from '@/components/compare/profile-picker';
import { TryValues } from '@/components/compare/try-values';
import { CheckList, ResultsSummaryChip } from '@/components/sheet/check-list';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section, type BackLink } from '@/components/ui/screen';
import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';
import { useEngineQuery } from '@/hooks/use-engine';
import { useJobQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { useJobMeasurementsQuery } from '@/hooks/use-measurements';
import { useJobProfilesQuery } from '@/hooks/use-profiles';
import { useShopLimitsQuery } from '@/hooks/use-shop-limits';
import { latestMeasured } from '@/lib/compare-selection';
import { ApiError } from '@/lib/api';
import { allCautions } from '@/shared/cautions';
import type { EngineSpec } from '@/shared/engine';
import type { Measurement, ShopLimitsResponse } from '@/shared/measurements';
import type { Profile } from '@/shared/profile';
import { roleAllows } from '@/shared/roles';
import { useCompare } from '@/state/compare';

/** Two or three of a job's profiles side by side on its engine: lift plot, differences, checks, the owner's words, and values to try. */
export function CompareScreen({ id: jobId }: { id: string }) {
  const job = useJobQuery(jobId);
  const engine = useEngineQuery(jobId);
  const profiles = useJobProfilesQuery(jobId);
  const measurements = useJobMeasurementsQuery(jobId);
  const limits = useShopLimitsQuery();
  const back: BackLink = { href: { pathname: '/jobs/[id]', params: { id: jobId } }, label: 'Back to the job' };

  if (job.isPending || engine.isPending || profiles.isPending || measurements.isPending || limits.isPending)
    return <Pending label="Loading the engine and profiles…" />;
  const failed = job.error ?? engine.error ?? profiles.error;
  if (failed) {
    return (
      <Screen title="Compare profiles" back={back}>
        <ErrorNotice error={failed instanceof ApiError && failed.status === 404 ? new Error('This job is not in your shop.') : failed} />
      </Screen>
    );
  }
  if (!engine.data) {
    return (
      <Screen title="Compare profiles" subtitle={job.data?.vehicle} back={back} testID="compare-screen">
        <EmptyState title="Enter the engine first">
          <Text style={styles.body}>The comparison runs each profile on this job’s engine: bore, stroke, rod, chamber, rockers and springs.</Text>
          <Button label="Enter the engine" variant="secondary" href={`/jobs/${jobId}/engine`} testID="to-engine" />
        </EmptyState>
      </Screen>
    );
  }
  return (
    <Suspense fallback={<Pending label="Loading the analysis…" />}>
      <CompareView
        jobId={jobId}
        vehicle={job.data?.vehicle ?? ''}
        engine={engine.data.engine}
        profiles={profiles.data ?? []}
        measurements={measurements.data}
        limits={limits.data}
        back={back}
      />
    </Suspense>
  );
}

function CompareView({
  jobId,
  vehicle,
  engine,
  profiles,
  measurements,
  limits,
  back,
}: {
  jobId: string;
  vehicle: string;
  engine: EngineSpec;
  profiles: Profile[];
  measurements: Measurement[] | undefined;
  limits: ShopLimitsResponse | undefined;
  back: BackLink;
}) {
  const { jobCore } = useCalc();
  // The job's core and the shop's settings, as the server takes them for a sheet (unreadable ones leave the core out).
  const core = useMemo(() => {
    if (!measurements || !limits) return undefined;
    const job = jobCore({ measured: latestMeasured(measurements), limits: limits.resolved, lifterType: engine.lifterType });
    return { job, limits: limits.limits };
  }, [jobCore, engine.lifterType, measurements, limits]);
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const canWrite = roleAllows(useMeQuery().data?.activeShop?.role, { sheet: ['write'] });
  const {
    chosen: chosenProfiles,
    chosenIds: chosen,
    columns,
    shown,
    analyses,
    names,
    nearLimit,
    owner,
    toggle,
    drafts,
    setDraft,
    mode,
    setMode,
  } = useCompare(jobId, engine, profiles, core);
  const [editingId, setEditingId] = useState<string | null>(null);
  const editing = chosenProfiles.find((p) => p.id === editingId) ?? chosenProfiles[chosenProfiles.length - 1];

  if (profiles.length === 0) {
    return (
      <Screen title="Compare profiles" subtitle={vehicle} back={back} testID="compare-screen">
        <EmptyState title="No profiles on this job yet">
          <Text style={styles.body}>Copy the stock-spec regrind and a candidate from the shop’s profile library onto this job to compare them.</Text>
          <Button label="Open the job to add profiles" variant="secondary" href={`/jobs/${jobId}`} />
        </EmptyState>
      </Screen>
    );
  }

  const plot = (
    <Section title="Lift against crank angle">
      <ChoiceGroup
        label="Show"
        value={mode}
        choices={[
          { value: 'lift', label: 'Lift' },
          { value: 'velocity', label: 'Velocity' },
          { value: 'acceleration', label: 'Acceleration' },
        ]}
        onChange={setMode}
        testID="plot-mode"
      />
      <LiftPlot analyses={analyses} names={names} mode={mode} testID="lift-plot" />
    </Section>
  );
  const table = (
    <Section title="Differences">
      <Text style={styles.note}>Each column after the first shows its change from {names[0] ?? 'the first profile'}.</Text>
      <CompareTable analyses={analyses} names={names} />
    </Section>
  );

  return (
    <Screen title="Compare profiles" subtitle={vehicle} back={back} testID="compare-screen">
      <Section title="Profiles">
        <ProfilePicker profiles={profiles} chosen={chosen} onToggle={toggle} />
        {columns.map((c) => (c.error ? <ErrorNotice key={c.profile.id} error={new Error(`${c.profile.label} cannot be worked out: ${c.error}`)} /> : null))}
      </Section>

      <View style={wide ? styles.columns : styles.stack}>
        <View style={wide ? styles.plotColumn : undefined}>{plot}</View>
        <View style={wide ? styles.tableColumn : undefined}>{table}</View>
      </View>

      <Section title="Fits the core?">
        <Text style={styles.note}>Can each profile be ground from this job’s old cam: the cut, the metal left, and what the cut does to the lifters.</Text>
        <View style={wide ? styles.columns : styles.stack}>
          {shown.map((c, i) => (
            <View key={c.profile.id} style={wide ? styles.half : undefined}>
              <FitsCorePanel feasibility={c.feasibility ?? undefined} missing={core?.job.missing} name={c.profile.label} testID={`fits-core-${i}`} />
            </View>
          ))}
        </View>
      </Section>

      {nearLimit ? <Cautions title="Some checks are close to or past their limits" items={allCautions} testID="compare-cautions" /> : null}

      <View style={wide ? styles.columns : styles.stack}>
        {editing ? (
          <View style={wide ? styles.half : undefined}>
            <TryValues
              key={`${editing.id} ${editing.version}`}
              jobId={jobId}
              profile={editing}
              column={columns.find((c) => c.profile.id === editing.id)}
              choices={chosenProfiles}
              onChoose={setEditingId}
              draft={drafts[editing.id]}
              setDraft={(draft) => setDraft(editing.id, draft)}
              canWrite={canWrite}
            />
          </View>
        ) : null}
        <View style={[wide ? styles.half : undefined, styles.stack]}>
          {owner ? (
            <Section title="For the owner">
              <Text style={styles.headline} testID="owner-headline">
                {owner.headline}
              </Text>
              {owner.points.map((p) => (
                <Text key={p.topic} style={styles.body}>
                  {p.text}
                </Text>
              ))}
            </Section>
          ) : null}
          {shown.map((c, i) => (
            <Section key={c.profile.id} title={`Checks: ${c.profile.label}`}>
              <ResultsSummaryChip results={c.analysis} testID={`status-${i}`} />
              <CheckList checks={c.analysis.checks} skipped={c.analysis.skipped} testID={`checks-${i}`} />
            </Section>
          ))}
        </View>
      </View>
    </Screen>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  plotColumn: { flex: 5, minWidth: 0 },
  tableColumn: { flex: 4, minWidth: 0 },
  half: { flex: 1, minWidth: 0 },
  body: { ...typeScale.body, color: colors.ink },
  headline: { ...typeScale.heading, color: colors.ink },
  note: { ...typeScale.small, color: colors.inkMuted },
});
