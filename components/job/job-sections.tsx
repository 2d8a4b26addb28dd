import { Link } from 'expo-router';
import { useState } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, type as typeScale } from '@/constants/theme';
import { useEngineQuery } from '@/hooks/use-engine';
import { useCreateProfileMutation, useJobProfilesQuery, useLibraryProfilesQuery } from '@/hooks/use-profiles';
import { useJobSheetsQuery } from '@/hooks/use-sheets';
import { lifterTypeLabels } from '@/shared/engine';
import type { Profile } from '@/shared/profile';

import { Button } from '@/components/ui/button';
import { ResultsSummaryChip } from '@/components/sheet/check-list';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';

const n = (v: number, digits: number) => v.toFixed(digits);

/** The job's engine in one glance, with the way to enter or edit it. */
export function EngineSummary({ jobId, canWrite }: { jobId: string; canWrite: boolean }) {
  const engine = useEngineQuery(jobId);
  return (
    <Section title="Engine">
      {engine.isPending ? (
        <Pending label="Loading the engine…" />
      ) : engine.isError ? (
        <ErrorNotice error={engine.error} onRetry={() => engine.refetch()} />
      ) : engine.data ? (
        <View style={styles.facts} testID="engine-summary">
          <Fact label="Bore × stroke" value={`${n(engine.data.engine.bore, 3)} × ${n(engine.data.engine.stroke, 3)} in`} />
          <Fact label="Rod" value={`${n(engine.data.engine.rodLength, 3)} in`} />
          <Fact label="Chamber" value={`${n(engine.data.engine.chamberCc, 1)} cc`} />
          <Fact label="Rockers I / E" value={`${n(engine.data.engine.rockerRatioIntake, 2)} / ${n(engine.data.engine.rockerRatioExhaust, 2)}`} />
          <Fact label="Lifters" value={lifterTypeLabels[engine.data.engine.lifterType]} />
          <Fact label="Spring" value={`${n(engine.data.engine.spring.seatLoad, 0)} lbf @ ${n(engine.data.engine.spring.installedHeight, 3)} in`} />
        </View>
      ) : (
        <Text style={styles.body}>No engine entered yet. The comparison and fit checks need its geometry.</Text>
      )}
      {canWrite || engine.data ? (
        <Button
          label={engine.data ? (canWrite ? 'Edit engine' : 'View engine') : 'Enter the engine'}
          variant="secondary"
          href={`/jobs/${jobId}/engine`}
          testID="open-engine"
        />
      ) : null}
    </Section>
  );
}

function Fact({ label, value }: { label: string; value: string }) {
  return (
    <View style={styles.fact}>
      <Text style={styles.factLabel}>{label}</Text>
      <Text style={styles.factValue}>{value}</Text>
    </View>
  );
}

function profileLine(p: Profile) {
  const { intake: i, exhaust: e } = p.spec;
  return `${n(i.duration050, 0)}°/${n(e.duration050, 0)}° at 0.050 in · ${n(i.lobeLift, 3)}/${n(e.lobeLift, 3)} in lobe · ${n(p.spec.lsa, 1)}° LSA · ICL ${n(p.spec.icl, 1)}°`;
}

