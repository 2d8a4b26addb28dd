import { useAtom } from 'jotai';
import { StyleSheet, View } from 'react-native';

import { space } from '@/constants/theme';
import { lengthSystemAtom, volumeUnitAtom, type LengthSystem, type VolumeUnit } from '@/state/units';

import { ChoiceGroup } from '@/components/ui/choice-group';

const lengthChoices: readonly { value: LengthSystem; label: string }[] = [
  { value: 'imperial', label: 'in · lbf' },
  { value: 'metric', label: 'mm · N' },
];
const volumeChoices: readonly { value: VolumeUnit; label: string }[] = [
  { value: 'cc', label: 'cc' },
  { value: 'in3', label: 'in³' },
];

/** Chooses the units number fields show in. Saved values stay in inches, cc, lbf and lbf/in whatever is chosen. */
export function UnitToggle({ volume = true }: { volume?: boolean }) {
  const [lengthSystem, setLengthSystem] = useAtom(lengthSystemAtom);
  const [volumeUnit, setVolumeUnit] = useAtom(volumeUnitAtom);
  return (
    <View style={styles.row}>
      <ChoiceGroup label="Lengths, loads and rates" value={lengthSystem} choices={lengthChoices} onChange={setLengthSystem} testID="unit-length" />
      {volume ? <ChoiceGroup label="Volumes" value={volumeUnit} choices={volumeChoices} onChange={setVolumeUnit} testID="unit-volume" /> : null}
    </View>
  );
}

const styles = StyleSheet.create({
  row: { flexDirection: 'row', flexWrap: 'wrap', gap: space.lg },
});
