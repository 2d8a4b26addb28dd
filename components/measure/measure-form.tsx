import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { Controller, useFieldArray, useFormState, useWatch, type Control, type FieldPath, type FieldValues } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useCreateMeasurementMutation, useSaveMeasurementMutation } from '@/hooks/use-measurements';
import type { Measurement, MeasurementCreate } from '@/shared/measurements';
import {
  knownPaths,
  measureDraftFrom,
  measureRules,
  rowDraft,
  specOf,
  type MeasureConfig,
  type MeasureDraft,
  type MeasureField,
  type MeasureGroup,
  type MeasureText,
} from '@/lib/measure-fields';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { DraftField, useDraftForm } from '@/components/ui/number-field';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { outcomeOfError, SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { TextField } from '@/components/ui/text-field';

type MeasureFormProps = {
  jobId: string;
  config: MeasureConfig;
  current: Measurement | null;
  canWrite: boolean;
  testID: string;
  /** Live read-outs computed from what is typed (e.g. true TDC and ICL). */
  aside?: (draft: MeasureDraft) => ReactNode;
};

/**
 * One kind of measurement as a form: a choice, single values and rows of
 * readings, numbers in the units on the toggle. Checks with the same schema
 * the server uses, then saves in inches (first save creates the record; later
 * saves replace it, guarded by version). A blank optional reading stays "not measured".
 */
export function MeasureForm({ jobId, config, current, canWrite, testID, aside }: MeasureFormProps) {
  const initial = useMemo(() => measureDraftFrom(config, current?.data), [config, current]);
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const create = useCreateMeasurementMutation(jobId);
  const save = useSaveMeasurementMutation(jobId);
  const { form, units, loadError } = useDraftForm<MeasureDraft, Record<string, unknown>>({ ...measureRules(config), defaultValues: initial });
  const { control, handleSubmit, reset, setError } = form;
  const draft = useWatch({ control }) as MeasureDraft;

  // A newer record from the server (after a save or a reload) replaces the form.
  useEffect(() => {
    reset(initial);
  }, [initial, reset]);

  const submit = handleSubmit(
    async (data) => {
      setOutcome(null);
      try {
        if (current) await save.mutateAsync({ id: current.id, version: current.version, data });
        else await create.mutateAsync({ kind: config.kind, note: '', data } as MeasurementCreate);
        setOutcome({ kind: 'saved', message: 'Saved. Run the fit checks to see what it means for the cam.' });
      } catch (error) {
        setOutcome(
          outcomeOfError(error, knownPaths(config, form.getValues()), 'data.', (path, message) =>
            setError(path as FieldPath<MeasureDraft>, { type: 'server', message }, { shouldFocus: true }),
          ),
        );
      }
    },
    () => setOutcome({ kind: 'error', message: 'Not saved. Fix the fields marked in red, then save again.' }),
  );

  if (loadError) return <ErrorNotice error={loadError} />;
  if (!units) return <Pending label="Loading unit conversion…" />;
  const cell = (path: string, field: MeasureField) =>
    field.text ? (
      <TextCell key={field.key} control={control} path={path} field={field} editable={canWrite} testID={`${testID}-${path.replace(/\./g, '-')}`} />
    ) : (
      <View key={field.key} style={styles.cell}>
        <DraftField control={control} spec={specOf(field, path)} units={units} editable={canWrite} testPrefix={testID} />
      </View>
    );

  return (
    <View style={styles.form} testID={testID}>
      {config.choice ? (
        <Controller
          control={control}
          name={config.choice.key}
          render={({ field }) => (
            <ChoiceGroup
              label={config.choice?.label ?? ''}
              value={String(field.value ?? '')}
              choices={config.choice?.choices ?? []}
              onChange={canWrite ? field.onChange : () => undefined}
              testID={`${testID}-${config.choice?.key}`}
            />
          )}
        />
      ) : null}
      {config.scalars?.length ? <View style={styles.cells}>{config.scalars.map((f) => cell(f.key, f))}</View> : null}
      {(config.groups ?? []).map((g) => (
        <GroupRows key={g.key} control={control} group={g} editable={canWrite} cell={cell} testID={`${testID}-${g.key}`} />
      ))}
      {aside ? aside(draft) : null}
      {current ? (
        <Text style={styles.meta}>
          Last saved {formatDateTime(current.updatedAt)} (version {current.version})
        </Text>
      ) : (
        <Text style={styles.meta}>Not recorded on this job yet.</Text>
      )}
      {canWrite ? (
        <Button label="Save" onPress={submit} busy={create.isPending || save.isPending} testID={`${testID}-save`} />
      ) : (
        <Text style={styles.meta}>Your role can read these readings but not change them.</Text>
      )}
      <SaveNotice
        outcome={outcome}
        onReload={() => {
          reset(initial);
          setOutcome(null);
        }}
        reloading={false}
        testID={testID}
      />
    </View>
  );
}

function TextCell({
  control,
  path,
  field,
  editable,
  testID,
}: {
  control: Control<MeasureDraft>;
  path: string;
  field: MeasureText;
  editable: boolean;
  testID: string;
}) {
  return (
    <View style={styles.cell}>
      <Controller
        control={control as unknown as Control<FieldValues>}
        name={path}
        render={({ field: f, fieldState }) => (
          <TextField
            label={field.label}
            hint={field.hint}
            value={f.value == null ? '' : String(f.value)}
            onChangeText={f.onChange}
            onBlur={f.onBlur}
            editable={editable}
            error={fieldState.error?.message}
            testID={testID}
          />
        )}
      />
    </View>
  );
}

function GroupRows({
  control,
  group,
  editable,
  cell,
  testID,
}: {
  control: Control<MeasureDraft, unknown, Record<string, unknown>>;
  group: MeasureGroup;
  editable: boolean;
  cell: (path: string, field: MeasureField) => ReactNode;
  testID: string;
}) {
  const { fields, append, remove } = useFieldArray({ control: control as unknown as Control<FieldValues>, name: group.key });
  const { errors } = useFormState({ control, name: group.key });
  // "Add at least one reading" and the like sit on the list itself.
  const error = errors[group.key] as { message?: unknown; root?: { message?: unknown } } | undefined;
  const message = typeof error?.message === 'string' ? error.message : typeof error?.root?.message === 'string' ? error.root.message : undefined;
  return (
    <View style={styles.group}>
      <Text role="heading" aria-level={3} style={styles.groupTitle}>
        {group.title}
      </Text>
      {fields.map((row, i) => (
        <View key={row.id} style={styles.row} testID={`${testID}-row-${i}`}>
          <View style={styles.rowHead}>
            <Text style={styles.rowName}>
              {group.rowName} {i + 1}
            </Text>
            {editable ? (
              <Button
                label="Remove"
                variant="quiet"
                onPress={() => remove(i)}
                aria-label={`Remove ${group.rowName.toLowerCase()} ${i + 1} from ${group.title.toLowerCase()}`}
                testID={`${testID}-remove-${i}`}
              />
            ) : null}
          </View>
          <View style={styles.cells}>{group.columns.map((c) => cell(`${group.key}.${i}.${c.key}`, c))}</View>
        </View>
      ))}
      {message ? (
        <Text role="alert" style={styles.error} testID={`${testID}-error`}>
          {message}
        </Text>
      ) : null}
      {editable ? (
        <Button
          label={`Add ${group.rowName.toLowerCase()}`}
          variant="secondary"
          onPress={() => append(rowDraft(group.columns, {}))}
          aria-label={`Add ${group.rowName.toLowerCase()} to ${group.title.toLowerCase()}`}
          testID={`${testID}-add`}
        />
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  cells: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 150, minWidth: 130 },
  group: { gap: space.md },
  groupTitle: { ...typeScale.bodyStrong, color: colors.ink },
  row: {
    gap: space.sm,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.paper,
  },
  rowHead: { flexDirection: 'row', alignItems: 'center', justifyContent: 'space-between', gap: space.sm },
  rowName: { fontFamily: fonts.semibold, fontSize: 15, color: colors.inkMuted },
  error: { ...typeScale.small, color: colors.fail, fontFamily: fonts.medium },
  meta: { ...typeScale.small, color: colors.inkMuted },
});
