import type { ReactNode } from 'react';
import { ActivityIndicator, StyleSheet, Text, View } from 'react-native';

import { colors, radius, space, type as typeScale } from '@/constants/theme';

import { Button } from '@/components/ui/button';

/** A spinner with words, for anything that takes a moment. */
export function Pending({ label }: { label: string }) {
  return (
    <View style={styles.box} role="status" aria-live="polite" testID="pending">
      <ActivityIndicator color={colors.accent} />
      <Text style={styles.text}>{label}</Text>
    </View>
  );
}

/** What went wrong, in the server's words, and a way to try again. */
export function ErrorNotice({ error, onRetry }: { error: unknown; onRetry?: () => void }) {
  const message = error instanceof Error ? error.message : 'Something went wrong.';
  return (
    <View style={[styles.box, styles.error]} role="alert" testID="error-notice">
      <Text style={[styles.text, styles.errorText]}>{message}</Text>
      {onRetry ? <Button label="Try again" variant="secondary" onPress={onRetry} testID="retry" /> : null}
    </View>
  );
}

/** Shown where a list has nothing in it yet, with the next step. */
export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <View style={[styles.box, styles.empty]} testID="empty-state">
      <Text style={styles.emptyTitle}>{title}</Text>
      {children}
    </View>
  );
}

const styles = StyleSheet.create({
  box: {
    padding: space.lg,
    borderRadius: radius.lg,
    gap: space.md,
    alignItems: 'flex-start',
    backgroundColor: colors.surface,
    borderWidth: 1,
    borderColor: colors.line,
  },
  text: { ...typeScale.body, color: colors.ink },
  error: { backgroundColor: colors.failSoft, borderColor: colors.fail },
  errorText: { color: colors.fail },
  empty: { borderStyle: 'dashed', borderColor: colors.lineStrong, backgroundColor: colors.paper },
  emptyTitle: { ...typeScale.heading, color: colors.ink },
});
