import { useState } from 'react';
import { Pressable, StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, touchTarget, type as typeScale } from '@/constants/theme';
import { useAddChecklistItemMutation, useChecklistQuery, useRemoveChecklistItemMutation, useTickChecklistItemMutation } from '@/hooks/use-checklist';
import { checklistAddSchema, type ChecklistItem } from '@/shared/measurements';

import { Button } from '@/components/ui/button';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { TextField } from '@/components/ui/text-field';

/** The regrind job's checklist: tick items off (with who and when), add the shop's own, remove ones that do not apply. */
export function JobChecklist({ jobId, canWrite }: { jobId: string; canWrite: boolean }) {
  const items = useChecklistQuery(jobId);
  const add = useAddChecklistItemMutation(jobId);
  const [label, setLabel] = useState('');
  const [problem, setProblem] = useState<string | null>(null);

  const submit = () => {
    const parsed = checklistAddSchema.safeParse({ label });
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'Write the item');
      return;
    }
    setProblem(null);
    add.mutate(parsed.data.label, {
      onSuccess: () => setLabel(''),
      onError: (error) => setProblem(error.message),
    });
  };

  const done = items.data?.filter((i) => i.doneAt).length ?? 0;
  return (
    <Section title="Job checklist">
      {items.isPending ? (
        <Pending label="Loading the checklist…" />
      ) : items.isError ? (
        <ErrorNotice error={items.error} onRetry={() => items.refetch()} />
      ) : (
        <>
          <Text style={styles.meta} testID="checklist-progress">
            {done} of {items.data.length} done
          </Text>
          <View role="list" style={styles.list} testID="checklist">
            {items.data.map((item, i) => (
              <ChecklistRow key={item.id} jobId={jobId} item={item} index={i} canWrite={canWrite} />
            ))}
          </View>
        </>
      )}
      {canWrite ? (
        <View style={styles.add}>
          <View style={styles.addField}>
            <TextField
              label="Add an item"
              value={label}
              onChangeText={setLabel}
              onSubmitEditing={submit}
              maxLength={200}
              error={problem ?? undefined}
              testID="checklist-new"
            />
          </View>
          <Button label="Add" variant="secondary" onPress={submit} busy={add.isPending} testID="checklist-add" />
        </View>
      ) : null}
    </Section>
  );
}

function ChecklistRow({ jobId, item, index, canWrite }: { jobId: string; item: ChecklistItem; index: number; canWrite: boolean }) {
  const tick = useTickChecklistItemMutation(jobId);
  const remove = useRemoveChecklistItemMutation(jobId);
  const checked = item.doneAt !== null;
  return (
    <View role="listitem" style={styles.item} testID={`checklist-item-${index}`}>
      <Pressable
        role="checkbox"
        aria-checked={checked}
        aria-label={item.label}
        disabled={!canWrite || tick.isPending}
        onPress={() => tick.mutate({ id: item.id, done: !checked })}
        style={styles.tick}
        testID={`checklist-tick-${index}`}
      >
        <View style={[styles.box, checked && styles.boxOn]}>{checked ? <Text style={styles.mark}>✓</Text> : null}</View>
        <View style={styles.texts}>
          <Text style={[styles.label, checked && styles.labelDone]}>{item.label}</Text>
          {checked && item.doneAt ? (
            <Text style={styles.meta} testID={`checklist-done-${index}`}>
              Done by {item.doneBy?.name ?? 'someone no longer in the shop'}, {formatDateTime(item.doneAt)}
            </Text>
          ) : null}
        </View>
      </Pressable>
      {canWrite ? (
        <Button
          label="Remove"
          variant="quiet"
          aria-label={`Remove "${item.label}" from the checklist`}
          busy={remove.isPending}
          onPress={() => remove.mutate(item.id)}
          testID={`checklist-remove-${index}`}
        />
      ) : null}
      {tick.error || remove.error ? (
        <Text role="alert" style={styles.problem}>
          {(tick.error ?? remove.error)?.message}
        </Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  list: { gap: space.xs },
  item: {
    flexDirection: 'row',
    flexWrap: 'wrap',
    alignItems: 'center',
    gap: space.sm,
    borderBottomWidth: 1,
    borderBottomColor: colors.grid,
    paddingVertical: space.xs,
  },
  tick: { flexDirection: 'row', alignItems: 'flex-start', gap: space.md, flex: 1, minWidth: 200, minHeight: touchTarget, paddingVertical: space.xs },
  box: {
    width: 26,
    height: 26,
    marginTop: 1,
    borderRadius: radius.sm,
    borderWidth: 2,
    borderColor: colors.lineStrong,
    backgroundColor: colors.surface,
    alignItems: 'center',
    justifyContent: 'center',
  },
  boxOn: { backgroundColor: colors.accent, borderColor: colors.accent },
  mark: { fontFamily: fonts.bold, fontSize: 16, lineHeight: 18, color: colors.accentInk },
  texts: { flex: 1, gap: 2 },
  label: { ...typeScale.body, color: colors.ink },
  labelDone: { color: colors.inkMuted },
  meta: { ...typeScale.small, color: colors.inkMuted },
  problem: { ...typeScale.small, color: colors.fail, width: '100%' },
  add: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'flex-end', gap: space.sm },
  addField: { flexGrow: 1, flexBasis: 220 },
});
