import * as DocumentPicker from 'expo-document-picker';
import { useMemo, useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useUploadLobesMutation } from '@/hooks/use-measurements';
import type { Measurement } from '@/shared/measurements';
import type { ProfileSpec } from '@/shared/profile';

import { Button } from '@/components/ui/button';
import { ChoiceGroup } from '@/components/ui/choice-group';
import type { LobeRow } from '@/lib/lobe-analysis';
import { LobeOverlay, useCalc } from '@/components/ui/lazy-calc';

type LobeBenchProps = {
  jobId: string;
  current: Measurement<'lobes'> | null;
  canWrite: boolean;
  /** Inches below the sibling median that counts as worn (the shop's limit). */
  threshold: number;
  spec: ProfileSpec | null;
  specName: string | null;
};

const inches = (v: number) => v.toFixed(3);
const degrees = (v: number) => v.toFixed(1).replace(/^-/, '−');

/** Upload a lobe table (CSV), read every lobe, flag worn ones, and draw one over the sheet's lobe. Suspends until calc's chunk has loaded. */
export function LobeBench({ jobId, current, canWrite, threshold, spec, specName }: LobeBenchProps) {
  const upload = useUploadLobesMutation(jobId);
  const [picked, setPicked] = useState<string | null>(null);
  const { analyzeLobes } = useCalc();
  const rows = useMemo(() => (current ? analyzeLobes(current.data, threshold) : []), [analyzeLobes, current, threshold]);
  const worn = rows.filter((r) => r.wear?.worn);
  const firstWorn = worn[0]?.id ?? null;
  const shownId = picked && rows.some((r) => r.id === picked) ? picked : (firstWorn ?? rows[0]?.id ?? null);
  const shownRow = rows.find((r) => r.id === shownId) ?? null;
  const shownPoints = current?.data.lobes.find((l) => l.id === shownId)?.points ?? [];

  const choose = async () => {
    const result = await DocumentPicker.getDocumentAsync({ type: ['.csv', 'text/csv'], multiple: false, copyToCacheDirectory: false });
    const asset = result.canceled ? null : result.assets[0];
    if (!asset) return;
    upload.reset();
    upload.mutate(asset, { onSuccess: () => setPicked(null) });
  };

  const error = upload.error;
  const fieldLines = error instanceof ApiError ? Object.entries(error.fields).filter(([k]) => k !== 'file') : [];

  return (
    <View style={styles.bench} testID="lobe-bench">
      <Text style={styles.help}>
        A CSV with a header row: <Text style={styles.code}>angle</Text> (crank degrees) or <Text style={styles.code}>cam_angle</Text>, then one column per lobe
        named by cylinder and valve (<Text style={styles.code}>1I, 1E, … 8E</Text>), lift in inches. A file with a bad cell is refused whole, naming the row and
        column.
      </Text>
      {canWrite ? (
        <Button
          label={upload.isPending ? 'Uploading the lobe table…' : current ? 'Upload a new lobe table' : 'Upload a lobe table'}
          onPress={choose}
          busy={upload.isPending}
          testID="lobes-upload"
        />
      ) : null}
      {upload.isPending ? (
        <Text role="status" aria-live="polite" style={styles.help} testID="lobes-uploading">
          Reading the table on the server…
        </Text>
      ) : null}
      {error ? (
        <View role="alert" style={styles.error} testID="lobes-upload-error">
          <Text style={styles.errorTitle}>{error.message}</Text>
          {fieldLines.map(([where, message]) => (
            <Text key={where} style={styles.errorLine}>
              {where}: {message}
            </Text>
          ))}
          <Text style={styles.errorLine}>Fix the file and upload it again.</Text>
        </View>
      ) : null}
      {current ? (
        <>
          <Text style={styles.meta} testID="lobes-file">
            {current.data.fileName || 'Lobe table'} · {current.data.lobes.length} lobes · uploaded {formatDateTime(current.createdAt)}
          </Text>
          {worn.length > 0 ? (
            <Text role="alert" style={styles.wornNote} testID="lobes-worn-summary">
              Worn: {worn.map((w) => `${w.id} (${inches(w.wear?.shortfall ?? 0)} in below its siblings)`).join(', ')}
            </Text>
          ) : (
            <Text style={styles.meta} testID="lobes-worn-summary">
              No lobe is more than {inches(threshold)} in below its siblings.
            </Text>
          )}
          <LobeTable rows={rows} />
          {shownRow?.analysis && shownId ? (
            <View style={styles.overlay}>
              <ChoiceGroup
                label="Lobe to draw"
                value={shownId}
                choices={rows.filter((r) => r.analysis).map((r) => ({ value: r.id, label: r.id }))}
                onChange={setPicked}
                testID="lobe-pick"
              />
              <LobeOverlay
                lobeId={shownId}
                points={shownPoints}
                centerline={shownRow.analysis.centerline}
                spec={spec ? spec[shownRow.kind] : null}
                specName={specName}
                testID="lobe-overlay"
              />
            </View>
          ) : null}
        </>
      ) : (
        <Text style={styles.meta}>No lobe table on this job yet.</Text>
      )}
    </View>
  );
}

