import { StyleSheet, Text, View } from 'react-native';

import { MailFailures } from '@/components/account/mail-failures';
import { LimitSettings } from '@/components/measure/limit-settings';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { TeamSettings } from '@/components/team/team-settings';
import { colors, space, type as typeScale } from '@/constants/theme';
import { useMeQuery } from '@/hooks/use-me';
import { useShopLimitsQuery } from '@/hooks/use-shop-limits';
import { managesTeam, roleAllows } from '@/shared/roles';

export function SettingsScreen() {
  const me = useMeQuery().data;
  const shop = me?.activeShop;
  const seesLimits = roleAllows(shop?.role, { measurement: ['read'] });
  const seesTeam = shop ? managesTeam(shop.kind, shop.role) : false;
  return (
    <Screen
      title="Settings"
      subtitle={`${shop?.name ?? 'Your shop'} · ${[seesTeam && 'who works here', seesLimits && 'the numbers every fit check is measured against'].filter(Boolean).join(' · ')}`}
      testID="settings-screen"
    >
      {seesTeam ? (
        <Section title="Team">
          <TeamSettings />
        </Section>
      ) : null}
      {seesTeam ? (
        <Section title="Undelivered mail">
          <MailFailures />
        </Section>
      ) : null}
      {seesLimits ? (
        <Section title="Check limits">
          <CheckLimits canEdit={roleAllows(shop?.role, { shop: ['update'] })} />
        </Section>
      ) : null}
    </Screen>
  );
}

function CheckLimits({ canEdit }: { canEdit: boolean }) {
  const limits = useShopLimitsQuery();
  return (
    <>
      <Text style={styles.help}>
        Leave a field blank to use Lobewright&apos;s default. A result inside the watch band of a limit shows as watch rather than pass. A value you change is
        labelled &quot;shop setting&quot; in every result that uses it.
      </Text>
      {limits.isPending ? (
        <Pending label="Loading the shop's limits…" />
      ) : limits.isError ? (
        <View>
          <ErrorNotice error={limits.error} onRetry={() => limits.refetch()} />
        </View>
      ) : (
        <LimitSettings answer={limits.data} canEdit={canEdit} onReload={() => void limits.refetch()} />
      )}
    </>
  );
}

const styles = StyleSheet.create({
  help: { ...typeScale.body, color: colors.inkMuted, marginBottom: space.xs },
});
