import { useState } from 'react';
import { StyleSheet, Text, TextInput, useWindowDimensions, View } from 'react-native';

import { FitsCorePanel } from '@/components/compare/fits-core';
import { Button } from '@/components/ui/button';
import { noteInput } from '@/components/ui/note-input';
import { ResultsSummaryChip } from '@/components/sheet/check-list';
import { ChoiceGroup } from '@/components/ui/choice-group';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { RevisionNotes } from '@/components/sheet/revision-notes';
import { RevisionView } from '@/components/sheet/revision-view';
import { SupersededChip } from '@/components/order/superseded';
import { Screen, Section, type BackLink } from '@/components/ui/screen';
import { IssuePanel, SheetOrders } from '@/components/sheet/sheet-orders';
import { formatDateTime } from '@/constants/format';
import { breakpoints, colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useMeQuery } from '@/hooks/use-me';
import { useRevisionQuery, useSaveSheetMutation, useSheetQuery } from '@/hooks/use-sheets';
import { diffRevisions } from '@/lib/revision-diff';
import { roleAllows } from '@/shared/roles';
import type { RevisionSummary, SheetWithHistory } from '@/shared/sheets';

export function SheetScreen({ id: jobId, sheetId }: { id: string; sheetId: string }) {
  const sheet = useSheetQuery(sheetId);
  const back: BackLink = { href: { pathname: '/jobs/[id]', params: { id: jobId } }, label: 'Back to the job' };
  if (sheet.isPending) return <Pending label="Loading the spec sheet…" />;
  if (sheet.isError) {
    const gone = sheet.error instanceof ApiError && sheet.error.status === 404;
    return (
      <Screen title="Spec sheet" back={back}>
        <ErrorNotice error={gone ? new Error('This spec sheet is not in your shop.') : sheet.error} onRetry={gone ? undefined : () => sheet.refetch()} />
      </Screen>
    );
  }
  return <SheetView sheet={sheet.data} back={back} />;
}

function SheetView({ sheet, back }: { sheet: SheetWithHistory; back: BackLink }) {
  const wide = useWindowDimensions().width >= breakpoints.wide;
  const role = useMeQuery().data?.activeShop?.role;
  const canWrite = roleAllows(role, { sheet: ['write'] });
  const canIssue = roleAllows(role, { sheet: ['issue'] });
  const current = sheet.current;
  const [shownNumber, setShownNumber] = useState<number | null>(null);
  // The history carries no results: an earlier revision is fetched in full when asked for.
  const olderNumber = shownNumber !== null && shownNumber !== current.number ? shownNumber : null;
  const older = useRevisionQuery(sheet.id, olderNumber);
  const shown = olderNumber === null ? current : older.data;
  const shownLabel = olderNumber ?? current.number;

  return (
    <Screen
      title={sheet.title}
      subtitle={`Revision ${current.number} (${current.state === 'draft' ? 'draft, not yet issued' : 'issued'}) · ${current.label}`}
      back={back}
      testID="sheet-screen"
    >
      <View style={wide ? styles.columns : styles.stack}>
        <View style={[wide ? styles.main : undefined, styles.stack]}>
          <Section title={shownLabel === current.number ? `Revision ${shownLabel}: current` : `Revision ${shownLabel}`}>
            {shown ? (
              <>
                <View style={styles.badges}>
                  <ResultsSummaryChip results={shown.results} testID="revision-status" />
                  <Text style={[styles.state, shown.state === 'issued' ? styles.issued : styles.draft]} testID="revision-state">
                    {shown.state === 'draft' ? 'Draft' : 'Issued'}
                  </Text>
                  <SupersededChip supersededBy={shown.supersededBy} testID="revision-superseded" />
                  <Text style={styles.meta}>saved {formatDateTime(shown.updatedAt)}</Text>
                </View>
                <RevisionView revision={shown} />
                <RevisionNotes revision={shown} testPrefix="sheet" />
              </>
            ) : older.isError ? (
              <ErrorNotice error={older.error} onRetry={() => older.refetch()} />
            ) : (
              <Pending label={`Loading revision ${shownLabel}…`} />
            )}
          </Section>
          {shown ? <FitsCorePanel feasibility={shown.results.feasibility} testID="sheet-fits-core" /> : null}
          {canWrite && shownLabel === current.number ? <NoteEditor key={`${current.id} ${current.state}`} sheet={sheet} /> : null}
        </View>
        <View style={[wide ? styles.side : undefined, styles.stack]}>
          {canIssue ? <IssuePanel sheet={sheet} /> : null}
          <SheetOrders sheetId={sheet.id} canMove={canIssue} />
          <Section title="Revision history">
            <View role="list" style={styles.history}>
              {[...sheet.revisions].reverse().map((r) => (
                <View key={r.id} role="listitem" style={[styles.historyItem, r.number === shownLabel && styles.historyActive]} testID={`history-${r.number}`}>
                  <View style={styles.grow}>
                    <Text style={styles.historyTitle}>
                      Revision {r.number} · {r.state === 'issued' ? 'issued' : r.number === current.number ? 'draft' : 'earlier draft'}
                      {r.supersededBy && r.state === 'issued' ? `, superseded by revision ${r.supersededBy.number}` : ''}
                    </Text>
                    <Text style={styles.meta}>
                      {r.label} · {formatDateTime(r.updatedAt)}
                    </Text>
                  </View>
                  {r.number !== shownLabel ? (
                    <Button label="Show" variant="quiet" onPress={() => setShownNumber(r.number)} testID={`show-revision-${r.number}`} />
                  ) : null}
                </View>
              ))}
            </View>
          </Section>
          {sheet.revisions.length > 1 ? <RevisionDiff revisions={sheet.revisions} /> : null}
        </View>
      </View>
    </Screen>
  );
}

