import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';

/** The framed panel the sign-in and sign-up forms sit in, with the product's name. */
export function AuthCard({ title, intro, children }: { title: string; intro: string; children: ReactNode }) {
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content}>
      <View style={styles.card}>
        <View style={styles.brand}>
          <View style={styles.mark} aria-hidden />
          <Text style={styles.wordmark}>Lobewright</Text>
        </View>
        <Text role="heading" aria-level={1} style={styles.title}>
          {title}
        </Text>
        <Text style={styles.intro}>{intro}</Text>
        {children}
      </View>
    </ScrollView>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { flexGrow: 1, justifyContent: 'center', padding: space.lg },
  card: {
    width: '100%',
    maxWidth: 460,
    alignSelf: 'center',
    gap: space.lg,
    padding: space.xl,
    backgroundColor: colors.surface,
    borderRadius: radius.lg,
    borderWidth: 1,
    borderColor: colors.line,
  },
  brand: { flexDirection: 'row', alignItems: 'center', gap: space.sm },
  mark: {
    width: 22,
    height: 28,
    borderTopLeftRadius: 11,
    borderTopRightRadius: 11,
    borderBottomLeftRadius: 14,
    borderBottomRightRadius: 14,
    backgroundColor: colors.accent,
  },
  wordmark: { fontFamily: fonts.bold, fontSize: 20, color: colors.accent, letterSpacing: 0.5 },
  title: { ...typeScale.title, color: colors.ink },
  intro: { ...typeScale.body, color: colors.inkMuted },
});
