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
import { ApiError } from '@/lib/api';
import { useSignInMutation } from '@/hooks/use-me';

const signInSchema = z.object({
  email: z.email('Enter the e-mail address you signed up with'),
  password: z.string().min(1, 'Enter your password'),
});
type SignInValues = z.infer<typeof signInSchema>;

export function SignInScreen() {
  const signIn = useSignInMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<SignInValues>({
    resolver: zodResolver(signInSchema),
    defaultValues: { email: '', password: '' },
  });

  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await signIn.mutateAsync(values);
    } catch (error) {
      const wrongPassword = error instanceof ApiError && error.status === 401;
      setFormError(
        wrongPassword
          ? 'That e-mail and password do not match an account. Check both and try again.'
          : applyServerErrors(error, setError, ['email', 'password']),
      );
    }
  });

  return (
    <AuthCard title="Sign in" intro="Pick up your shop's jobs, spec sheets and fit checks where you left them.">
      <FormField control={control} name="email" label="E-mail" keyboardType="email-address" autoComplete="email" testID="sign-in-email" />
      <FormField
        control={control}
        name="password"
        label="Password"
        secureTextEntry
        autoComplete="current-password"
        onSubmitEditing={submit}
        testID="sign-in-password"
      />
      <Link href="/forgot-password" style={styles.link} testID="to-forgot-password">
        Forgot password?
      </Link>
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      <Button label="Sign in" onPress={submit} busy={signIn.isPending} testID="sign-in-submit" />
      <Text style={styles.switch}>
        New to Lobewright?{' '}
        <Link href="/sign-up" style={styles.link} testID="to-sign-up">
          Create an account and shop
        </Link>
      </Text>
    </AuthCard>
  );
}

const styles = StyleSheet.create({
  switch: { ...typeScale.body, color: colors.inkMuted },
  link: { ...typeScale.bodyStrong, color: colors.accent, textDecorationLine: 'underline' },
});
