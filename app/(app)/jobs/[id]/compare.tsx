import { useAtom } from 'jotai';
import { useLocalSearchParams } from 'expo-router';
import { useMemo, useState } from 'react';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import type { ProfileAnalysis } from '@/calc/analysis';
import { compareProfilesForOwner } from '@/calc/compare';
import { isCalcInputError } from '@/calc/errors';
import { Button } from '@/components/ui/button';
import { Cautions } from '@/components/compare/cautions';
import { CheckList, CheckStatusChip } from '@/components/sheet/check-list';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { CompareTable } from '@/components/compare/compare-table';
import { LiftPlot } from '@/components/compare/lift-plot';
import { ProfileDraftEditor } from '@/components/compare/profile-draft-editor';
import { ProfilePicker } from '@/components/compare/profile-picker';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section, type BackLink } from '@/components/ui/screen';
import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { compareSelectionAtom, plotModeAtom, profileDraftsAtom } from '@/state/compare';
import { useEngineQuery } from '@/hooks/use-engine';
import { useJobQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { useJobProfilesQuery, useSaveProfileMutation } from '@/hooks/use-profiles';
import { useCreateSheetMutation, useJobSheetsQuery, useSaveSheetMutation } from '@/hooks/use-sheets';
import { analyzeRecords } from '@/shared/analysis';
import { allCautions } from '@/shared/cautions';
import type { EngineSpec } from '@/shared/engine';
import type { Profile, ProfileSpec } from '@/shared/profile';
import { applyDraft, sameSpec, type ProfileDraft } from '@/lib/profile-draft';
import { roleAllows } from '@/shared/roles';

type Column = { profile: Profile; spec: ProfileSpec; analysis: ProfileAnalysis | null; error: string | null; fieldErrors: Partial<Record<string, string>> };

function analyze(engine: EngineSpec, profile: Profile, draft: ProfileDraft | undefined): Column {
  const applied = draft ? applyDraft(profile.spec, draft) : ({ ok: true, spec: profile.spec } as const);
  const spec = applied.ok ? applied.spec : profile.spec;
  const fieldErrors = applied.ok ? {} : applied.errors;
  try {
    return { profile, spec, analysis: analyzeRecords(engine, spec), error: null, fieldErrors };
  } catch (error) {
    const message = isCalcInputError(error) ? `${error.field}: ${error.message}` : error instanceof Error ? error.message : String(error);
    return { profile, spec, analysis: null, error: message, fieldErrors };
  }
}

export default function Compare() {
  const { id: jobId } = useLocalSearchParams<{ id: string }>();
  const job = useJobQuery(jobId);
  const engine = useEngineQuery(jobId);
  const profiles = useJobProfilesQuery(jobId);
  const back: BackLink = { href: { pathname: '/jobs/[id]', params: { id: jobId } }, label: 'Back to the job' };

  if (job.isPending || engine.isPending || profiles.isPending) return <Pending label="Loading the engine and profiles…" />;
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
  return <CompareView jobId={jobId} vehicle={job.data?.vehicle ?? ''} engine={engine.data.engine} profiles={profiles.data ?? []} back={back} />;
}

function CompareView({
  jobId,
  vehicle,
  engine,
  profiles,
  back,
}: {
  jobId: string;
  vehicle: string;
  engine: EngineSpec;
  profiles: Profile[];
  back: BackLink;
}) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const canWrite = roleAllows(useMeQuery().data?.activeShop?.role, { sheet: ['write'] });
  const [selection, setSelection] = useAtom(compareSelectionAtom);
  const [drafts, setDrafts] = useAtom(profileDraftsAtom);
  const [mode, setMode] = useAtom(plotModeAtom);

  const chosenProfiles = useMemo(() => {
    const picked = selection[jobId] ?? profiles.slice(0, 2).map((p) => p.id);
    return picked.map((id) => profiles.find((p) => p.id === id)).filter((p): p is Profile => Boolean(p));
  }, [selection, jobId, profiles]);
  const chosen = chosenProfiles.map((p) => p.id);
  const [editingId, setEditingId] = useState<string | null>(null);
  const editing = chosenProfiles.find((p) => p.id === editingId) ?? chosenProfiles[chosenProfiles.length - 1];

  const columns = useMemo(() => chosenProfiles.map((p) => analyze(engine, p, drafts[p.id])), [engine, chosenProfiles, drafts]);
  const shown = columns.filter((c): c is Column & { analysis: ProfileAnalysis } => c.analysis !== null);
  const analyses = shown.map((c) => c.analysis);
  const names = shown.map((c) => c.profile.label);
  const nearLimit = analyses.some((a) => a.status !== 'pass');
  const owner =
    analyses.length >= 2 && analyses[0] && analyses[1]
      ? compareProfilesForOwner({ current: analyses[0], candidate: analyses[1], currentName: names[0], candidateName: names[1] })
      : null;

  const toggle = (id: string) =>
    setSelection((s) => {
      const current = s[jobId] ?? chosen;
      const next = current.includes(id) ? current.filter((x) => x !== id) : [...current, id].slice(-3);
      return { ...s, [jobId]: next };
    });

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
        {columns.map((c) =>
          c.error ? <ErrorNotice key={c.profile.id} error={new Error(`${c.profile.label} cannot be worked out: ${c.error}`)} /> : null,
        )}
      </Section>

      <View style={wide ? styles.columns : styles.stack}>
        <View style={wide ? styles.plotColumn : undefined}>{plot}</View>
        <View style={wide ? styles.tableColumn : undefined}>{table}</View>
      </View>

      {nearLimit ? <Cautions title="Some checks are close to or past their limits" items={allCautions} testID="compare-cautions" /> : null}

      <View style={wide ? styles.columns : styles.stack}>
        {editing ? (
          <View style={wide ? styles.half : undefined}>
            <EditPanel
              jobId={jobId}
              profile={editing}
              column={columns.find((c) => c.profile.id === editing.id)}
              choices={chosenProfiles}
              onChoose={setEditingId}
              draft={drafts[editing.id]}
              setDraft={(draft) => setDrafts((d) => ({ ...d, [editing.id]: draft }))}
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
              <CheckStatusChip status={c.analysis.status} testID={`status-${i}`} />
              <CheckList checks={c.analysis.checks} skipped={c.analysis.skipped} testID={`checks-${i}`} />
            </Section>
          ))}
        </View>
      </View>
    </Screen>
  );
}

