import { StyleSheet, Text, View } from 'react-native';

import { LimitSettings } from '@/components/limit-settings';
import { ErrorNotice, Pending } from '@/components/query-state';
import { Screen } from '@/components/screen';
import { colors, space, type as typeScale } from '@/constants/theme';
import { useMeQuery } from '@/hooks/use-me';
import { useShopLimitsQuery } from '@/hooks/use-shop-limits';
import { roleAllows } from '@/shared/roles';

export default function SettingsScreen() {
  const me = useMeQuery().data;
  const limits = useShopLimitsQuery();
  const canEdit = roleAllows(me?.activeShop?.role, { shop: ['update'] });
  return (
    <Screen
      title="Check limits"
      subtitle={`${me?.activeShop?.name ?? 'Your shop'} · the numbers every fit check is measured against`}
      testID="settings-screen"
    >
      <Text style={styles.help}>
        Leave a field blank to use Lobewright&apos;s default. A result inside the watch band of a limit shows as watch rather than pass. A value you
        change is labelled &quot;shop setting&quot; in every result that uses it.
      </Text>
      {limits.isPending ? (
        <Pending label="Loading the shop's limits…" />
      ) : limits.isError ? (
        <View>
          <ErrorNotice error={limits.error} onRetry={() => limits.refetch()} />
        </View>
      ) : (
        <LimitSettings key={limits.data.version} answer={limits.data} canEdit={canEdit} onReload={() => void limits.refetch()} />
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  help: { ...typeScale.body, color: colors.inkMuted, marginBottom: space.xs },
});
