import { StyleSheet, View } from 'react-native';

import { space } from '@/constants/theme';
import type { ProfileSpec } from '@/shared/profile';
import { draftFields, draftText, type DraftPath, type ProfileDraft } from '@/lib/profile-draft';

import { TextField } from '@/components/ui/text-field';

type ProfileDraftEditorProps = {
  spec: ProfileSpec;
  draft: ProfileDraft;
  errors: Partial<Record<string, string>>;
  onChange: (path: DraftPath, text: string) => void;
  testID: string;
};

/** The values a builder tries on the compare screen; every keystroke recomputes the analysis in the browser. */
export function ProfileDraftEditor({ spec, draft, errors, onChange, testID }: ProfileDraftEditorProps) {
  return (
    <View style={styles.grid} testID={testID}>
      {draftFields.map((field) => (
        <View key={field.path} style={styles.cell}>
          <TextField
            label={field.label}
            unit={field.unit}
            value={draftText(spec, draft, field.path)}
            onChangeText={(text) => onChange(field.path, text)}
            keyboardType="decimal-pad"
            error={errors[field.path]}
            testID={`${testID}-${field.path}`}
          />
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  cell: { flexGrow: 1, flexBasis: 160 },
});
