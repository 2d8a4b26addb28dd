import { Link, type Href } from 'expo-router';
import type { ReactNode } from 'react';
import { StyleSheet, View } from 'react-native';

import { colors, radius, space } from '@/constants/theme';

/** A card in a list that opens its record: a surface with a coloured edge on the left. */
export function LinkCard({ href, edge, testID, children }: { href: Href; edge: string; testID: string; children: ReactNode }) {
  return (
    <Link href={href} style={[styles.card, { borderLeftColor: edge }]} testID={testID}>
      <View style={styles.inner}>{children}</View>
    </Link>
  );
}

const styles = StyleSheet.create({
  card: {
    display: 'flex',
    padding: space.lg,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.line,
    borderLeftWidth: 5,
  },
  inner: { gap: space.xs, width: '100%' },
});
