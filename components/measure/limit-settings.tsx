import { useEffect, useState } from 'react';
import { useWatch, type FieldPath } from 'react-hook-form';
import { StyleSheet, Text, View } from 'react-native';

import type { CheckLimitOverrides } from '@/calc/checks';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useSaveShopLimitsMutation, type ShopLimitsAnswer } from '@/hooks/use-shop-limits';
import { draftFromValue } from '@/lib/number-draft';
import {
  limitDraftFrom,
  limitFieldPaths,
  limitOverridesSchema,
  limitRules,
  limitSpec,
  limitSpecs,
  ruleText,
  type LimitDraft,
  type LimitRule,
} from '@/lib/limit-fields';

import { Button } from '@/components/ui/button';
import { DraftField, useDraftForm } from '@/components/ui/number-field';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { outcomeOfError, SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { UnitToggle } from '@/components/ui/unit-toggle';

/**
 * The shop's check limits: each rule's default with its source, the shop's
 * own value (blank = use the default), and reset. Builders edit; others read.
 * Built from `limitRules`, one card per rule. Lengths follow the unit toggle
 * and save in inches. A newer answer (after a save or a reload) replaces the drafts and keeps the notice.
 */
export function LimitSettings({ answer, canEdit, onReload }: { answer: ShopLimitsAnswer; canEdit: boolean; onReload: () => void }) {
  const save = useSaveShopLimitsMutation();
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);
  const { form, units, loadError } = useDraftForm<LimitDraft, CheckLimitOverrides>({
    specs: limitSpecs,
    schema: limitOverridesSchema,
    others: () => ({}),
    defaultValues: limitDraftFrom(answer.limits),
  });
  const { control, handleSubmit, setError, setValue, reset: resetForm } = form;
  const drafts = useWatch({ control });
  useEffect(() => {
    resetForm(limitDraftFrom(answer.limits));
  }, [answer, resetForm]);

  const submit = handleSubmit(
    async (limits) => {
      setOutcome(null);
      try {
        await save.mutateAsync({ version: answer.version, limits });
        setOutcome({ kind: 'saved', message: 'Saved. The next fit-check run uses these limits.' });
      } catch (error) {
        setOutcome(
          outcomeOfError(error, limitFieldPaths, 'limits.', (path, message) =>
            setError(path as FieldPath<LimitDraft>, { type: 'server', message }, { shouldFocus: true }),
          ),
        );
      }
    },
    () => setOutcome({ kind: 'error', message: 'Not saved. Fix the fields marked in red, then save again.' }),
  );

  const reset = (rule: LimitRule) => {
    for (const part of rule.parts) {
      const spec = limitSpec(rule, part);
      setValue(spec.path as FieldPath<LimitDraft>, draftFromValue(spec, null) as never, { shouldDirty: true });
    }
  };

  if (loadError) return <ErrorNotice error={loadError} />;
  if (!units) return <Pending label="Loading unit conversion…" />;
  return (
    <View style={styles.wrap} testID="limit-settings">
      <UnitToggle volume={false} />
      <View style={styles.grid}>
        {limitRules.map((rule) => {
          const def = answer.defaults[rule.key];
          const now = answer.resolved[rule.key];
          const changed = rule.parts.some((part) => (drafts[rule.key]?.[part]?.text ?? '') !== '');
          return (
            <View key={rule.key} style={styles.rule} testID={`limit-${rule.key}`}>
              <Text role="heading" aria-level={3} style={styles.title}>
                {rule.title}
              </Text>
              <Text style={styles.what}>{rule.what}</Text>
              <Text style={styles.line}>
                Default: {ruleText(rule, def, units)} — {def.source}
              </Text>
              <Text style={styles.line} testID={`limit-${rule.key}-applies`}>
                In use: {ruleText(rule, now, units)} — {now.source}
              </Text>
              <View style={styles.fields}>
                {rule.parts.map((part) => (
                  <View key={part} style={styles.field}>
                    <DraftField control={control} spec={limitSpec(rule, part)} units={units} editable={canEdit} testPrefix="limit" />
                  </View>
                ))}
              </View>
              {canEdit && changed ? (
                <Button
                  label="Reset to default"
                  variant="quiet"
                  aria-label={`Reset to default: ${rule.title.toLowerCase()}`}
                  onPress={() => reset(rule)}
                  testID={`limit-${rule.key}-reset`}
                />
              ) : null}
            </View>
          );
        })}
      </View>
      {canEdit ? (
        <Button label="Save limits" onPress={submit} busy={save.isPending} testID="limits-save" />
      ) : (
        <Text style={styles.what}>Only a builder in this shop changes these limits.</Text>
      )}
      <SaveNotice outcome={outcome} onReload={onReload} reloading={false} testID="limits" />
    </View>
  );
}

const styles = StyleSheet.create({
  wrap: { gap: space.lg },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  rule: {
    flexGrow: 1,
    flexBasis: 320,
    gap: space.xs,
    padding: space.md,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.surface,
  },
  title: { ...typeScale.bodyStrong, color: colors.ink },
  what: { ...typeScale.small, color: colors.inkMuted },
  line: { ...typeScale.small, color: colors.ink, fontFamily: fonts.regular },
  fields: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm, marginTop: space.xs },
  field: { flexGrow: 1, flexBasis: 120 },
});
