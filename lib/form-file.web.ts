/** A picked file as the web pickers return it: the browser's File rides along. */
export type PickedFile = { uri: string; name?: string | null; fileName?: string | null; mimeType?: string | null; file?: File };

/** Adds a picked file to multipart form data under `field`. */
export function appendPickedFile(form: FormData, field: string, picked: PickedFile) {
  const name = picked.name ?? picked.fileName ?? 'upload';
  if (picked.file) {
    form.append(field, picked.file, name);
    return;
  }
  throw new Error(`${name} could not be read from this browser. Pick the file again.`);
}
