import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import type { CheckLimitOverrides, CheckLimits } from '@/calc/checks';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useSaveShopLimitsMutation, type ShopLimitsAnswer } from '@/hooks/use-shop-limits';
import { parseNumberText } from '@/lib/number-draft';

import { Button } from '@/components/ui/button';
import { SaveNotice, type SaveOutcome } from '@/components/ui/save-notice';
import { TextField } from '@/components/ui/text-field';

type RuleKey = keyof CheckLimits;
type Part = 'min' | 'max' | 'watchBand' | 'value';

const rules: { key: RuleKey; title: string; unit: string; parts: Part[]; what: string }[] = [
  { key: 'ptvIntake', title: 'Piston-to-valve, intake', unit: 'in', parts: ['min', 'watchBand'], what: 'least clearance through overlap' },
  { key: 'ptvExhaust', title: 'Piston-to-valve, exhaust', unit: 'in', parts: ['min', 'watchBand'], what: 'least clearance through overlap' },
  { key: 'coilBind', title: 'Coil-bind margin', unit: 'in', parts: ['min', 'watchBand'], what: 'spring height above coil bind at max lift' },
  { key: 'retainerToSeal', title: 'Retainer-to-seal', unit: 'in', parts: ['min', 'watchBand'], what: 'clearance at max lift' },
  { key: 'hydraulicPreload', title: 'Lifter preload', unit: 'in', parts: ['min', 'max', 'watchBand'], what: 'plunger travel used by preload' },
  { key: 'degreeing', title: 'Cam degreed in', unit: '°', parts: ['max', 'watchBand'], what: 'measured ICL away from the sheet' },
  { key: 'wornLobe', title: 'Lobe wear', unit: 'in', parts: ['max', 'watchBand'], what: 'max lift below its siblings' },
  { key: 'dynamicCompression', title: 'Dynamic compression', unit: ':1', parts: ['max', 'watchBand'], what: 'for pump fuel' },
  { key: 'finishingStock', title: 'Finishing stock', unit: 'in', parts: ['min', 'watchBand'], what: 'metal left between the old lobe and the new one, on the radius' },
  { key: 'cleanupAllowance', title: 'Cleanup allowance', unit: 'in', parts: ['value'], what: 'ground off below the deepest damage so the new surface is clean' },
  { key: 'largestCut', title: 'Largest cut', unit: 'in', parts: ['value'], what: 'base-circle cut on the diameter the hardened layer allows' },
  { key: 'pressureAngle', title: 'Largest pressure angle', unit: '°', parts: ['max', 'watchBand'], what: 'push of the lobe against the roller, sideways' },
  { key: 'rollerDiameter', title: 'Lifter roller diameter', unit: 'in', parts: ['value'], what: 'for pressure angle and lobe radius' },
  { key: 'wheelRadius', title: 'Grinding wheel radius', unit: 'in', parts: ['value'], what: 'a concave flank tighter than the wheel cannot be ground' },
];

const partLabel: Record<Part, string> = { min: 'Minimum', max: 'Maximum', watchBand: 'Watch band', value: 'Value' };

type Draft = Record<RuleKey, Partial<Record<Part, string>>>;

function ruleNumber(rule: CheckLimits[RuleKey], part: Part): number | string {
  const v = (rule as unknown as Record<string, unknown>)[part];
  return typeof v === 'number' ? v : 'not set';
}

function draftFrom(answer: ShopLimitsAnswer): Draft {
  const draft = {} as Draft;
  for (const r of rules) {
    const own = (answer.limits[r.key] ?? {}) as Partial<Record<Part, number>>;
    draft[r.key] = Object.fromEntries(r.parts.map((p) => [p, own[p] === undefined ? '' : String(own[p])]));
  }
  return draft;
}

/**
 * The shop's check limits: each rule's default with its source, the shop's
 * own value (blank = use the default), and reset. Builders edit; others read.
 * Keyed by version by the caller, so a newer save replaces the drafts.
 */
