import { Link, type Href } from 'expo-router';
import type { ReactNode } from 'react';
import { ScrollView, StyleSheet, Text, View } from 'react-native';

import { breakpoints, colors, space, type as typeScale } from '@/constants/theme';

/** A link back up, for example to the list this record is in. */
export type BackLink = { href: Href; label: string };

type ScreenProps = {
  title: string;
  /** A short line under the title: the shop, the record, what to do here. */
  subtitle?: string;
  /** Controls at the right of the title (or under it on a phone). */
  actions?: ReactNode;
  /** A link back up, for example to the list this record is in. */
  back?: BackLink;
  children: ReactNode;
  testID?: string;
};

/** A scrolling page with a heading, capped in width so lines stay readable on a wide screen. */
export function Screen({ title, subtitle, actions, back, children, testID }: ScreenProps) {
  return (
    <ScrollView style={styles.scroll} contentContainerStyle={styles.content} testID={testID}>
      <View style={styles.page}>
        {back ? (
          <Link href={back.href} style={styles.back} testID="back-link" data-print="hide">
            ← {back.label}
          </Link>
        ) : null}
        <View style={styles.header}>
          <View style={styles.titles}>
            <Text role="heading" aria-level={1} style={styles.title}>
              {title}
            </Text>
            {subtitle ? <Text style={styles.subtitle}>{subtitle}</Text> : null}
          </View>
          {actions ? <View style={styles.actions}>{actions}</View> : null}
        </View>
        {children}
      </View>
    </ScrollView>
  );
}

/** A titled block on a page. */
export function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <View style={styles.section}>
      <Text role="heading" aria-level={2} style={styles.sectionTitle}>
        {title}
      </Text>
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  scroll: { flex: 1, backgroundColor: colors.paper },
  content: { padding: space.lg, paddingBottom: space.xxxl },
  page: { width: '100%', maxWidth: breakpoints.page, alignSelf: 'center', gap: space.xl },
  header: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space.md },
  titles: { flexGrow: 1, flexShrink: 1, minWidth: 220, gap: space.xs },
  title: { ...typeScale.display, color: colors.ink },
  back: { ...typeScale.label, color: colors.accent, alignSelf: 'flex-start', paddingVertical: space.xs, textDecorationLine: 'underline' },
  subtitle: { ...typeScale.body, color: colors.inkMuted },
  actions: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  section: {
    gap: space.md,
    padding: space.lg,
    backgroundColor: colors.surface,
    borderRadius: 12,
    borderWidth: 1,
    borderColor: colors.line,
  },
  sectionTitle: { ...typeScale.heading, color: colors.ink },
});
