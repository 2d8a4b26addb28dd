import { useEffect, useMemo, useState, type ReactNode } from 'react';
import { Controller, useFieldArray, useForm, useWatch, type Control, type FieldValues } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useCreateMeasurementMutation, useSaveMeasurementMutation } from '@/hooks/use-measurements';
import type { Measurement, MeasurementCreate, MeasurementKind } from '@/shared/measurements';
import { measurementDataSchemas } from '@/shared/measurements';
import { parseNumberText } from '@/lib/number-draft';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { TextField } from '@/components/ui/text-field';

/** One input: a number in a fixed unit, or a short text. */
export type MeasureField = {
  key: string;
  label: string;
  unit?: string;
  hint?: string;
  /** A text field (e.g. which valve) rather than a number. */
  text?: boolean;
  /** Blank saves as null (`'null'`) or leaves the schema's default (`'default'`). */
  blank?: 'null' | 'default';
};

/** A list of readings with the same columns, rows added and removed by the tech. */
export type MeasureGroup = { key: string; title: string; rowName: string; columns: MeasureField[] };

/** A pick between a few values. */
export type MeasureChoice = { key: string; label: string; choices: readonly { value: string; label: string }[] };

export type MeasureConfig = {
  kind: Exclude<MeasurementKind, 'lobes'>;
  choice?: MeasureChoice;
  scalars?: MeasureField[];
  groups?: MeasureGroup[];
  /** What to start from when nothing is recorded yet. */
  blank: Draft;
};

type Row = Record<string, string>;
/** What the form holds: text as typed. */
export type Draft = { choice: string; scalars: Row; rows: Record<string, Row[]> };

type MeasureFormProps = {
  jobId: string;
  config: MeasureConfig;
  current: Measurement | null;
  canWrite: boolean;
  testID: string;
  /** Live read-outs computed from what is typed (e.g. true TDC and ICL). */
  aside?: (draft: Draft) => ReactNode;
};

function toText(value: unknown): string {
  return value === null || value === undefined ? '' : String(value);
}

/** A saved record as text for the form. */
function draftFrom(config: MeasureConfig, data: unknown): Draft {
  if (typeof data !== 'object' || data === null) return config.blank;
  const record = data as Record<string, unknown>;
  const scalars: Row = {};
  for (const f of config.scalars ?? []) scalars[f.key] = toText(record[f.key]);
  const rows: Record<string, Row[]> = {};
  for (const g of config.groups ?? []) {
    const list = Array.isArray(record[g.key]) ? (record[g.key] as Record<string, unknown>[]) : [];
    rows[g.key] = list.map((item) => Object.fromEntries(g.columns.map((c) => [c.key, toText(item[c.key])])));
  }
  return { choice: config.choice ? toText(record[config.choice.key]) : '', scalars, rows };
}

function valueOf(field: MeasureField, text: string): unknown {
  if (field.text) return text;
  const n = parseNumberText(text ?? '');
  if (n === null) return field.blank === 'null' ? null : field.blank === 'default' ? undefined : null;
  return n;
}

/** The form's text as the record the shared schema takes. */
export function dataFrom(config: MeasureConfig, draft: Draft): Record<string, unknown> {
  const data: Record<string, unknown> = {};
  if (config.choice) data[config.choice.key] = draft.choice;
  for (const f of config.scalars ?? []) {
    const v = valueOf(f, draft.scalars[f.key] ?? '');
    if (v !== undefined) data[f.key] = v;
  }
  for (const g of config.groups ?? []) {
    data[g.key] = (draft.rows[g.key] ?? []).map((row) => {
      const out: Record<string, unknown> = {};
      for (const c of g.columns) {
        const v = valueOf(c, row[c.key] ?? '');
        if (v !== undefined) out[c.key] = v;
      }
      return out;
    });
  }
  if (config.kind === 'degree') data.table ??= [];
  return data;
}

/** Maps a schema or server path (`intake.0.clearance`) onto the form's field name. */
function formPath(config: MeasureConfig, path: string): string {
  const clean = path.replace(/^data\./, '');
  const head = clean.split('.')[0] ?? '';
  if (config.choice?.key === head) return 'choice';
  if ((config.groups ?? []).some((g) => g.key === head)) return clean.includes('.') ? `rows.${clean}` : `group.${head}`;
  return `scalars.${clean}`;
}

/**
 * One kind of measurement as a form: a choice, single values and rows of
 * readings. Checks with the same schema the server uses, then saves (first
 * save creates the record; later saves replace it, guarded by version).
 */
