import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, type as typeScale, space } from '@/constants/theme';
import type { Revision } from '@/shared/sheets';

/**
 * The notes that travel with a revision: the profile's core notes as they stood when it was written, and the
 * revision's own note. The grinder's order page, its print and the spec sheet all show them the same way.
 */
export function RevisionNotes({ revision, testPrefix }: { revision: Revision; testPrefix: string }) {
  return (
    <View style={styles.stack}>
      <View style={styles.block}>
        <Text style={styles.label}>Core notes</Text>
        <Text style={styles.body} testID={`${testPrefix}-core-notes`}>
          {revision.coreNotes || 'No core notes on this profile.'}
        </Text>
      </View>
      <View style={styles.block}>
        <Text style={styles.label}>Note on revision {revision.number}</Text>
        <Text style={styles.body} testID={`${testPrefix}-notes`}>
          {revision.note || 'No note on this revision.'}
        </Text>
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.md },
  block: { gap: space.xs },
  label: { fontFamily: fonts.semibold, fontSize: 15, color: colors.ink },
  body: { ...typeScale.body, color: colors.ink },
});
