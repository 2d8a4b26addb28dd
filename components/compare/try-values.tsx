import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { ProfileDraftEditor } from '@/components/compare/profile-draft-editor';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { ErrorNotice } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { colors, space, type as typeScale } from '@/constants/theme';
import { useSaveProfileMutation } from '@/hooks/use-profiles';
import { useCreateSheetMutation, useJobSheetsQuery, useSaveSheetMutation } from '@/hooks/use-sheets';
import type { CompareColumn } from '@/lib/compare-analysis';
import { sameSpec, type ProfileDraft } from '@/lib/profile-draft';
import type { Profile } from '@/shared/profile';

/** Type values into one chosen profile, see them worked out at once, then save them to the spec sheet or the profile. */
export function TryValues({
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
  column: CompareColumn | undefined;
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
  note: { ...typeScale.small, color: colors.inkMuted },
  saved: { ...typeScale.bodyStrong, color: colors.pass },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
