import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, Text } from 'react-native';
import { z } from 'zod';

import { AuthCard } from '@/components/auth-card';
import { Button } from '@/components/button';
import { ChoiceGroup } from '@/components/choice-group';
import { applyServerErrors, FormField } from '@/components/form-field';
import { ErrorNotice } from '@/components/query-state';
import { colors, type as typeScale } from '@/constants/theme';
import { useSignUpMutation } from '@/hooks/use-me';
import { shopCreateSchema } from '@/shared/me';

const signUpSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name').max(120, 'Keep your name under 120 characters'),
  email: z.email('Enter an e-mail address you can read'),
  password: z.string().min(12, 'Use at least 12 characters').max(128, 'Use at most 128 characters'),
  shopName: shopCreateSchema.shape.name,
  shopKind: shopCreateSchema.shape.kind,
});
type SignUpValues = z.infer<typeof signUpSchema>;

const kindChoices = [
  { value: 'repair', label: 'Repair shop' },
  { value: 'grinding', label: 'Grinding shop' },
] as const;

export default function SignUp() {
  const signUp = useSignUpMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<SignUpValues>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { name: '', email: '', password: '', shopName: '', shopKind: 'repair' },
  });

  const submit = handleSubmit(async ({ shopName, shopKind, ...account }) => {
    setFormError(null);
    try {
      await signUp.mutateAsync({ ...account, shop: { name: shopName, kind: shopKind } });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['name', 'email', 'password']));
    }
  });

  return (
    <AuthCard
      title="Create an account"
      intro="Set up your shop. A repair shop plans regrinds and fit checks; a grinding shop receives spec sheets."
    >
      <FormField control={control} name="name" label="Your name" autoComplete="name" testID="sign-up-name" />
      <FormField control={control} name="email" label="E-mail" keyboardType="email-address" autoComplete="email" testID="sign-up-email" />
      <FormField
        control={control}
        name="password"
        label="Password"
        hint="At least 10 characters."
        secureTextEntry
        autoComplete="new-password"
        testID="sign-up-password"
      />
      <FormField control={control} name="shopName" label="Shop name" testID="sign-up-shop-name" />
      <Controller
        control={control}
        name="shopKind"
        render={({ field }) => (
          <ChoiceGroup label="Kind of shop" value={field.value} choices={kindChoices} onChange={field.onChange} testID="sign-up-kind" />
        )}
      />
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      <Button label="Create account" onPress={submit} busy={signUp.isPending} testID="sign-up-submit" />
      <Text style={styles.switch}>
        Already have an account?{' '}
        <Link href="/sign-in" style={styles.link}>
          Sign in
        </Link>
      </Text>
    </AuthCard>
  );
}

const styles = StyleSheet.create({
  switch: { ...typeScale.body, color: colors.inkMuted },
  link: { ...typeScale.bodyStrong, color: colors.accent, textDecorationLine: 'underline' },
});
