import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { placeServerFields } from '@/lib/number-draft';

import { Button } from '@/components/ui/button';

/** What happened on the last save: done, someone else saved first, or what to fix. */
export type SaveOutcome = { kind: 'saved'; message: string } | { kind: 'conflict'; message: string } | { kind: 'error'; message: string };

/**
 * Sorts a failed save into a notice, putting a 400's field messages on the
 * fields the form shows (`place`) and naming the rest in the notice.
 */
export function outcomeOfError(error: unknown, known: readonly string[], prefix: string, place: (path: string, message: string) => void): SaveOutcome {
  if (error instanceof ApiError && error.status === 409) return { kind: 'conflict', message: error.message };
  if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
    const { placed, other } = placeServerFields(error.fields, known, prefix);
    for (const [path, message] of Object.entries(placed)) place(path, message);
    return {
      kind: 'error',
      message: other.length > 0 ? `Not saved. ${other.join('. ')}` : 'Not saved. Fix the fields marked in red, then save again.',
    };
  }
  return { kind: 'error', message: error instanceof Error ? `Not saved. ${error.message}` : 'Not saved. Try again.' };
}

type SaveNoticeProps = {
  outcome: SaveOutcome | null;
  /** Offered on a conflict: loads the other person's version, replacing unsaved edits. */
  onReload: () => void;
  reloading: boolean;
  testID: string;
};

export function SaveNotice({ outcome, onReload, reloading, testID }: SaveNoticeProps) {
  if (!outcome) return null;
  if (outcome.kind === 'saved') {
    return (
      <View style={[styles.box, styles.saved]} role="status" aria-live="polite" testID={`${testID}-saved`}>
        <Text style={[styles.text, styles.savedText]}>{outcome.message}</Text>
      </View>
    );
  }
  if (outcome.kind === 'conflict') {
    return (
      <View style={[styles.box, styles.conflict]} role="alert" testID={`${testID}-conflict`}>
        <Text style={[styles.text, styles.strong]}>Someone else saved this while you were editing.</Text>
        <Text style={styles.text}>{outcome.message}</Text>
        <Text style={styles.text}>Reloading shows their version and drops your unsaved changes; note anything you need first.</Text>
        <Button label="Reload their version" variant="secondary" onPress={onReload} busy={reloading} testID={`${testID}-reload`} />
      </View>
    );
  }
  return (
    <View style={[styles.box, styles.error]} role="alert" testID={`${testID}-error`}>
      <Text style={[styles.text, styles.errorText]}>{outcome.message}</Text>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { padding: space.lg, borderRadius: radius.lg, borderWidth: 1, gap: space.sm, alignItems: 'flex-start' },
  text: { ...typeScale.body, color: colors.ink },
  strong: { fontFamily: fonts.semibold },
  saved: { backgroundColor: colors.passSoft, borderColor: colors.pass },
  savedText: { color: colors.pass, fontFamily: fonts.medium },
  conflict: { backgroundColor: colors.watchSoft, borderColor: colors.watch },
  error: { backgroundColor: colors.failSoft, borderColor: colors.fail },
  errorText: { color: colors.fail },
});
