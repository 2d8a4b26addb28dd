import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'expo-router';
import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { StyleSheet, Text } from 'react-native';
import { z } from 'zod';

import { AuthCard } from '@/components/account/auth-card';
import { Button } from '@/components/ui/button';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice } from '@/components/ui/query-state';
import { colors, type as typeScale } from '@/constants/theme';
import { useRequestPasswordResetMutation } from '@/hooks/use-me';

const requestSchema = z.object({ email: z.email('Enter the e-mail address you signed up with') });
type RequestValues = z.infer<typeof requestSchema>;

export function ForgotPasswordScreen() {
  const request = useRequestPasswordResetMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<RequestValues>({ resolver: zodResolver(requestSchema), defaultValues: { email: '' } });

  const submit = handleSubmit(async ({ email }) => {
    setFormError(null);
    try {
      await request.mutateAsync(email);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['email']));
    }
  });

  return (
    <AuthCard title="Forgot your password?" intro="We mail you a link to set a new one. It works for one hour.">
      {request.isSuccess ? (
        <Text style={styles.body} role="status" testID="reset-requested">
          If an account uses that address, a link to set a new password is on its way. Check your mail.
        </Text>
      ) : (
        <>
          <FormField
            control={control}
            name="email"
            label="E-mail"
            keyboardType="email-address"
            autoComplete="email"
            onSubmitEditing={submit}
            testID="reset-email"
          />
          {formError ? <ErrorNotice error={new Error(formError)} /> : null}
          <Button label="Mail me a link" onPress={submit} busy={request.isPending} testID="reset-request" />
        </>
      )}
      <Link href="/sign-in" style={styles.link} testID="to-sign-in">
        Back to sign in
      </Link>
    </AuthCard>
  );
}

const styles = StyleSheet.create({
  body: { ...typeScale.body, color: colors.inkMuted },
  link: { ...typeScale.bodyStrong, color: colors.accent, textDecorationLine: 'underline' },
});