export function LimitSettings({ answer, canEdit, onReload }: { answer: ShopLimitsAnswer; canEdit: boolean; onReload: () => void }) {
  const save = useSaveShopLimitsMutation();
  const [draft, setDraft] = useState<Draft>(() => draftFrom(answer));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [outcome, setOutcome] = useState<SaveOutcome | null>(null);

  const set = (key: RuleKey, part: Part, text: string) => setDraft((d) => ({ ...d, [key]: { ...d[key], [part]: text } }));

  const submit = async () => {
    const limits: CheckLimitOverrides = {};
    const found: Record<string, string> = {};
    for (const r of rules) {
      const own: Partial<Record<Part, number>> = {};
      for (const p of r.parts) {
        const text = draft[r.key][p] ?? '';
        const n = parseNumberText(text);
        if (n === null) continue;
        if (Number.isNaN(n)) found[`${r.key}.${p}`] = `${partLabel[p]} must be a number (${r.unit})`;
        else own[p] = n;
      }
      if (Object.keys(own).length > 0) (limits as Record<string, unknown>)[r.key] = own;
    }
    setErrors(found);
    if (Object.keys(found).length > 0) {
      setOutcome({ kind: 'error', message: 'Not saved. Fix the fields marked in red, then save again.' });
      return;
    }
    try {
      await save.mutateAsync({ version: answer.version, limits });
      setOutcome({ kind: 'saved', message: 'Saved. The next fit-check run uses these limits.' });
    } catch (error) {
      if (error instanceof ApiError && error.status === 409) return setOutcome({ kind: 'conflict', message: error.message });
      if (error instanceof ApiError && Object.keys(error.fields).length > 0) {
        setErrors(Object.fromEntries(Object.entries(error.fields).map(([k, v]) => [k.replace(/^limits\./, ''), v])));
      }
      setOutcome({ kind: 'error', message: `Not saved. ${error instanceof Error ? error.message : 'Try again.'}` });
    }
  };

  return (
    <View style={styles.wrap} testID="limit-settings">
      <View style={styles.grid}>
        {rules.map((r) => {
          const def = answer.defaults[r.key];
          const now = answer.resolved[r.key];
          const changed = r.parts.some((p) => (draft[r.key][p] ?? '') !== '');
          return (
            <View key={r.key} style={styles.rule} testID={`limit-${r.key}`}>
              <Text role="heading" aria-level={3} style={styles.title}>
                {r.title}
              </Text>
              <Text style={styles.what}>{r.what}</Text>
              <Text style={styles.line}>
                Default:{' '}
                {r.parts.map((p) => `${partLabel[p].toLowerCase()} ${ruleNumber(def, p)} ${r.unit}`).join(', ')} — {def.source}
              </Text>
              <Text style={styles.line} testID={`limit-${r.key}-applies`}>
                In use: {r.parts.map((p) => `${partLabel[p].toLowerCase()} ${ruleNumber(now, p)} ${r.unit}`).join(', ')} — {now.source}
              </Text>
              <View style={styles.fields}>
                {r.parts.map((p) => (
                  <View key={p} style={styles.field}>
                    <TextField
                      label={`Shop ${partLabel[p].toLowerCase()}`}
                      unit={r.unit}
                      value={draft[r.key][p] ?? ''}
                      onChangeText={(t) => set(r.key, p, t)}
                      placeholder={`default ${ruleNumber(def, p)}`}
                      editable={canEdit}
                      inputMode="decimal"
                      error={errors[`${r.key}.${p}`]}
                      testID={`limit-${r.key}-${p}`}
                    />
                  </View>
                ))}
              </View>
              {canEdit && changed ? (
                <Button
                  label="Reset to default"
                  variant="quiet"
                  aria-label={`Reset to default: ${r.title.toLowerCase()}`}
                  onPress={() => setDraft((d) => ({ ...d, [r.key]: Object.fromEntries(r.parts.map((p) => [p, ''])) }))}
                  testID={`limit-${r.key}-reset`}
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
