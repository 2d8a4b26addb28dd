import { StyleSheet, Text } from 'react-native';

import { colors, type as typeScale } from '@/constants/theme';

/** The phone apps have no print dialog here: the sheet prints from Lobewright in a web browser. */
export function PrintButton() {
  return (
    <Text style={styles.note} testID="print-sheet-note">
      Open this order in Lobewright on the web to print the sheet.
    </Text>
  );
}

const styles = StyleSheet.create({
  note: { ...typeScale.small, color: colors.inkMuted },
});
