import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';

/** A boxed list of cautions, announced to screen readers as a note. */
export function Cautions({ title, items, testID }: { title: string; items: readonly string[]; testID?: string }) {
  return (
    <View style={styles.box} role="note" aria-label={title} testID={testID}>
      <Text style={styles.title}>{title}</Text>
      {items.map((item) => (
        <Text key={item} style={styles.item}>
          • {item}
        </Text>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    borderLeftWidth: 5,
    borderLeftColor: colors.watch,
    backgroundColor: colors.watchSoft,
  },
  title: { fontFamily: fonts.semibold, fontSize: 15, color: colors.ink },
  item: { ...typeScale.small, color: colors.ink },
});
