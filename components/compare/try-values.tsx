import { useEffect, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DraftField, useDraftForm } from '@/components/ui/number-field';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { UnitToggle } from '@/components/ui/unit-toggle';
import { colors, space, type as typeScale } from '@/constants/theme';
import { useSaveProfileMutation } from '@/hooks/use-profiles';
import { useCreateSheetMutation, useJobSheetsQuery, useSaveSheetMutation } from '@/hooks/use-sheets';
import type { CompareColumn } from '@/lib/compare-analysis';
import { saveToSheetLabel, sheetOfProfile } from '@/lib/option-sheet';
import { sameSpec, triedRecord, tryDraftFrom, tryValueSpecs, tryValuesSchema, type TryDraft } from '@/lib/try-values';
import type { Profile, ProfileSpec } from '@/shared/profile';

/**
 * Type values into one chosen profile, see them worked out at once, then save them to the spec sheet or the profile.
 * Lengths are typed in the unit on the toggle; what is tried and saved is in inches. Key it by the profile's id and
 * version, so a newer save starts the form again.
 */
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
  draft: TryDraft | undefined;
  setDraft: (draft: TryDraft | undefined) => void;
  canWrite: boolean;
}) {
  const sheets = useJobSheetsQuery(jobId);
  // This profile's own sheet (each option has one), by id; with none yet, saving starts it.
  const sheet = sheetOfProfile(sheets.data, profile.id);
  const saveSheet = useSaveSheetMutation(sheet?.id ?? '');
  const createSheet = useCreateSheetMutation(jobId);
  const saveProfile = useSaveProfileMutation(profile.id);
  const [saved, setSaved] = useState<string | null>(null);
  const [saveError, setSaveError] = useState<unknown>(null);
  const { form, units, loadError } = useDraftForm<TryDraft, { spec: ProfileSpec }>({
    specs: tryValueSpecs,
    schema: tryValuesSchema,
    others: () => triedRecord(profile.spec),
    defaultValues: draft ?? tryDraftFrom(profile.spec),
    mode: 'onChange',
  });
  // Every change goes to the compare state at once, which works the analysis out again on this device.
  const { watch, reset, handleSubmit, control } = form;
  useEffect(() => {
    const watching = watch((values) => setDraft(structuredClone(values) as TryDraft));
    return () => watching.unsubscribe();
  }, [watch, setDraft]);
  const discard = () => {
    setDraft(undefined);
    reset(tryDraftFrom(profile.spec));
  };
  const dirty = Boolean(draft && column && (Object.keys(column.fieldErrors).length > 0 || !sameSpec(column.spec, profile.spec)));
  const valid = column !== undefined && Object.keys(column.fieldErrors).length === 0 && column.analysis !== null;
  const busy = saveSheet.isPending || createSheet.isPending || saveProfile.isPending;
  const sameAsSheet = Boolean(sheet && column && sameSpec(sheet.current.spec, column.spec));

  const run = async (action: () => Promise<string>) => {
    setSaved(null);
    setSaveError(null);
    try {
      setSaved(await action());
    } catch (error) {
      setSaveError(error);
    }
  };

  const toSheet = handleSubmit(({ spec }) =>
    run(async () => {
      if (sheet) {
        const next = await saveSheet.mutateAsync({ version: sheet.version, spec, label: profile.label, newRevision: true });
        discard();
        return `Saved as revision ${next.current.number} of “${next.title}”.`;
      }
      const created = await createSheet.mutateAsync({ title: `Spec sheet: ${profile.label}`, profileId: profile.id, note: '', spec });
      discard();
      return `Started “${created.title}”, revision ${created.current.number}.`;
    }),
  );

  const toProfile = handleSubmit(({ spec }) =>
    run(async () => {
      await saveProfile.mutateAsync({ version: profile.version, spec });
      setDraft(undefined);
      return `Saved ${profile.label}.`;
    }),
  );

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
      <Text style={styles.note} testID="sheet-target">
        {sheet
          ? `Saving writes “${sheet.title}”, the sheet of ${profile.label}, and no other option’s sheet.`
          : `${profile.label} has no spec sheet yet: saving starts its own.`}
      </Text>
      {sameAsSheet ? <Text style={styles.note}>These values match the sheet’s current revision.</Text> : null}
      <UnitToggle volume={false} />
      {loadError ? (
        <ErrorNotice error={loadError} />
      ) : !units ? (
        <Pending label="Loading unit conversion…" />
      ) : (
        <View style={styles.grid} testID="draft">
          {tryValueSpecs.map((spec) => (
            <View key={spec.path} style={styles.cell}>
              <DraftField control={control} spec={spec} units={units} testPrefix="draft" />
            </View>
          ))}
        </View>
      )}
      {saveError ? <ErrorNotice error={saveError} /> : null}
      {saved ? (
        <Text style={styles.saved} role="status" testID="save-result">
          {saved}
        </Text>
      ) : null}
      {canWrite ? (
        <View style={styles.actions}>
          <Button
            label={saveToSheetLabel(profile.label, sheet)}
            onPress={toSheet}
            busy={saveSheet.isPending || createSheet.isPending}
            disabled={!valid || busy || sameAsSheet || !sheets.data}
            testID="save-to-sheet"
          />
          <Button
            label="Save profile"
            variant="secondary"
            onPress={toProfile}
            busy={saveProfile.isPending}
            disabled={!valid || !dirty || busy}
            testID="save-profile"
          />
          <Button label="Discard changes" variant="quiet" onPress={discard} disabled={!dirty || busy} testID="discard-draft" />
        </View>
      ) : (
        <Text style={styles.note}>Only a builder can save profile values.</Text>
      )}
      {sheet ? <Button label={`Open “${sheet.title}”`} variant="quiet" href={`/jobs/${jobId}/sheets/${sheet.id}`} testID="open-sheet" /> : null}
    </Section>
  );
}

const styles = StyleSheet.create({
  note: { ...typeScale.small, color: colors.inkMuted },
  saved: { ...typeScale.bodyStrong, color: colors.pass },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 160 },
});
