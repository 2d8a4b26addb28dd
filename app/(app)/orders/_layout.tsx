import { Stack } from 'expo-router';

import { colors } from '@/constants/theme';

/** Order screens carry their own heading and a link back, so the stack draws no header. */
export default function OrdersLayout() {
  return <Stack screenOptions={{ headerShown: false, contentStyle: { backgroundColor: colors.paper } }} />;
}
