import { Stack } from 'expo-router';

import { colors } from '@/constants/theme';

/** An owner's summaries carry their own heading, so the stack draws no header. */
export default function MyJobsLayout() {
  return <Stack screenOptions={{ headerShown: false, contentStyle: { backgroundColor: colors.paper } }} />;
}
