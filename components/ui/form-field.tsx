import { Controller, type Control, type FieldPath, type FieldValues, type UseFormSetError } from 'react-hook-form';

import { ApiError } from '@/lib/api';

import { TextField } from '@/components/ui/text-field';

type FormFieldProps<T extends FieldValues, TOut> = {
  control: Control<T, unknown, TOut>;
  name: FieldPath<T>;
  label: string;
  unit?: string;
  hint?: string;
  testID?: string;
  multiline?: boolean;
  secureTextEntry?: boolean;
  keyboardType?: 'default' | 'email-address' | 'numeric' | 'decimal-pad';
  autoComplete?: 'email' | 'name' | 'current-password' | 'new-password' | 'off';
  onSubmitEditing?: () => void;
  placeholder?: string;
  editable?: boolean;
  autoCorrect?: boolean;
  inputMode?: 'text' | 'email' | 'numeric' | 'decimal';
};

/** A TextField bound to a react-hook-form field, showing that field's error. */
export function FormField<T extends FieldValues, TOut = T>({ control, name, ...rest }: FormFieldProps<T, TOut>) {
  return (
    <Controller
      control={control}
      name={name}
      render={({ field, fieldState }) => (
        <TextField
          {...rest}
          value={field.value == null ? '' : String(field.value)}
          onChangeText={field.onChange}
          onBlur={field.onBlur}
          error={fieldState.error?.message}
          autoCapitalize={rest.keyboardType === 'email-address' || rest.inputMode === 'email' ? 'none' : undefined}
        />
      )}
    />
  );
}

/** Puts the server's per-field messages on the form; returns the message for anything not tied to a field. */
export function applyServerErrors<T extends FieldValues>(error: unknown, setError: UseFormSetError<T>, known: readonly string[]): string | null {
  if (!(error instanceof ApiError)) return error instanceof Error ? error.message : 'Something went wrong.';
  let unplaced: string | null = null;
  for (const [field, message] of Object.entries(error.fields)) {
    if (known.includes(field)) setError(field as FieldPath<T>, { type: 'server', message });
    else unplaced = `${field}: ${message}`;
  }
  return Object.keys(error.fields).length === 0 ? error.message : unplaced;
}
