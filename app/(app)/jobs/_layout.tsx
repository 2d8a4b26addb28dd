import { Stack } from 'expo-router';

import { colors } from '@/constants/theme';

/** Job screens carry their own heading and a link back up, so the stack draws no header. */
export default function JobsLayout() {
  return <Stack screenOptions={{ headerShown: false, contentStyle: { backgroundColor: colors.paper } }} />;
}
