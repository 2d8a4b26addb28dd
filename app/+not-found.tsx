import { Link, Stack } from 'expo-router';
import { StyleSheet, Text, View } from 'react-native';

import { colors, space, type as typeScale } from '@/constants/theme';

export default function NotFound() {
  return (
    <View style={styles.page}>
      <Stack.Screen options={{ title: 'Not found' }} />
      <Text role="heading" aria-level={1} style={styles.title}>
        Nothing at this address
      </Text>
      <Text style={styles.body}>The page may have moved, or the link was cut short. Check the address, or start again.</Text>
      <Link href="/" style={styles.link}>
        Go to the start page
      </Link>
    </View>
  );
}

const styles = StyleSheet.create({
  page: { flex: 1, padding: space.xl, gap: space.md, backgroundColor: colors.paper },
  title: { ...typeScale.title, color: colors.ink },
  body: { ...typeScale.body, color: colors.inkMuted },
  link: { ...typeScale.bodyStrong, color: colors.accent, textDecorationLine: 'underline' },
});
