import { useState } from 'react';
import { Controller, type Control, type FieldPath } from 'react-hook-form';
import { StyleSheet, useWindowDimensions, View } from 'react-native';

import { breakpoints, space } from '@/constants/theme';
import type { UnitConverter } from '@/state/units';
import { draftFromValue, formatNumber } from '@/lib/number-draft';
import { profileCreateSchema, type Profile, type ProfileCreate } from '@/shared/profile';
import {
  advertisedHeightPicks,
  lobeKeys,
  profileDraftFrom,
  profileFieldPaths,
  profileNumberList,
  profileNumberSpecs as specs,
  sideLabels,
  sides,
  type ProfileDraft,
  type Side,
} from '@/lib/profile-fields';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DraftField, useDraftForm } from '@/components/ui/number-field';
import { DraftFormFrame } from '@/components/ui/draft-form-frame';
import { outcomeOfError, SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { Section } from '@/components/ui/screen';
import { FormField } from '@/components/ui/form-field';

type ProfileValues = { label: string; coreNotes: string; spec: ProfileCreate['spec'] };

type ProfileFormProps = {
  /** The saved profile; null when creating one. */
  profile: Profile | null;
  readOnly: boolean;
  submitLabel: string;
  busy: boolean;
  /** Saves the checked values (create or patch) and returns the saved profile; throws ApiError on failure. */
  onSubmit: (values: ProfileValues, version: number) => Promise<Profile>;
  /** Fetches the latest saved profile (after someone else saved). */
  onReload?: () => Promise<Profile>;
};

/**
 * A cam profile: its name and notes, the intake and exhaust lobes side by
 * side on a wide screen, and the timing it is ground and installed at.
 */
export function ProfileForm({ profile, readOnly, submitLabel, busy, onSubmit, onReload }: ProfileFormProps) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const [version, setVersion] = useState(profile?.version ?? 0);
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const [reloading, setReloading] = useState(false);

  const {
    form,
    units: converter,
    loadError,
  } = useDraftForm<ProfileDraft, ProfileValues>({
    specs: profileNumberList,
    schema: profileCreateSchema,
    others: (values) => ({ label: values.label, coreNotes: values.coreNotes }),
    defaultValues: profileDraftFrom(profile),
  });
  const { control, handleSubmit, reset, setError, formState } = form;

  const submit = handleSubmit(async (values) => {
    setOutcome(null);
    try {
      const saved = await onSubmit(values, version);
      setVersion(saved.version);
      reset(profileDraftFrom(saved));
      setOutcome({ kind: 'saved', message: `Profile saved (version ${saved.version}).` });
    } catch (error) {
      setOutcome(
        outcomeOfError(error, profileFieldPaths, '', (path, message) =>
          setError(path as FieldPath<ProfileDraft>, { type: 'server', message }, { shouldFocus: true }),
        ),
      );
    }
  });

  const reload = async () => {
    if (!onReload) return;
    setReloading(true);
    try {
      const latest = await onReload();
      setVersion(latest.version);
      reset(profileDraftFrom(latest));
      setOutcome({ kind: 'saved', message: `Showing the latest profile (version ${latest.version}).` });
    } catch (error) {
      setOutcome({ kind: 'error', message: error instanceof Error ? `Could not reload. ${error.message}` : 'Could not reload.' });
    } finally {
      setReloading(false);
    }
  };

  const editable = !readOnly;

  return (
    <DraftFormFrame
      head={
        <>
          <Section title="Profile">
            <FormField
              control={control}
              name="label"
              label="Name"
              hint="What the shop calls it, e.g. stock-spec regrind or towing"
              editable={editable}
              testID="profile-label"
            />
            <FormField
              control={control}
              name="coreNotes"
              label="Core notes"
              hint="The core it is ground on, its condition, anything the grinder said"
              editable={editable}
              multiline
              testID="profile-coreNotes"
            />
          </Section>
        </>
      }
      unitNote="Durations are crank degrees. Lengths save in inches whichever unit you type in."
      volume={false}
      loadError={loadError}
      ready={Boolean(converter)}
      rootError={formState.errors.root?.message}
      notice={<SaveNotice outcome={outcome} onReload={reload} reloading={reloading} testID="profile-notice" />}
      readOnlyNote={readOnly ? 'Your role in this shop can read profiles; a builder writes them.' : null}
      actions={
        <>
          <Button label={busy ? 'Saving…' : submitLabel} onPress={submit} busy={busy} disabled={!converter} testID="profile-save" />
          {formState.isDirty && profile ? <Button label="Discard changes" variant="quiet" onPress={() => reset()} testID="profile-discard" /> : null}
        </>
      }
    >
      {converter ? (
        <>
          <View style={wide ? styles.columns : styles.stack}>
            {sides.map((side) => (
              <View key={side} style={wide ? styles.column : undefined}>
                <LobeSection side={side} control={control} units={converter} editable={editable} />
              </View>
            ))}
          </View>
          <Section title="Timing and base circle">
            <View style={wide ? styles.columns : styles.stack}>
              {[specs.lsa, specs.icl, specs.baseCircle].map((spec) => (
                <View key={spec.path} style={wide ? styles.column : undefined}>
                  <DraftField control={control} spec={spec} units={converter} editable={editable} testPrefix="profile" />
                </View>
              ))}
            </View>
          </Section>
        </>
      ) : null}
    </DraftFormFrame>
  );
}

type LobeSectionProps = { side: Side; control: Control<ProfileDraft, unknown, ProfileValues>; units: UnitConverter; editable: boolean };

function LobeSection({ side, control, units, editable }: LobeSectionProps) {
  const lobe = specs[side];
  return (
    <Section title={`${sideLabels[side]} lobe`}>
      {lobeKeys.map((key) => (
        <View key={key} style={styles.field}>
          <DraftField control={control} spec={lobe[key]} units={units} editable={editable} testPrefix="profile" />
          {key === 'advertisedHeight' && editable ? (
            <Controller
              control={control}
              name={`spec.${side}.advertisedHeight`}
              render={({ field }) => {
                const current = advertisedHeightPicks.find((pick) => field.value?.value === pick);
                return (
                  <ChoiceGroup
                    label={`Common ${side} checking heights`}
                    value={current === undefined ? '' : String(current)}
                    choices={advertisedHeightPicks.map((pick) => ({ value: String(pick), label: `${formatNumber(pick, 3)} in` }))}
                    onChange={(pick) => field.onChange(draftFromValue(lobe.advertisedHeight, Number(pick)))}
                    testID={`profile-${side}-advertisedHeight-pick`}
                  />
                );
              }}
            />
          ) : null}
        </View>
      ))}
    </Section>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  column: { flex: 1, minWidth: 0 },
  field: { gap: space.sm },
});