/** Profiles on this job, a way to copy more from the library, and the door to the comparison. */
export function JobProfiles({ jobId, canWrite }: { jobId: string; canWrite: boolean }) {
  const profiles = useJobProfilesQuery(jobId);
  const library = useLibraryProfilesQuery();
  const copy = useCreateProfileMutation(jobId);
  const [copying, setCopying] = useState(false);
  const onJob = new Set((profiles.data ?? []).map((p) => p.sourceProfileId));
  const available = (library.data ?? []).filter((p) => !onJob.has(p.id));

  return (
    <Section title="Cam profiles">
      {profiles.isPending ? (
        <Pending label="Loading profiles…" />
      ) : profiles.isError ? (
        <ErrorNotice error={profiles.error} onRetry={() => profiles.refetch()} />
      ) : profiles.data.length === 0 ? (
        <Text style={styles.body}>No profiles on this job yet. Copy the stock-spec regrind and a candidate from the library.</Text>
      ) : (
        <View role="list" style={styles.list}>
          {profiles.data.map((p) => (
            <View key={p.id} role="listitem">
              <Link href={{ pathname: '/profiles/[id]', params: { id: p.id } }} style={styles.item} testID={`job-profile-${p.id}`}>
                <View style={styles.grow}>
                  <Text style={styles.itemTitle}>{p.label}</Text>
                  <Text style={styles.itemMeta}>{profileLine(p)}</Text>
                </View>
              </Link>
            </View>
          ))}
        </View>
      )}
      <View style={styles.actions}>
        {(profiles.data?.length ?? 0) > 0 ? <Button label="Compare profiles" href={`/jobs/${jobId}/compare`} testID="open-compare" /> : null}
        {canWrite ? (
          <Button
            label={copying ? 'Close the library' : 'Copy from the library'}
            variant="secondary"
            onPress={() => setCopying((c) => !c)}
            testID="copy-from-library"
          />
        ) : null}
        {canWrite ? <Button label="Write a new profile" variant="quiet" href={`/profiles/new?job=${jobId}`} testID="new-job-profile" /> : null}
      </View>
      {copying ? (
        library.isPending ? (
          <Pending label="Loading the library…" />
        ) : available.length === 0 ? (
          <Text style={styles.body}>Every library profile is already on this job.</Text>
        ) : (
          <View role="list" style={styles.list}>
            {available.map((p) => (
              <View key={p.id} role="listitem" style={[styles.item, styles.row]}>
                <View style={styles.grow}>
                  <Text style={styles.itemTitle}>{p.label}</Text>
                  <Text style={styles.itemMeta}>{profileLine(p)}</Text>
                </View>
                <Button
                  label="Add to job"
                  variant="secondary"
                  busy={copy.isPending && copy.variables && 'fromProfileId' in copy.variables && copy.variables.fromProfileId === p.id}
                  onPress={() => copy.mutate({ fromProfileId: p.id })}
                  testID={`copy-${p.id}`}
                />
              </View>
            ))}
          </View>
        )
      ) : null}
      {copy.isError ? <ErrorNotice error={copy.error} /> : null}
    </Section>
  );
}

/** Spec sheets on this job with their current revision. */
export function JobSheets({ jobId }: { jobId: string }) {
  const sheets = useJobSheetsQuery(jobId);
  return (
    <Section title="Spec sheets">
      {sheets.isPending ? (
        <Pending label="Loading spec sheets…" />
      ) : sheets.isError ? (
        <ErrorNotice error={sheets.error} onRetry={() => sheets.refetch()} />
      ) : sheets.data.length === 0 ? (
        <Text style={styles.body}>No spec sheet yet. Start one from the comparison once a profile checks out.</Text>
      ) : (
        <View role="list" style={styles.list}>
          {sheets.data.map((s) => (
            <View key={s.id} role="listitem" style={[styles.item, styles.row]} testID={`job-sheet-${s.id}`}>
              <View style={styles.grow}>
                <Text style={styles.itemTitle}>{s.title}</Text>
                <Text style={styles.itemMeta}>
                  Revision {s.current.number} · {s.current.state === 'draft' ? 'draft' : 'issued'} · {s.current.label} · saved{' '}
                  {formatDateTime(s.current.updatedAt)}
                </Text>
              </View>
              <ResultsSummaryChip results={s.current.results} testID={`job-sheet-${s.id}-status`} />
              <Button label="Open" variant="secondary" href={`/jobs/${jobId}/sheets/${s.id}`} testID={`open-sheet-${s.id}`} />
            </View>
          ))}
        </View>
      )}
    </Section>
  );
}

const styles = StyleSheet.create({
  body: { ...typeScale.body, color: colors.inkMuted },
  facts: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  fact: { minWidth: 130, gap: 2 },
  factLabel: { ...typeScale.small, color: colors.inkMuted },
  factValue: { ...typeScale.number, color: colors.ink },
  list: { gap: space.sm },
  item: { display: 'flex', gap: 2, padding: space.md, borderRadius: radius.md, borderWidth: 1, borderColor: colors.line, backgroundColor: colors.paper },
  row: { flexDirection: 'row', alignItems: 'center', gap: space.md, flexWrap: 'wrap' },
  grow: { flex: 1, minWidth: 180, gap: 2 },
  itemTitle: { fontFamily: fonts.semibold, fontSize: 16, color: colors.ink },
  itemMeta: { ...typeScale.small, color: colors.inkMuted, fontFamily: fonts.mono },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
