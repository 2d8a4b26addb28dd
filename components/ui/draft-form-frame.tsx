import type { ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { colors, space, type as typeScale } from '@/constants/theme';

import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { UnitToggle } from '@/components/ui/unit-toggle';

type DraftFormFrameProps = {
  /** Fields before the unit toggle (names and notes, which have no unit). */
  head?: ReactNode;
  /** The line beside the toggle: what the numbers save in. */
  unitNote: string;
  volume?: boolean;
  loadError: Error | null;
  /** False while unit conversion loads: the number fields wait. */
  ready: boolean;
  /** The number fields, shown once unit conversion is ready. */
  children: ReactNode;
  /** A form-wide message (e.g. conversion still loading at submit). */
  rootError?: string;
  notice: ReactNode;
  /** Read-only: this line instead of the actions. */
  readOnlyNote: string | null;
  actions: ReactNode;
};

/** The frame of a form of numbers in the toggle's units: the toggle, the fields once units load, the save notice and the actions. */
export function DraftFormFrame({ head, unitNote, volume, loadError, ready, children, rootError, notice, readOnlyNote, actions }: DraftFormFrameProps) {
  return (
    <View style={styles.form}>
      {head}
      <View style={styles.toolbar}>
        <UnitToggle volume={volume} />
        <Text style={styles.note}>{unitNote}</Text>
      </View>
      {loadError ? <ErrorNotice error={loadError} /> : !ready ? <Pending label="Loading unit conversion…" /> : children}
      {rootError ? <ErrorNotice error={new Error(rootError)} /> : null}
      {notice}
      {readOnlyNote ? <Text style={styles.note}>{readOnlyNote}</Text> : <View style={styles.actions}>{actions}</View>}
    </View>
  );
}

const styles = StyleSheet.create({
  form: { gap: space.lg },
  toolbar: { gap: space.sm },
  actions: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', gap: space.md },
  note: { ...typeScale.small, color: colors.inkMuted },
});
