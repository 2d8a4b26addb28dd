import { Stack } from 'expo-router';

import { colors, fonts } from '@/constants/theme';

export default function JobsLayout() {
  return (
    <Stack
      screenOptions={{
        headerTintColor: colors.accent,
        headerStyle: { backgroundColor: colors.surface },
        headerTitleStyle: { fontFamily: fonts.semibold, color: colors.ink },
        contentStyle: { backgroundColor: colors.paper },
      }}
    >
      <Stack.Screen name="index" options={{ headerShown: false, title: 'Jobs' }} />
      <Stack.Screen name="[id]" options={{ headerShown: false, title: 'Job' }} />
    </Stack>
  );
}