function NoteEditor({ sheet }: { sheet: SheetWithHistory }) {
  const save = useSaveSheetMutation(sheet.id);
  const issued = sheet.current.state === 'issued';
  // An issued revision's note stays with it: the next revision's note starts empty.
  const [note, setNote] = useState(issued ? '' : sheet.current.note);
  return (
    <Section title="Note for this revision">
      <Text style={styles.meta}>
        {issued ? 'This revision is issued and will not change: saving starts the next revision.' : 'The draft can change until it is issued.'}
      </Text>
      <TextInput accessibilityLabel="Note for this revision" value={note} onChangeText={setNote} multiline style={styles.note} testID="sheet-note" />
      {save.isError ? <ErrorNotice error={save.error} /> : null}
      <Button
        label={issued ? `Save as revision ${sheet.current.number + 1}` : 'Save note'}
        onPress={() => save.mutate({ version: sheet.version, note })}
        busy={save.isPending}
        disabled={issued ? note.trim() === '' : note === sheet.current.note}
        testID="save-note"
      />
    </Section>
  );
}

function RevisionDiff({ revisions }: { revisions: RevisionSummary[] }) {
  const numbers = revisions.map((r) => r.number);
  const [a, setA] = useState(numbers[numbers.length - 2] ?? 1);
  const [b, setB] = useState(numbers[numbers.length - 1] ?? 1);
  const left = revisions.find((r) => r.number === a);
  const right = revisions.find((r) => r.number === b);
  const changes = left && right ? diffRevisions(left, right) : [];
  const choices = numbers.map((n) => ({ value: String(n), label: `Rev ${n}` }));
  return (
    <Section title="Compare two revisions">
      <ChoiceGroup label="From" value={String(a)} choices={choices} onChange={(v) => setA(Number(v))} testID="diff-from" />
      <ChoiceGroup label="To" value={String(b)} choices={choices} onChange={(v) => setB(Number(v))} testID="diff-to" />
      {changes.length === 0 ? (
        <Text style={styles.body}>
          Revisions {a} and {b} hold the same values.
        </Text>
      ) : (
        <View role="table" aria-label={`Changes from revision ${a} to ${b}`} testID="revision-diff">
          {changes.map((c) => (
            <View key={c.path} role="row" style={styles.diffRow}>
              <Text role="rowheader" style={styles.diffLabel}>
                {c.label}
              </Text>
              <Text role="cell" style={styles.diffValue}>
                {c.from || '(empty)'} → {c.to || '(empty)'}
              </Text>
            </View>
          ))}
        </View>
      )}
    </Section>
  );
}

const styles = StyleSheet.create({
  stack: { gap: space.lg },
  columns: { flexDirection: 'row', gap: space.xl, alignItems: 'flex-start' },
  main: { flex: 3, minWidth: 0 },
  side: { flex: 2, minWidth: 0 },
  badges: { flexDirection: 'row', alignItems: 'center', gap: space.sm, flexWrap: 'wrap' },
  state: {
    fontFamily: fonts.bold,
    fontSize: 12,
    textTransform: 'uppercase',
    letterSpacing: 0.5,
    paddingHorizontal: space.sm,
    paddingVertical: 2,
    borderRadius: radius.sm,
    overflow: 'hidden',
  },
  draft: { color: colors.ink, backgroundColor: colors.sunken },
  issued: { color: colors.accentInk, backgroundColor: colors.accent },
  meta: { ...typeScale.small, color: colors.inkMuted },
  body: { ...typeScale.body, color: colors.ink },
  history: { gap: space.xs },
  historyItem: {
    flexDirection: 'row',
    alignItems: 'center',
    gap: space.sm,
    padding: space.sm,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
  },
  historyActive: { borderColor: colors.accent, backgroundColor: colors.accentSoft },
  historyTitle: { fontFamily: fonts.semibold, fontSize: 15, color: colors.ink },
  grow: { flex: 1, gap: 2 },
  note: noteInput,
  diffRow: { paddingVertical: space.xs, borderBottomWidth: 1, borderBottomColor: colors.grid, gap: 2 },
  diffLabel: { ...typeScale.small, color: colors.inkMuted },
  diffValue: { ...typeScale.number, fontSize: 14, color: colors.ink },
});