function LobeTable({ rows }: { rows: LobeRow[] }) {
  return (
    <View role="table" aria-label="Measured lobes" style={styles.table} testID="lobes-table">
      <View role="row" style={[styles.row, styles.headRow]}>
        <Text role="columnheader" style={[styles.idCell, styles.head]}>
          Lobe
        </Text>
        <Text role="columnheader" style={[styles.cell, styles.head]}>
          Max lift (in)
        </Text>
        <Text role="columnheader" style={[styles.cell, styles.head]}>
          At 0.050 (°)
        </Text>
        <Text role="columnheader" style={[styles.cell, styles.head]}>
          Centreline (°)
        </Text>
        <Text role="columnheader" style={[styles.statusCell, styles.head]}>
          Wear
        </Text>
      </View>
      {rows.map((r) => (
        <View key={r.id} role="row" style={[styles.row, r.wear?.worn && styles.wornRow]} testID={`lobe-row-${r.id}`}>
          <Text role="rowheader" style={[styles.idCell, styles.idText]}>
            {r.id}
          </Text>
          {r.analysis ? (
            <>
              <Text role="cell" style={styles.cell}>
                {inches(r.analysis.maxLift)}
              </Text>
              <Text role="cell" style={styles.cell}>
                {degrees(r.analysis.durations[0]?.duration ?? 0)}
              </Text>
              <Text role="cell" style={styles.cell}>
                {degrees(r.analysis.centerline)}
              </Text>
              <Text role="cell" style={[styles.statusCell, r.wear?.worn ? styles.worn : styles.ok]} testID={`lobe-status-${r.id}`}>
                {r.wear ? (r.wear.worn ? `Worn −${inches(r.wear.shortfall)}` : 'OK') : '—'}
              </Text>
            </>
          ) : (
            <Text role="cell" style={[styles.problem]} testID={`lobe-status-${r.id}`}>
              {r.problem}
            </Text>
          )}
        </View>
      ))}
    </View>
  );
}

const styles = StyleSheet.create({
  bench: { gap: space.md },
  help: { ...typeScale.small, color: colors.inkMuted },
  code: { fontFamily: fonts.mono, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  error: { gap: space.xs, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.fail, backgroundColor: colors.failSoft },
  errorTitle: { ...typeScale.bodyStrong, color: colors.fail },
  errorLine: { ...typeScale.small, color: colors.ink },
  wornNote: { ...typeScale.bodyStrong, color: colors.fail },
  table: { borderTopWidth: 1, borderTopColor: colors.line },
  row: { flexDirection: 'row', alignItems: 'center', borderBottomWidth: 1, borderBottomColor: colors.grid, paddingVertical: space.xs, gap: space.xs },
  headRow: { borderBottomColor: colors.lineStrong },
  head: { fontFamily: fonts.semibold, fontSize: 12, lineHeight: 16, color: colors.inkMuted },
  wornRow: { backgroundColor: colors.failSoft },
  idCell: { width: 40, paddingLeft: space.xs },
  idText: { fontFamily: fonts.monoBold, fontSize: 14, color: colors.ink },
  cell: { flex: 1, ...typeScale.number, fontSize: 13, color: colors.ink, textAlign: 'right' },
  statusCell: { width: 92, fontFamily: fonts.semibold, fontSize: 13, textAlign: 'right', paddingRight: space.xs },
  worn: { color: colors.fail },
  ok: { color: colors.pass },
  problem: { flex: 1, ...typeScale.small, color: colors.fail },
  overlay: { gap: space.md },
});
