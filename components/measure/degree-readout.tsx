import { StyleSheet, Text, View } from 'react-native';

import { centerlineFromReadings, degreeCam } from '@/calc/degree';
import { isCalcInputError } from '@/calc/errors';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';

/** The readings as typed so far, crank degrees; null while blank or not a number. */
type DegreeReadoutProps = {
  stopBefore: number | null;
  stopAfter: number | null;
  openingAngle: number | null;
  closingAngle: number | null;
  /** The chosen sheet's intake centreline, crank degrees ATDC, when a sheet is chosen. */
  sheetIcl: number | null;
  sheetName: string | null;
};

const deg = (v: number) => `${v.toFixed(1).replace(/^-/, '−')}°`;

/** True TDC from the piston stops and the intake centreline from the flank readings, worked out as the tech types. */
export function DegreeReadout({ stopBefore, stopAfter, openingAngle, closingAngle, sheetIcl, sheetName }: DegreeReadoutProps) {
  const [before, after, open, close] = [stopBefore, stopAfter, openingAngle, closingAngle];
  const tdcOffset = before !== null && after !== null ? (after - before) / 2 : null;

  let icl: number | null = null;
  let iclProblem: string | null = null;
  let comparison: string | null = null;
  if (open !== null && close !== null) {
    try {
      icl = centerlineFromReadings({ openingAngle: open, closingAngle: close });
      if (sheetIcl !== null) {
        const d = degreeCam({ openingAngle: open, closingAngle: close, sheetIcl });
        comparison =
          d.correction === 'none'
            ? `Within ${d.tolerance}° of ${sheetName ?? 'the sheet'} (${deg(d.sheetIcl)}): no correction needed.`
            : `${deg(Math.abs(d.difference))} ${d.difference > 0 ? 'later' : 'earlier'} than ${sheetName ?? 'the sheet'} (${deg(d.sheetIcl)}): ${d.correction} the cam ${deg(d.correctionDegrees)}.`;
      }
    } catch (error) {
      iclProblem = isCalcInputError(error)
        ? `The closing-flank angle ${error.message.replace(/^closingAngle:?\s*/, '').replace('openingAngle', 'the opening-flank angle')}`
        : 'Check the flank angles.';
    }
  }

  return (
    <View style={styles.box} role="region" aria-label="Worked out from the readings" testID="degree-readout">
      <View style={styles.item}>
        <Text style={styles.label}>True TDC on the wheel</Text>
        <Text style={styles.value} testID="degree-true-tdc">
          {tdcOffset === null
            ? 'Enter both piston stops'
            : tdcOffset === 0
              ? '0.0°: the pointer is on true TDC'
              : `${deg(Math.abs(tdcOffset))} ${tdcOffset > 0 ? 'ATDC' : 'BTDC'}: move the pointer there before reading the flanks`}
        </Text>
      </View>
      <View style={styles.item}>
        <Text style={styles.label}>Intake centreline (ICL)</Text>
        <Text style={[styles.value, iclProblem ? styles.problem : null]} testID="degree-icl">
          {iclProblem ?? (icl === null ? 'Enter both flank angles' : `${deg(icl)} ATDC`)}
        </Text>
        {comparison ? (
          <Text style={styles.note} testID="degree-compare">
            {comparison}
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
