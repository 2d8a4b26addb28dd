import { StyleSheet, Text, View } from 'react-native';

import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { degreeReadout, type TypedReadings } from '@/lib/degree-readout';

type DegreeReadoutProps = TypedReadings & {
  /** The chosen sheet's intake centreline, crank degrees ATDC, and its name, when a sheet is chosen. */
  sheet: { icl: number; name: string } | null;
};

/** True TDC from the piston stops and the corrected intake centreline from the flank readings, worked out as the tech types. */
export function DegreeReadout({ sheet, ...typed }: DegreeReadoutProps) {
  const view = degreeReadout(typed, sheet);
  return (
    <View style={styles.box} role="region" aria-label="Worked out from the readings" testID="degree-readout">
      <View style={styles.item}>
        <Text style={styles.label}>True TDC on the wheel</Text>
        <Text style={styles.value} testID="degree-true-tdc">
          {view.trueTdc}
        </Text>
      </View>
      <View style={styles.item}>
        <Text style={styles.label}>Intake centreline (ICL)</Text>
        <Text style={[styles.value, view.problem ? styles.problem : null]} testID="degree-icl">
          {view.icl}
        </Text>
        {view.comparison ? (
          <Text style={styles.note} testID="degree-compare">
            {view.comparison}
          </Text>
        ) : null}
      </View>
    </View>
  );
}

const styles = StyleSheet.create({
  box: { gap: space.md, padding: space.md, borderRadius: radius.md, backgroundColor: colors.accentSoft },
  item: { gap: 2 },
  label: { ...typeScale.label, color: colors.ink },
  value: { ...typeScale.number, color: colors.ink, fontFamily: fonts.monoBold },
  problem: { color: colors.fail },
  note: { ...typeScale.small, color: colors.ink },
});
