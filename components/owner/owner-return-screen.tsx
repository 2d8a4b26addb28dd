import { Redirect, Stack } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { ownerType } from '@/components/owner/owner-type';
import { colors, space } from '@/constants/theme';
import { rememberedOwnerToken } from '@/lib/owner-return';

/** Back from the payment page: on to the summary this tab came from, with the payment session to check. */
export function OwnerReturnScreen({ deposit }: { deposit?: string }) {
  const token = rememberedOwnerToken();
  if (token) return <Redirect href={{ pathname: '/share/[token]', params: deposit ? { token, deposit } : { token } }} />;
  return (
    <View style={styles.page} testID="owner-return">
      <Stack.Screen options={{ title: 'Back from the payment page' }} />
      <Text role="heading" aria-level={1} style={styles.title}>
        Back from the payment page
      </Text>
      <Text style={styles.body} role="status">
        {deposit
          ? 'If you paid, the shop will see it in a moment. Open the link the shop sent you again to see your summary with the payment.'
          : 'Open the link the shop sent you again to see your summary.'}
      </Text>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, padding: space.xl, gap: space.md, backgroundColor: colors.surface },
  title: { ...ownerType.display, color: colors.ink },
  body: { ...ownerType.body, color: colors.ink },
});
