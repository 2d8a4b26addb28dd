import { Tabs } from 'expo-router';
import { useWindowDimensions, View } from 'react-native';

import { NavBar, type NavItem } from '@/components/ui/nav-bar';
import { VerifyBanner } from '@/components/account/verify-banner';
import { breakpoints, colors } from '@/constants/theme';
import { useMeQuery } from '@/hooks/use-me';
import { useOutboxQuery } from '@/hooks/use-outbox';
import { managesTeam, roleAllows } from '@/shared/roles';

export default function AppLayout() {
  const { width } = useWindowDimensions();
  const wide = width >= breakpoints.wide;
  const me = useMeQuery().data;
  const role = me?.activeShop?.role;
  const canSeeJobs = roleAllows(role, { job: ['read'] });
  const canSeeSettings = roleAllows(role, { measurement: ['read'] }) || (me?.activeShop ? managesTeam(me.activeShop.kind, role) : false);
  const canSeeIncoming = roleAllows(role, { incoming: ['read'] });
  const canSeeSummaries = roleAllows(role, { summary: ['read'] });
  // The dev mailbox shows only when the server keeps an outbox; a production server answers 404 (→ null).
  const outbox = useOutboxQuery(Boolean(me));
  const canSeeMailbox = Array.isArray(outbox.data);

  const items: NavItem[] = [
    ...(canSeeJobs
      ? ([
          { href: '/jobs', match: '/jobs', label: 'Jobs', glyph: '≡', testID: 'nav-jobs' },
          { href: '/profiles', match: '/profiles', label: 'Profiles', glyph: '∩', testID: 'nav-profiles' },
        ] as const)
      : []),
    ...(canSeeSummaries ? ([{ href: '/my', match: '/my', label: 'Vehicles', glyph: '▣', testID: 'nav-my' }] as const) : []),
    ...(canSeeIncoming ? ([{ href: '/incoming', match: '/incoming', label: 'Incoming', glyph: '⇲', testID: 'nav-incoming' }] as const) : []),
    ...(canSeeSettings ? ([{ href: '/settings', match: '/settings', label: 'Settings', glyph: '⚙', testID: 'nav-settings' }] as const) : []),
    ...(canSeeMailbox ? ([{ href: '/mailbox', match: '/mailbox', label: 'Mailbox', glyph: '✉', testID: 'nav-mailbox' }] as const) : []),
    { href: '/account', match: '/account', label: 'Account', glyph: '◎', testID: 'nav-account' },
  ];

  return (
    <View style={{ flex: 1 }}>
      {me && !me.user.emailVerified ? <VerifyBanner email={me.user.email} /> : null}
      <Tabs
        tabBar={() => <NavBar items={items} wide={wide} shopName={me?.activeShop?.name} />}
        screenOptions={{
          headerShown: false,
          tabBarPosition: wide ? 'left' : 'bottom',
          sceneStyle: { backgroundColor: colors.paper },
        }}
      >
        <Tabs.Screen name="index" options={{ href: null }} />
        <Tabs.Protected guard={canSeeJobs}>
          <Tabs.Screen name="jobs" options={{ title: 'Jobs' }} />
          <Tabs.Screen name="profiles" options={{ title: 'Profiles' }} />
        </Tabs.Protected>
        <Tabs.Protected guard={canSeeSettings}>
          <Tabs.Screen name="settings" options={{ title: 'Settings' }} />
        </Tabs.Protected>
        <Tabs.Protected guard={canSeeSummaries}>
          <Tabs.Screen name="my" options={{ title: 'Your vehicles' }} />
        </Tabs.Protected>
        <Tabs.Protected guard={canSeeIncoming}>
          <Tabs.Screen name="incoming" options={{ title: 'Incoming' }} />
        </Tabs.Protected>
        <Tabs.Screen name="orders" options={{ href: null, title: 'Grind order' }} />
        <Tabs.Protected guard={outbox.data !== null}>
          <Tabs.Screen name="mailbox" options={{ href: null, title: 'Dev mailbox' }} />
        </Tabs.Protected>
        <Tabs.Screen name="account" options={{ title: 'Account' }} />
      </Tabs>
    </View>
  );
}
