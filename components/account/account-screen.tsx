import { zodResolver } from '@hookform/resolvers/zod';
import { useState } from 'react';
import { Controller, useForm } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { applyServerErrors, FormField } from '@/components/ui/form-field';
import { ErrorNotice } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { colors, radius, space, type as typeScale } from '@/constants/theme';
import { useCreateShopMutation, useMeQuery, useSignOutMutation, useSwitchShopMutation } from '@/hooks/use-me';
import { shopCreateSchema, type MeShop, type ShopCreate } from '@/shared/me';
import { roleLabels } from '@/shared/roles';

const kindLabels = { repair: 'Repair shop', grinding: 'Grinding shop' } as const;

export function AccountScreen() {
  const me = useMeQuery().data;
  const signOut = useSignOutMutation();
  const switchShop = useSwitchShopMutation();
  if (!me) return null;
  const active = me.activeShop;

  return (
    <Screen title="Account" subtitle={me.user.email} testID="account-screen">
      <Section title="You">
        <Text style={styles.name} testID="account-name">
          {me.user.name}
        </Text>
        <Text style={styles.meta}>{me.user.email}</Text>
        {active ? (
          <Text style={styles.body} testID="account-role">
            {roleLabels[active.role]} at {active.name} ({kindLabels[active.kind].toLowerCase()})
          </Text>
        ) : (
          <Text style={styles.body}>You are not working in a shop yet.</Text>
        )}
      </Section>

      {me.shops.length > 0 ? (
        <Section title="Your shops">
          <View role="list" style={styles.shops}>
            {me.shops.map((shop) => (
              <ShopRow
                key={shop.id}
                shop={shop}
                active={shop.id === active?.id}
                busy={switchShop.isPending && switchShop.variables === shop.id}
                onSwitch={() => switchShop.mutate(shop.id)}
              />
            ))}
          </View>
          {switchShop.isError ? <ErrorNotice error={switchShop.error} /> : null}
        </Section>
      ) : (
        <Section title="Set up a shop">
          <CreateShopForm />
        </Section>
      )}

      <Section title="Sign out">
        <Text style={styles.meta}>Signing out clears this device’s view of your shop’s records.</Text>
        <Button label="Sign out" variant="danger" onPress={() => signOut.mutate()} busy={signOut.isPending} testID="sign-out" />
        {signOut.isError ? <ErrorNotice error={signOut.error} /> : null}
      </Section>
    </Screen>
  );
}

function ShopRow({ shop, active, busy, onSwitch }: { shop: MeShop; active: boolean; busy: boolean; onSwitch: () => void }) {
  return (
    <View role="listitem" style={[styles.shopRow, active && styles.shopActive]} testID={`shop-${shop.id}`}>
      <View style={styles.shopText}>
        <Text style={styles.shopName}>{shop.name}</Text>
        <Text style={styles.meta}>
          {kindLabels[shop.kind]} · {roleLabels[shop.role]}
        </Text>
      </View>
      {active ? (
        <Text style={styles.current}>Working here</Text>
      ) : (
        <Button label="Switch" variant="secondary" onPress={onSwitch} busy={busy} testID={`switch-${shop.id}`} />
      )}
    </View>
  );
}

function CreateShopForm() {
  const createShop = useCreateShopMutation();
  const [formError, setFormError] = useState<string | null>(null);
  const { control, handleSubmit, setError } = useForm<ShopCreate>({
    resolver: zodResolver(shopCreateSchema),
    defaultValues: { name: '', kind: 'repair' },
  });
  const submit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      await createShop.mutateAsync(values);
    } catch (error) {
      setFormError(applyServerErrors(error, setError, ['name', 'kind']));
    }
  });
  return (
    <View style={styles.form}>
      <FormField control={control} name="name" label="Shop name" testID="shop-name" />
      <Controller
        control={control}
        name="kind"
        render={({ field }) => (
          <ChoiceGroup
            label="Kind of shop"
            value={field.value}
            choices={[
              { value: 'repair', label: kindLabels.repair },
              { value: 'grinding', label: kindLabels.grinding },
            ]}
            onChange={field.onChange}
          />
        )}
      />
      {formError ? <ErrorNotice error={new Error(formError)} /> : null}
      <Button label="Create shop" onPress={submit} busy={createShop.isPending} testID="create-shop" />
    </View>
  );
}

const styles = StyleSheet.create({
  name: { ...typeScale.title, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  shops: { gap: space.sm },
  shopRow: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.md,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
  },
  shopActive: { borderColor: colors.accent, backgroundColor: colors.accentSoft },
  shopText: { flex: 1, gap: 2 },
  shopName: { ...typeScale.bodyStrong, color: colors.ink },
  current: { ...typeScale.label, color: colors.accent },
  form: { gap: space.lg },
});
