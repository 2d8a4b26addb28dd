import { useRouter } from 'expo-router';
import { useState, type ReactNode } from 'react';
import { StyleSheet, Text, View } from 'react-native';

import { LoadMore } from '@/components/ui/load-more';
import { Button } from '@/components/ui/button';
import { ProfileForm } from '@/components/profile/profile-form';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Screen, Section } from '@/components/ui/screen';
import { colors, space, type as typeScale } from '@/constants/theme';
import { ApiError } from '@/lib/api';
import { useJobQuery, useJobsQuery } from '@/hooks/use-jobs';
import { useMeQuery } from '@/hooks/use-me';
import { useCreateProfileMutation, useDeleteProfileMutation, useProfileQuery, useSaveProfileMutation } from '@/hooks/use-profiles';
import type { Job } from '@/shared/jobs';
import type { Profile } from '@/shared/profile';
import { roleAllows } from '@/shared/roles';

/** `/profiles/new` writes a library profile (or one on a job with `?job=`); `/profiles/<id>` edits one. */
export function ProfileScreen({ id, job }: { id: string; job?: string }) {
  const canWrite = roleAllows(useMeQuery().data?.activeShop?.role, { sheet: ['write'] });
  if (id === 'new') return <NewProfile jobId={job || undefined} canWrite={canWrite} />;
  return <ExistingProfile id={id} canWrite={canWrite} />;
}

function NewProfile({ jobId, canWrite }: { jobId?: string; canWrite: boolean }) {
  const router = useRouter();
  const create = useCreateProfileMutation(jobId);
  return (
    <BackTo jobId={jobId ?? null}>
      {(back) => (
        <Screen
          title="New profile"
          subtitle={jobId ? 'Written for this job only; the library stays as it is.' : 'Goes into the shop library, ready to copy into any job.'}
          back={back}
          testID="profile-new-screen"
        >
          {canWrite ? (
            <ProfileForm
              profile={null}
              readOnly={false}
              submitLabel="Create profile"
              busy={create.isPending}
              onSubmit={async (values) => {
                const saved = await create.mutateAsync(values);
                router.replace({ pathname: '/profiles/[id]', params: { id: saved.id } });
                return saved;
              }}
            />
          ) : (
            <ErrorNotice error={new Error('Your role in this shop can read profiles but not write them. Ask a builder.')} />
          )}
        </Screen>
      )}
    </BackTo>
  );
}

type Back = { href: '/profiles' | { pathname: '/jobs/[id]'; params: { id: string } }; label: string };

/** The link back up: to the job a profile belongs to (named by its vehicle), or to the library. */
function BackTo({ jobId, children }: { jobId: string | null; children: (back: Back) => ReactNode }) {
  if (jobId === null) return children({ href: '/profiles', label: 'Profile library' });
  return <BackToJob jobId={jobId}>{children}</BackToJob>;
}

function BackToJob({ jobId, children }: { jobId: string; children: (back: Back) => ReactNode }) {
  const job = useJobQuery(jobId);
  return children({ href: { pathname: '/jobs/[id]', params: { id: jobId } }, label: job.data?.vehicle ?? 'Back to the job' });
}

function ExistingProfile({ id, canWrite }: { id: string; canWrite: boolean }) {
  const profile = useProfileQuery(id);
  if (profile.isPending) return <Pending label="Loading the profile…" />;
  if (profile.isError) {
    const gone = profile.error instanceof ApiError && profile.error.status === 404;
    return (
      <View style={styles.padded}>
        <ErrorNotice
          error={gone ? new Error('This profile is not in your shop, or it has been deleted.') : profile.error}
          onRetry={gone ? undefined : () => profile.refetch()}
        />
      </View>
    );
  }
  return <ProfileDetail key={profile.data.id} profile={profile.data} canWrite={canWrite} refetch={profile.refetch} />;
}

type ProfileDetailProps = {
  profile: Profile;
  canWrite: boolean;
  refetch: (options: { throwOnError: true }) => Promise<{ data?: Profile }>;
};

function ProfileDetail({ profile, canWrite, refetch }: ProfileDetailProps) {
  const save = useSaveProfileMutation(profile.id);
  const onJob = profile.jobId !== null;

  return (
    <BackTo jobId={profile.jobId}>
      {(back) => (
        <Screen
          title={profile.label}
          subtitle={
            onJob
              ? profile.sourceProfileId
                ? "This job's copy of a library profile. Changes here stay with the job; the library keeps its own."
                : 'Written for this job. Changes here stay with the job.'
              : 'In the shop library. Jobs that copied it keep their own copy.'
          }
          back={back}
          testID="profile-screen"
        >
          <ProfileForm
            profile={profile}
            readOnly={!canWrite}
            submitLabel="Save profile"
            busy={save.isPending}
            onSubmit={(values, version) => save.mutateAsync({ version, ...values })}
            onReload={async () => {
              const latest = await refetch({ throwOnError: true });
              if (!latest.data) throw new Error('The profile did not load.');
              return latest.data;
            }}
          />
          {canWrite && !onJob ? <CopyIntoJob profile={profile} /> : null}
          {canWrite && !onJob ? <DeleteProfile profile={profile} /> : null}
        </Screen>
      )}
    </BackTo>
  );
}

