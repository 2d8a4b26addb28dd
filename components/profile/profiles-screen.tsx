import { useRouter } from 'expo-router';
import { StyleSheet, useWindowDimensions, View } from 'react-native';

import { Button } from '@/components/ui/button';
import { ProfileCard } from '@/components/profile/profile-card';
import { EmptyState, ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen } from '@/components/ui/screen';
import { breakpoints, space } from '@/constants/theme';
import { useMeQuery } from '@/hooks/use-me';
import { useLibraryProfilesQuery } from '@/hooks/use-profiles';
import { useUnits } from '@/state/units';
import { roleAllows } from '@/shared/roles';

export function ProfilesScreen() {
  const router = useRouter();
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const me = useMeQuery().data;
  const canWrite = roleAllows(me?.activeShop?.role, { sheet: ['write'] });
  const profiles = useLibraryProfilesQuery();
  const { converter } = useUnits();
  const startNew = () => router.push({ pathname: '/profiles/[id]', params: { id: 'new' } });

  return (
    <Screen
      title="Profile library"
      subtitle={`Cam profiles ${me?.activeShop?.name ?? 'your shop'} keeps on file, ready to copy into a job.`}
      actions={canWrite ? <Button label="New profile" onPress={startNew} testID="new-profile" /> : null}
      testID="profiles-screen"
    >
      {profiles.isPending ? (
        <Pending label="Loading profiles…" />
      ) : profiles.isError ? (
        <ErrorNotice error={profiles.error} onRetry={() => profiles.refetch()} />
      ) : profiles.data.length === 0 ? (
        <EmptyState title="No profiles in the library yet">
          {canWrite ? <Button label="Write the first profile" variant="secondary" onPress={startNew} testID="empty-new-profile" /> : null}
        </EmptyState>
      ) : (
        <View style={[styles.list, wide && styles.grid]} role="list" aria-label="Profiles">
          {profiles.data.map((profile) => (
            <View key={profile.id} role="listitem" style={wide ? styles.gridItem : undefined}>
              <ProfileCard profile={profile} units={converter} />
            </View>
          ))}
        </View>
      )}
    </Screen>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.md },
  grid: { flexDirection: 'row', flexWrap: 'wrap' },
  gridItem: { flexBasis: '45%', flexGrow: 1, maxWidth: '49.4%' },
});
