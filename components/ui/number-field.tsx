import { useEffect, useRef } from 'react';
import { Controller, useForm, type Control, type DefaultValues, type FieldErrors, type FieldPath, type FieldValues, type Resolver } from 'react-hook-form';

import { draftFromText, rangeText, resolveDrafts, setAt, shownText, shownUnit, type NumberDraft, type NumberSpec, type ShownUnits } from '@/lib/number-draft';

import { useUnits } from '@/state/units';

import { TextField } from '@/components/ui/text-field';

type NumberFieldProps = {
  spec: NumberSpec;
  draft: NumberDraft;
  units: ShownUnits;
  onChange: (draft: NumberDraft) => void;
  onBlur?: () => void;
  error?: string;
  editable?: boolean;
  testID?: string;
};

/**
 * A number in the unit chosen on the toggle, with its range as a hint. It
 * shows the text as typed until the unit changes, then the saved value
 * converted, so nothing is rounded away by switching back and forth.
 */
export function NumberField({ spec, draft, units, onChange, onBlur, error, editable = true, testID }: NumberFieldProps) {
  const range = `Range ${rangeText(spec, units)}`;
  return (
    <TextField
      label={spec.label}
      unit={shownUnit(spec, units)}
      hint={spec.hint ? `${spec.hint}. ${range}` : range}
      error={error}
      value={draft ? shownText(spec, draft, units) : ''}
      onChangeText={(text) => onChange(draftFromText(spec, text, units))}
      onBlur={onBlur}
      editable={editable}
      inputMode={spec.min < 0 ? 'text' : 'decimal'}
      autoCorrect={false}
      autoCapitalize="none"
      testID={testID}
    />
  );
}

type DraftFieldProps<T extends FieldValues, TOut> = {
  control: Control<T, unknown, TOut>;
  spec: NumberSpec;
  units: ShownUnits;
  editable?: boolean;
  /** Test ids are the form's prefix and the field's path with dashes: `engine-spring-seatLoad`. */
  testPrefix: string;
  /** A test id other than the one made from the path. */
  testID?: string;
};

/** The test id for a number field: `engine` + `spring.seatLoad` → `engine-spring-seatLoad`. */
export const fieldTestId = (prefix: string, path: string) => `${prefix}-${path.replace(/^spec\./, '').replace(/\./g, '-')}`;

/** A NumberField bound to a react-hook-form field named by the spec's path. */
export function DraftField<T extends FieldValues, TOut>({ control, spec, units, editable, testPrefix, testID }: DraftFieldProps<T, TOut>) {
  return (
    <Controller
      control={control}
      name={spec.path as FieldPath<T>}
      render={({ field, fieldState }) => (
        <NumberField
          spec={spec}
          draft={field.value as NumberDraft}
          units={units}
          onChange={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          editable={editable}
          testID={testID ?? fieldTestId(testPrefix, spec.path)}
        />
      )}
    />
  );
}

type Parser<T> = Parameters<typeof resolveDrafts<T>>[3];

/**
 * A react-hook-form resolver for a form of number drafts: checks each number
 * in the unit shown and the rest with
 * the shared schema, and hands the submit handler the record in calc units.
 * useForm reads its options on every render, so a resolver rebuilt when the
 * units change is the one the next submit uses.
 */
export function draftResolver<TDraft extends FieldValues, TOut>(
  specs: readonly NumberSpec[] | ((values: TDraft) => readonly NumberSpec[]),
  schema: Parser<TOut> | ((values: TDraft) => Parser<TOut>),
  others: (values: TDraft) => Record<string, unknown>,
  units: ShownUnits | null,
): Resolver<TDraft, unknown, TOut> {
  return async (values) => {
    if (!units) {
      return { values: {}, errors: { root: { type: 'units', message: 'Unit conversion is still loading. Try again in a moment.' } } as FieldErrors<TDraft> };
    }
    // Forms with rows (readings added and removed) name their fields and schema from the values.
    const fields = typeof specs === 'function' ? specs(values) : specs;
    const result = resolveDrafts(fields, values, others(values), typeof schema === 'function' ? schema(values) : schema, units);
    if (result.errors === null) return { values: result.values, errors: {} };
    const errors: Record<string, unknown> = {};
    for (const [path, message] of Object.entries(result.errors)) {
      setAt(errors, path === '(form)' ? 'root' : path, { type: 'validate', message });
    }
    return { values: {}, errors: errors as FieldErrors<TDraft> };
  };
}

type DraftFormOptions<TDraft extends FieldValues, TOut> = {
  specs: Parameters<typeof draftResolver<TDraft, TOut>>[0];
  schema: Parameters<typeof draftResolver<TDraft, TOut>>[1];
  /** The form's values that are not number drafts (text, choices), or the saved record the numbers go into. */
  others: (values: TDraft) => Record<string, unknown>;
  defaultValues: DefaultValues<TDraft>;
  /** 'onChange' checks on every keystroke (the compare screen's try values); otherwise from the first submit. */
  mode?: 'onSubmit' | 'onChange';
};

/**
 * A react-hook-form form of number drafts in the units chosen on the toggle:
 * the resolver follows the toggle, and once messages show, a switch says them
 * again in the new unit. `units` is null while unit conversion loads.
 */
export function useDraftForm<TDraft extends FieldValues, TOut>({ specs, schema, others, defaultValues, mode = 'onSubmit' }: DraftFormOptions<TDraft, TOut>) {
  const { converter, loadError } = useUnits();
  // Rebuilt each render with the current units; useForm reads its options on every render.
  const form = useForm<TDraft, unknown, TOut>({ resolver: draftResolver(specs, schema, others, converter), defaultValues, mode });
  const { isSubmitted } = form.formState;
  const { trigger } = form;
  // Keyed on the converter, one object per choice of units, so server messages stay put after a save.
  const shownIn = useRef(converter);
  useEffect(() => {
    if (shownIn.current === converter) return;
    shownIn.current = converter;
    if ((isSubmitted || mode === 'onChange') && converter) void trigger();
  }, [converter, isSubmitted, mode, trigger]);
  return { form, units: converter, loadError };
}
