import { useState } from 'react';
import { Controller, type FieldPath } from 'react-hook-form';
import { StyleSheet, Text, useWindowDimensions, View } from 'react-native';

import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';
import { useSaveEngineMutation } from '@/hooks/use-engine';
import { engineSchema, lifterTypeLabels, lifterTypes, type EngineRecord, type EngineSpec, type LifterTypeName } from '@/shared/engine';
import { engineDraftFrom, engineFieldPaths, engineNumberList, engineNumberSpecs as specs, type EngineDraft, type EngineNumberKey } from '@/lib/engine-fields';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DraftField, useDraftForm } from '@/components/ui/number-field';
import { DraftFormFrame } from '@/components/ui/draft-form-frame';
import { outcomeOfError, SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { Section } from '@/components/ui/screen';
import { FormField } from '@/components/ui/form-field';

const lifterChoices = lifterTypes.map((value) => ({ value, label: lifterTypeLabels[value] }));

const groups: { title: string; fields: EngineNumberKey[] }[] = [
  { title: 'Bottom end', fields: ['cylinders', 'bore', 'stroke', 'rodLength', 'pistonCc', 'deckClearance'] },
  { title: 'Heads and gasket', fields: ['chamberCc', 'gasketBore', 'gasketThickness', 'valveAngle'] },
  { title: 'Valvetrain', fields: ['rockerRatioIntake', 'rockerRatioExhaust'] },
  { title: 'Valve springs', fields: ['seatLoad', 'rate', 'installedHeight', 'coilBindHeight', 'retainerToSeal'] },
];

type EngineFormProps = {
  jobId: string;
  /** The saved engine the form starts from; null when the job has none yet. */
  record: EngineRecord | null;
  /** Techs see the values but cannot save. */
  readOnly: boolean;
  /** Fetches the latest saved engine (after someone else saved). */
  onReload: () => Promise<EngineRecord | null>;
};

/**
 * The engine on a job, in four groups. Numbers show in the units chosen on
 * the toggle and save in calc's units; a stale save offers the other
 * person's version, and the server's field messages land on their fields.
 */
export function EngineForm({ jobId, record, readOnly, onReload }: EngineFormProps) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const [base, setBase] = useState(record);
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const [reloading, setReloading] = useState(false);
  const save = useSaveEngineMutation(jobId);

  const {
    form,
    units: converter,
    loadError,
  } = useDraftForm<EngineDraft, EngineSpec>({
    specs: engineNumberList,
    schema: engineSchema,
    others: (values) => ({ lifterType: values.lifterType, firingOrder: values.firingOrder }),
    defaultValues: engineDraftFrom(record?.engine),
  });
  const { control, handleSubmit, reset, setError, formState } = form;

  const submit = handleSubmit(async (engine) => {
    setOutcome(null);
    try {
      const saved = await save.mutateAsync({ version: base?.version ?? 0, engine });
      setBase(saved);
      reset(engineDraftFrom(saved.engine));
      setOutcome({ kind: 'saved', message: `Engine saved (version ${saved.version}).` });
    } catch (error) {
      setOutcome(
        outcomeOfError(error, engineFieldPaths, 'engine.', (path, message) =>
          setError(path as FieldPath<EngineDraft>, { type: 'server', message }, { shouldFocus: true }),
        ),
      );
    }
  });

  const reload = async () => {
    setReloading(true);
    try {
      const latest = await onReload();
      setBase(latest);
      reset(engineDraftFrom(latest?.engine));
      setOutcome({ kind: 'saved', message: latest ? `Showing the latest engine (version ${latest.version}).` : 'No engine is saved on this job yet.' });
    } catch (error) {
      setOutcome({ kind: 'error', message: error instanceof Error ? `Could not reload. ${error.message}` : 'Could not reload.' });
    } finally {
      setReloading(false);
    }
  };

  const editable = !readOnly;
  const numberFields = (keys: EngineNumberKey[]) =>
    converter
      ? keys.map((key) => <DraftField key={key} control={control} spec={specs[key]} units={converter} editable={editable} testPrefix="engine" />)
      : null;

  const sections = groups.map((group) => (
    <Section key={group.title} title={group.title}>
      {group.title === 'Valvetrain' ? (
        <Controller
          control={control}
          name="lifterType"
          render={({ field }) =>
            readOnly ? (
              <View style={styles.readOnlyChoice}>
                <Text style={styles.readOnlyLabel}>Lifter type</Text>
                <Text style={styles.readOnlyValue} testID="engine-lifterType">
                  {lifterTypeLabels[field.value]}
                </Text>
              </View>
            ) : (
              <ChoiceGroup<LifterTypeName>
                label="Lifter type"
                value={field.value}
                choices={lifterChoices}
                onChange={field.onChange}
                testID="engine-lifterType"
              />
            )
          }
        />
      ) : null}
      {numberFields(group.fields)}
      {group.title === 'Valvetrain' ? (
        <FormField
          control={control}
          name="firingOrder"
          label="Firing order"
          hint="Optional. Cylinder numbers joined by dashes, e.g. 1-8-4-3-6-5-7-2"
          editable={editable}
          autoCorrect={false}
          testID="engine-firingOrder"
        />
      ) : null}
    </Section>
  ));

  return (
    <DraftFormFrame
      unitNote="Saved in inches, cc and pounds whichever units you type in."
      loadError={loadError}
      ready={Boolean(converter)}
      rootError={formState.errors.root?.message}
      notice={<SaveNotice outcome={outcome} onReload={reload} reloading={reloading} testID="engine-notice" />}
      readOnlyNote={readOnly ? 'Your role in this shop can read the engine; a builder saves changes.' : null}
      actions={
        <>
          <Button label={save.isPending ? 'Saving…' : 'Save engine'} onPress={submit} busy={save.isPending} disabled={!converter} testID="engine-save" />
          {formState.isDirty ? (
            <>
              <Button label="Discard changes" variant="quiet" onPress={() => reset()} testID="engine-discard" />
              <Text style={styles.note} testID="engine-dirty">
                Unsaved changes
              </Text>
            </>
          ) : null}
        </>
      }
    >
      <View style={wide ? styles.columns : styles.stack}>
        <View style={[styles.stack, wide && styles.column]}>{sections.slice(0, 2)}</View>
        <View style={[styles.stack, wide && styles.column]}>{sections.slice(2)}</View>
      </View>
    </DraftFormFrame>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.lg, alignItems: 'flex-start' },
  column: { flex: 1, minWidth: 0 },
  note: { ...typeScale.small, color: colors.inkMuted },
  readOnlyChoice: { gap: space.xs },
  readOnlyLabel: { ...typeScale.label, color: colors.ink },
  readOnlyValue: { ...typeScale.body, color: colors.ink },
});
