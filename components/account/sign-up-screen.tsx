import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'expo-router';
import { useState } from 'react';
import { Controller, useForm, useWatch } from 'react-hook-form';
import { StyleSheet, Text } from 'react-native';
import { z } from 'zod';

import { AuthCard } from '@/components/account/auth-card';
import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice } from '@/components/ui/query-state';
import { colors, type as typeScale } from '@/constants/theme';
import { useSignUpMutation } from '@/hooks/use-me';
import { shopCreateSchema } from '@/shared/me';
import { minPasswordLength, passwordLength } from '@/shared/passwords';

const signUpSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter your name').max(120, 'Keep your name under 120 characters'),
    email: z.email('Enter an e-mail address you can read'),
    password: passwordLength,
    purpose: z.enum(['new-shop', 'join']),
    shopName: z.string(),
    shopKind: shopCreateSchema.shape.kind,
  })
  .superRefine((values, ctx) => {
    if (values.purpose !== 'new-shop') return;
    const name = shopCreateSchema.shape.name.safeParse(values.shopName);
    if (!name.success) ctx.addIssue({ code: 'custom', path: ['shopName'], message: name.error.issues[0]?.message ?? 'Name the shop' });
  });
type SignUpValues = z.infer<typeof signUpSchema>;

const purposeChoices = [
  { value: 'new-shop', label: 'Set up a new shop' },
  { value: 'join', label: 'Join a shop that invited me' },
] as const;

const kindChoices = [
  { value: 'repair', label: 'Repair shop' },
  { value: 'grinding', label: 'Grinding shop' },
] as const;

/** `join` is set when the invitation page links here with ?join=1: the person joins the inviting shop once their address is verified. */
export function SignUpScreen({ join }: { join?: string }) {
  const signUp = useSignUpMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<SignUpValues>({
    resolver: zodResolver(signUpSchema),
    defaultValues: { name: '', email: '', password: '', purpose: join ? 'join' : 'new-shop', shopName: '', shopKind: 'repair' },
  });
  const newShop = useWatch({ control, name: 'purpose' }) === 'new-shop';

  const submit = handleSubmit(async ({ shopName, shopKind, purpose, ...account }) => {
    setFormError(null);
    try {
      await signUp.mutateAsync({ ...account, shop: purpose === 'new-shop' ? { name: shopName, kind: shopKind } : null });
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['name', 'email', 'password']));
    }
  });

  return (
    <AuthCard
      title="Create an account"
      intro="Set up your shop, or join one that invited you. A repair shop plans regrinds and fit checks; a grinding shop receives spec sheets."
    >
      <FormField control={control} name="name" label="Your name" autoComplete="name" testID="sign-up-name" />
      <FormField control={control} name="email" label="E-mail" keyboardType="email-address" autoComplete="email" testID="sign-up-email" />
      <FormField
        control={control}
        name="password"
        label="Password"
        hint={`At least ${minPasswordLength} characters; not a common password.`}
        secureTextEntry
        autoComplete="new-password"
        testID="sign-up-password"
      />
      <Controller
        control={control}
        name="purpose"
        render={({ field }) => (
          <ChoiceGroup label="What brings you here" value={field.value} choices={purposeChoices} onChange={field.onChange} testID="sign-up-purpose" />
        )}
      />
      {newShop ? (
        <>
          <FormField control={control} name="shopName" label="Shop name" testID="sign-up-shop-name" />
          <Controller
            control={control}
            name="shopKind"
            render={({ field }) => (
              <ChoiceGroup label="Kind of shop" value={field.value} choices={kindChoices} onChange={field.onChange} testID="sign-up-kind" />
            )}
          />
        </>
      ) : (
        <Text style={styles.switch} testID="sign-up-join-note">
          Use the address the invitation was sent to. Once you verify it from the mail we send, the shop opens to you.
        </Text>
      )}
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
