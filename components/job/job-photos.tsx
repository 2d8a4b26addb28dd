import * as ImagePicker from 'expo-image-picker';
import { useState } from 'react';
import { Image, Pressable, StyleSheet, Text, View } from 'react-native';

import { formatDateTime } from '@/constants/format';
import { colors, fonts, radius, space, touchTarget, type as typeScale } from '@/constants/theme';
import { useDeletePhotoMutation, useJobPhotosQuery, useSavePhotoMutation, useUploadPhotosMutation } from '@/hooks/use-photos';
import { photoLimits, type Photo } from '@/shared/measurements';

import { Button } from '@/components/ui/button';
import { ErrorNotice, Pending } from '@/components/ui/query-state';
import { Section } from '@/components/ui/screen';
import { TextField } from '@/components/ui/text-field';

const megabytes = photoLimits.maxBytes / 1024 / 1024;

/** Photos of the failed parts on a job's findings: pick, upload, caption, share with the owner or not, delete. */
export function JobPhotos({ jobId, canWrite }: { jobId: string; canWrite: boolean }) {
  const photos = useJobPhotosQuery(jobId);
  const upload = useUploadPhotosMutation(jobId);
  const [pickProblem, setPickProblem] = useState<string | null>(null);
  const [sending, setSending] = useState(0);

  const pick = async () => {
    setPickProblem(null);
    upload.reset();
    const result = await ImagePicker.launchImageLibraryAsync({
      mediaTypes: ['images'],
      allowsMultipleSelection: true,
      selectionLimit: photoLimits.maxFiles,
      quality: 1,
    });
    if (result.canceled || result.assets.length === 0) return;
    const assets = result.assets;
    if (assets.length > photoLimits.maxFiles) {
      setPickProblem(`Pick up to ${photoLimits.maxFiles} photos at a time; you picked ${assets.length}.`);
      return;
    }
    const big = assets.find((a) => (a.fileSize ?? a.file?.size ?? 0) > photoLimits.maxBytes);
    if (big) {
      setPickProblem(`${big.fileName ?? 'A photo'} is over ${megabytes} MB. Pick a smaller photo or export it at a lower size.`);
      return;
    }
    setSending(assets.length);
    upload.mutate(assets, { onSettled: () => setSending(0) });
  };

  return (
    <Section title="Photos of the failed parts">
      <Text style={styles.help}>
        JPEG, PNG or WebP, up to {photoLimits.maxFiles} at a time, {megabytes} MB each. Only people in this shop can open them unless you mark a photo for the
        owner.
      </Text>
      {canWrite ? (
        <Button
          label={upload.isPending ? `Uploading ${sending} photo${sending === 1 ? '' : 's'}…` : 'Add photos'}
          variant="secondary"
          onPress={pick}
          busy={upload.isPending}
          testID="photos-add"
        />
      ) : null}
      {upload.isPending ? (
        <Text role="status" aria-live="polite" style={styles.help} testID="photos-uploading">
          Sending {sending} photo{sending === 1 ? '' : 's'} to the job…
        </Text>
      ) : null}
      {pickProblem ? (
        <Text role="alert" style={styles.problem} testID="photos-problem">
          {pickProblem}
        </Text>
      ) : null}
      {upload.error ? (
        <Text role="alert" style={styles.problem} testID="photos-upload-error">
          Not uploaded. {upload.error.message}
        </Text>
      ) : null}
      {photos.isPending ? (
        <Pending label="Loading photos…" />
      ) : photos.isError ? (
        <ErrorNotice error={photos.error} onRetry={() => photos.refetch()} />
      ) : photos.data.length === 0 ? (
        <Text style={styles.help} testID="photos-empty">
          No photos on this job yet.
        </Text>
      ) : (
        <View role="list" style={styles.grid} testID="photos-list">
          {photos.data.map((photo) => (
            <PhotoCard key={photo.id} jobId={jobId} photo={photo} canWrite={canWrite} />
          ))}
        </View>
      )}
    </Section>
  );
}