function EditPanel({
  jobId,
  profile,
  column,
  choices,
  onChoose,
  draft,
  setDraft,
  canWrite,
}: {
  jobId: string;
  profile: Profile;
  column: Column | undefined;
  choices: Profile[];
  onChoose: (id: string) => void;
  draft: ProfileDraft | undefined;
  setDraft: (draft: ProfileDraft) => void;
  canWrite: boolean;
}) {
  const sheets = useJobSheetsQuery(jobId);
  // The sheet that holds this profile; with none, the most recently changed sheet.
  const sheet = sheets.data?.find((s) => s.current.label === profile.label) ?? sheets.data?.[0];
  const saveSheet = useSaveSheetMutation(sheet?.id ?? '');
  const createSheet = useCreateSheetMutation(jobId);
  const saveProfile = useSaveProfileMutation(profile.id);
  const [saved, setSaved] = useState<string | null>(null);
  const [saveError, setSaveError] = useState<unknown>(null);
  const dirty = Boolean(draft && Object.keys(draft).length);
  const valid = column !== undefined && Object.keys(column.fieldErrors).length === 0 && column.analysis !== null;
  const busy = saveSheet.isPending || createSheet.isPending || saveProfile.isPending;
  const sameAsSheet = Boolean(sheet && column && sheet.current.label === profile.label && sameSpec(sheet.current.spec, column.spec));

  const run = async (action: () => Promise<string>) => {
    setSaved(null);
    setSaveError(null);
    try {
      setSaved(await action());
    } catch (error) {
      setSaveError(error);
    }
  };

  const toSheet = () =>
    run(async () => {
      if (!column) throw new Error('Nothing to save');
      if (sheet) {
        const next = await saveSheet.mutateAsync({ version: sheet.version, spec: column.spec, label: profile.label, newRevision: true });
        setDraft({});
        return `Saved as revision ${next.current.number} of “${next.title}”.`;
      }
      const created = await createSheet.mutateAsync({ title: `Spec sheet: ${profile.label}`, profileId: profile.id, note: '' });
      return `Started “${created.title}”, revision ${created.current.number}.`;
    });

  const toProfile = () =>
    run(async () => {
      if (!column) throw new Error('Nothing to save');
      await saveProfile.mutateAsync({ version: profile.version, spec: column.spec });
      setDraft({});
      return `Saved ${profile.label}.`;
    });

  return (
    <Section title="Try values">
      {choices.length > 1 ? (
        <ChoiceGroup
          label="Profile to edit"
          value={profile.id}
          choices={choices.map((p) => ({ value: p.id, label: p.label }))}
          onChange={onChoose}
          testID="edit-choice"
        />
      ) : null}
      <Text style={styles.note}>Changes recompute at once on this device. Nothing is saved until you choose below.</Text>
      {sameAsSheet ? <Text style={styles.note}>These values match the sheet’s current revision.</Text> : null}
      <ProfileDraftEditor
        spec={profile.spec}
        draft={draft ?? {}}
        errors={column?.fieldErrors ?? {}}
        onChange={(path, text) => setDraft({ ...draft, [path]: text })}
        testID="draft"
      />
      {saveError ? <ErrorNotice error={saveError} /> : null}
      {saved ? (
        <Text style={styles.saved} role="status" testID="save-result">
          {saved}
        </Text>
      ) : null}
      {canWrite ? (
        <View style={styles.actions}>
          <Button
            label={sheet ? `Save to sheet as revision ${sheet.current.number + 1}` : 'Start a spec sheet with these values'}
            onPress={toSheet}
            busy={saveSheet.isPending || createSheet.isPending}
            disabled={!valid || busy || (!sheet && dirty) || sameAsSheet}
            testID="save-to-sheet"
          />
          <Button label="Save profile" variant="secondary" onPress={toProfile} busy={saveProfile.isPending} disabled={!valid || !dirty || busy} testID="save-profile" />
          <Button label="Discard changes" variant="quiet" onPress={() => setDraft({})} disabled={!dirty || busy} testID="discard-draft" />
        </View>
      ) : (
        <Text style={styles.note}>Only a builder can save profile values.</Text>
      )}
      {sheet ? (
        <Button label={`Open “${sheet.title}”`} variant="quiet" href={`/jobs/${jobId}/sheets/${sheet.id}`} testID="open-sheet" />
      ) : null}
    </Section>
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
  saved: { ...typeScale.bodyStrong, color: colors.pass },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