export function MeasureForm({ jobId, config, current, canWrite, testID, aside }: MeasureFormProps) {
  const initial = useMemo(() => (current ? draftFrom(config, current.data) : config.blank), [config, current]);
  const form = useForm<Draft>({ defaultValues: initial });
  const { control, handleSubmit, reset, setError, clearErrors } = form;
  const [groupErrors, setGroupErrors] = useState<Record<string, string>>({});
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const create = useCreateMeasurementMutation(jobId);
  const save = useSaveMeasurementMutation(jobId);
  const draft = useWatch({ control }) as Draft;

  // A newer record from the server (after a save or a reload) replaces the form.
  useEffect(() => {
    reset(initial);
  }, [initial, reset]);

  const placeErrors = (errors: Record<string, string>) => {
    const groups: Record<string, string> = {};
    const other: string[] = [];
    for (const [path, message] of Object.entries(errors)) {
      const target = formPath(config, path);
      if (target.startsWith('group.')) groups[target.slice(6)] ??= message;
      else if (target === 'scalars.table') other.push(message);
      else setError(target as never, { type: 'check', message });
    }
    setGroupErrors(groups);
    return other;
  };

  const submit = handleSubmit(async (values) => {
    clearErrors();
    setGroupErrors({});
    const data = dataFrom(config, values);
    const parsed = measurementDataSchemas[config.kind].safeParse(data);
    if (!parsed.success) {
      const errors: Record<string, string> = {};
      for (const issue of parsed.error.issues) errors[issue.path.map(String).join('.')] ??= issue.message;
      const other = placeErrors(errors);
      setOutcome({ kind: 'error', message: `Not saved. ${other.length ? other.join('. ') : 'Fix the fields marked in red, then save again.'}` });
      return;
    }
    try {
      if (current) await save.mutateAsync({ id: current.id, version: current.version, data: parsed.data });
      else await create.mutateAsync({ kind: config.kind, note: '', data: parsed.data } as MeasurementCreate);
      setOutcome({ kind: 'saved', message: 'Saved. Run the fit checks to see what it means for the cam.' });
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) {
        setOutcome({ kind: 'conflict', message: error.message });
        return;
      }
      if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
        const other = placeErrors(error.fields);
        setOutcome({ kind: 'error', message: `Not saved. ${other.length ? other.join('. ') : 'Fix the fields marked in red, then save again.'}` });
        return;
      }
      setOutcome({ kind: 'error', message: `Not saved. ${error instanceof Error ? error.message : 'Try again.'}` });
    }
  });

  return (
    <View style={styles.form} testID={testID}>
      {config.choice ? (
        <Controller
          control={control}
          name="choice"
          render={({ field }) => (
            <ChoiceGroup
              label={config.choice?.label ?? ''}
              value={field.value}
              choices={config.choice?.choices ?? []}
              onChange={canWrite ? field.onChange : () => undefined}
              testID={`${testID}-${config.choice?.key}`}
            />
          )}
        />
      ) : null}
      {config.scalars?.length ? (
        <View style={styles.cells}>
          {config.scalars.map((f) => (
            <Cell key={f.key} control={control} name={`scalars.${f.key}`} field={f} editable={canWrite} testID={`${testID}-${f.key}`} />
          ))}
        </View>
      ) : null}
      {(config.groups ?? []).map((g) => (
        <GroupRows key={g.key} control={control} group={g} editable={canWrite} error={groupErrors[g.key]} testID={`${testID}-${g.key}`} />
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

function Cell({
  control,
  name,
  field,
  editable,
  testID,
  rowLabel,
}: {
  control: Control<Draft>;
  name: string;
  field: MeasureField;
  editable: boolean;
  testID: string;
  rowLabel?: string;
}) {
  return (
    <View style={styles.cell}>
      <Controller
        control={control as unknown as Control<FieldValues>}
        name={name}
        render={({ field: f, fieldState }) => (
          <TextField
            label={field.label}
            accessibilityHint={rowLabel}
            unit={field.unit}
            hint={field.hint}
            value={f.value == null ? '' : String(f.value)}
            onChangeText={f.onChange}
            onBlur={f.onBlur}
            editable={editable}
            inputMode={field.text ? 'text' : 'decimal'}
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
  error,
  testID,
}: {
  control: Control<Draft>;
  group: MeasureGroup;
  editable: boolean;
  error?: string;
  testID: string;
}) {
  const { fields, append, remove } = useFieldArray({ control: control as unknown as Control<FieldValues>, name: `rows.${group.key}` });
  const blankRow = Object.fromEntries(group.columns.map((c) => [c.key, '']));
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
          <View style={styles.cells}>
            {group.columns.map((c) => (
              <Cell
                key={c.key}
                control={control}
                name={`rows.${group.key}.${i}.${c.key}`}
                field={c}
                editable={editable}
                rowLabel={`${group.rowName.toLowerCase()} ${i + 1}`}
                testID={`${testID}-${i}-${c.key}`}
              />
            ))}
          </View>
        </View>
      ))}
      {error ? (
        <Text role="alert" style={styles.error} testID={`${testID}-error`}>
          {error}
        </Text>
      ) : null}
      {editable ? (
        <Button
          label={`Add ${group.rowName.toLowerCase()}`}
          variant="secondary"
          onPress={() => append(blankRow)}
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
