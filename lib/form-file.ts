/** A picked file as the native pickers return it: a local URI with its name and type. */
export type PickedFile = { uri: string; name?: string | null; fileName?: string | null; mimeType?: string | null; file?: File };

/** Adds a picked file to multipart form data under `field` (React Native reads the URI when sending). */
export function appendPickedFile(form: FormData, field: string, picked: PickedFile) {
  const name = picked.name ?? picked.fileName ?? 'upload';
  const part = { uri: picked.uri, name, type: picked.mimeType ?? 'application/octet-stream' };
  form.append(field, part as unknown as Blob);
}