/** Copies a library profile onto one of the shop's jobs, where it can be edited for that engine alone. */
function CopyIntoJob({ profile }: { profile: Profile }) {
  const [open, setOpen] = useState(false);
  const jobs = useJobsQuery(open);
  return (
    <Section title="Copy into a job">
      <Text style={styles.body}>The job gets its own copy to compare and adjust; this library profile stays as it is.</Text>
      {!open ? (
        <Button label="Choose a job" variant="secondary" onPress={() => setOpen(true)} testID="profile-copy-open" />
      ) : jobs.isPending ? (
        <Pending label="Loading jobs…" />
      ) : jobs.isError ? (
        <ErrorNotice error={jobs.error} onRetry={() => jobs.refetch()} />
      ) : jobs.data.length === 0 ? (
        <Text style={styles.body}>The shop has no jobs yet.</Text>
      ) : (
        <View role="list" aria-label="Jobs to copy into" style={styles.jobs}>
          {jobs.data
            .filter((job) => job.status !== 'delivered')
            .map((job) => (
              <CopyRow key={job.id} job={job} profileId={profile.id} />
            ))}
          <LoadMore hasMore={jobs.hasNextPage} loading={jobs.isFetchingNextPage} onLoadMore={() => void jobs.fetchNextPage()} />
        </View>
      )}
    </Section>
  );
}

function CopyRow({ job, profileId }: { job: Job; profileId: string }) {
  const router = useRouter();
  const copy = useCreateProfileMutation(job.id);
  return (
    <View role="listitem" style={styles.jobRow}>
      <View style={styles.jobText}>
        <Text style={styles.jobName}>{job.vehicle}</Text>
        <Text style={styles.meta}>{job.customerName}</Text>
        {copy.isError ? (
          <Text style={styles.error} role="alert">
            {copy.error.message}
          </Text>
        ) : null}
      </View>
      <Button
        label="Copy here"
        variant="secondary"
        busy={copy.isPending}
        accessibilityLabel={`Copy into ${job.vehicle}`}
        onPress={() =>
          copy.mutate({ fromProfileId: profileId }, { onSuccess: (created) => router.push({ pathname: '/profiles/[id]', params: { id: created.id } }) })
        }
        testID={`profile-copy-${job.id}`}
      />
    </View>
  );
}

/** Deleting asks once more, in place; jobs that copied the profile keep their copies. */
function DeleteProfile({ profile }: { profile: Profile }) {
  const router = useRouter();
  const remove = useDeleteProfileMutation();
  const [asking, setAsking] = useState(false);
  return (
    <Section title="Remove from the library">
      {asking ? (
        <>
          <Text style={styles.body}>Delete “{profile.label}” from the library? Jobs that copied it keep their copies.</Text>
          <View style={styles.actions}>
            <Button
              label="Delete profile"
              variant="danger"
              busy={remove.isPending}
              onPress={() => remove.mutate(profile.id, { onSuccess: () => router.replace('/profiles') })}
              testID="profile-delete-confirm"
            />
            <Button label="Keep it" variant="quiet" onPress={() => setAsking(false)} testID="profile-delete-cancel" />
          </View>
          {remove.isError ? <ErrorNotice error={remove.error} /> : null}
        </>
      ) : (
        <Button label="Delete…" variant="danger" onPress={() => setAsking(true)} testID="profile-delete" />
      )}
    </Section>
  );
}

const styles = StyleSheet.create({
  padded: { padding: space.lg },
  body: { ...typeScale.body, color: colors.ink },
  meta: { ...typeScale.small, color: colors.inkMuted },
  error: { ...typeScale.small, color: colors.fail },
  jobs: { gap: space.md },
  jobRow: { flexDirection: 'row', flexWrap: 'wrap', alignItems: 'center', justifyContent: 'space-between', gap: space.md },
  jobText: { flexShrink: 1, gap: 2 },
  jobName: { ...typeScale.bodyStrong, color: colors.ink },
  actions: { flexDirection: 'row', flexWrap: 'wrap', gap: space.sm },
});