function PhotoCard({ jobId, photo, canWrite }: { jobId: string; photo: Photo; canWrite: boolean }) {
  const save = useSavePhotoMutation(jobId);
  const remove = useDeletePhotoMutation(jobId);
  const [caption, setCaption] = useState(photo.caption);
  const [confirming, setConfirming] = useState(false);
  const name = photo.caption || photo.originalName || 'Photo';
  const changed = caption.trim() !== photo.caption;

  return (
    <View role="listitem" style={styles.card} testID={`photo-${photo.id}`}>
      <Image source={{ uri: photo.url }} style={styles.thumb} resizeMode="cover" alt={name} accessibilityLabel={name} testID="photo-thumb" />
      <Text style={styles.meta}>
        {photo.originalName} · {photo.size < 1024 ? `${photo.size} bytes` : `${(photo.size / 1024).toFixed(0)} KB`} · {formatDateTime(photo.createdAt)}
      </Text>
      {canWrite ? (
        <>
          <TextField label="Caption" value={caption} onChangeText={setCaption} maxLength={200} error={save.error?.message} testID="photo-caption" />
          {changed ? (
            <Button
              label="Save caption"
              variant="secondary"
              busy={save.isPending}
              onPress={() => save.mutate({ id: photo.id, caption: caption.trim() })}
              testID="photo-caption-save"
            />
          ) : null}
          <Pressable
            role="switch"
            aria-checked={photo.shareable}
            aria-label="Show this photo to the owner"
            onPress={() => save.mutate({ id: photo.id, shareable: !photo.shareable })}
            style={styles.toggle}
            testID="photo-shareable"
          >
            <View style={[styles.track, photo.shareable && styles.trackOn]}>
              <View style={[styles.knob, photo.shareable && styles.knobOn]} />
            </View>
            <Text style={styles.toggleText}>{photo.shareable ? 'Owner can see it' : 'Shop only'}</Text>
          </Pressable>
          {confirming ? (
            <View style={styles.row}>
              <Button label="Delete for good" variant="danger" busy={remove.isPending} onPress={() => remove.mutate(photo.id)} testID="photo-delete-confirm" />
              <Button label="Keep" variant="quiet" onPress={() => setConfirming(false)} testID="photo-delete-cancel" />
            </View>
          ) : (
            <Button label="Delete" variant="quiet" aria-label={`Delete ${name}`} onPress={() => setConfirming(true)} testID="photo-delete" />
          )}
          {remove.error ? (
            <Text role="alert" style={styles.problem}>
              Not deleted. {remove.error.message}
            </Text>
          ) : null}
        </>
      ) : photo.caption ? (
        <Text style={styles.caption}>{photo.caption}</Text>
      ) : null}
    </View>
  );
}

const styles = StyleSheet.create({
  help: { ...typeScale.small, color: colors.inkMuted },
  problem: { ...typeScale.small, color: colors.fail, fontFamily: fonts.medium },
  grid: { flexDirection: 'row', flexWrap: 'wrap', gap: space.md },
  card: {
    flexGrow: 1,
    flexBasis: 220,
    maxWidth: 360,
    gap: space.sm,
    padding: space.sm,
    borderRadius: radius.md,
    borderWidth: 1,
    borderColor: colors.line,
    backgroundColor: colors.paper,
  },
  thumb: { width: '100%', aspectRatio: 4 / 3, borderRadius: radius.sm, backgroundColor: colors.sunken },
  meta: { ...typeScale.small, color: colors.inkMuted },
  caption: { ...typeScale.body, color: colors.ink },
  row: { flexDirection: 'row', gap: space.sm, flexWrap: 'wrap' },
  toggle: { flexDirection: 'row', alignItems: 'center', gap: space.sm, minHeight: touchTarget },
  track: { width: 44, height: 26, borderRadius: radius.pill, backgroundColor: colors.lineStrong, padding: 3 },
  trackOn: { backgroundColor: colors.accent },
  knob: { width: 20, height: 20, borderRadius: radius.pill, backgroundColor: colors.surface },
  knobOn: { transform: [{ translateX: 18 }] },
  toggleText: { fontFamily: fonts.medium, fontSize: 15, color: colors.ink },
});
