import { StyleSheet, Text, View } from 'react-native';

import { colors, space, type as typeScale } from '@/constants/theme';
import type { Sheet } from '@/shared/sheets';

import { ChoiceGroup } from '@/components/ui/choice-group';

/** Picks which of the job's spec sheets the checks and overlays use. */
export function SheetChoice({ sheets, value, onChange }: { sheets: readonly Sheet[]; value: string | null; onChange: (id: string) => void }) {
  if (sheets.length === 0 || value === null) {
    return (
      <View style={styles.box}>
        <Text style={styles.text} testID="no-sheet">
          This job has no spec sheet yet. The builder starts one from the job page; fit checks run against it.
        </Text>
      </View>
    );
  }
  return (
    <ChoiceGroup
      label="Spec sheet to check against"
      value={value}
      choices={sheets.map((s) => ({ value: s.id, label: `${s.title} · rev ${s.current.number}` }))}
      onChange={onChange}
      testID="sheet-choice"
    />
  );
}

const styles = StyleSheet.create({
  box: { paddingVertical: space.xs },
  text: { ...typeScale.body, color: colors.inkMuted },
});
