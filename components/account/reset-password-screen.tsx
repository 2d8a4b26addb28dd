import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text } from 'react-native';
import { z } from 'zod';

import { AuthCard } from '@/components/account/auth-card';
import { Button } from '@/components/ui/button';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice } from '@/components/ui/query-state';
import { colors, type as typeScale } from '@/constants/theme';
import { useResetPasswordMutation } from '@/hooks/use-me';
import { minPasswordLength, passwordLength } from '@/shared/passwords';

const newPasswordSchema = z
  .object({
    newPassword: passwordLength,
    repeat: z.string(),
  })
  .refine((v) => v.newPassword === v.repeat, { path: ['repeat'], message: 'The two passwords differ' });
type NewPasswordValues = z.infer<typeof newPasswordSchema>;

/** Where the reset link lands (?token=, or ?error= when the link is bad or too old). */
export function ResetPasswordScreen({ token, error }: { token?: string; error?: string }) {
  const reset = useResetPasswordMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<NewPasswordValues>({
    resolver: zodResolver(newPasswordSchema),
    defaultValues: { newPassword: '', repeat: '' },
  });

  const submit = handleSubmit(async ({ newPassword }) => {
    setFormError(null);
    try {
      await reset.mutateAsync({ token: token ?? '', newPassword });
    } catch (e) {
      setFormError(applyServerErrors(e, setError, ['newPassword']));
    }
  });

  if (error || !token) {
    return (
      <AuthCard title="This link did not work" intro="It may be older than an hour or already used.">
        <Button label="Ask for a new link" href="/forgot-password" testID="reset-again" />
      </AuthCard>
    );
  }
  if (reset.isSuccess) {
    return (
      <AuthCard title="Password changed" intro="Sign in with your new password. Other devices were signed out.">
        <Text style={styles.body} role="status" testID="reset-done">
          Your new password is set.
        </Text>
        <Button label="Sign in" href="/sign-in" testID="reset-to-sign-in" />
      </AuthCard>
    );
  }
  return (
    <AuthCard title="Set a new password" intro={`At least ${minPasswordLength} characters, and not a commonly used password.`}>
      <FormField control={control} name="newPassword" label="New password" secureTextEntry autoComplete="new-password" testID="reset-new-password" />
      <FormField
        control={control}
        name="repeat"
        label="New password again"
        secureTextEntry
        autoComplete="new-password"
        onSubmitEditing={submit}
        testID="reset-repeat"
      />
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      <Button label="Set password" onPress={submit} busy={reset.isPending} testID="reset-submit" />
    </AuthCard>
  );
}

const styles = StyleSheet.create({ body: { ...typeScale.body, color: colors.inkMuted } });
