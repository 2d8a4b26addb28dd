import type { Photo } from '@/shared/measurements';

type ImageType = Photo['mimeType'];

/** Extensions we store each image type under. */
export const extensionFor: Record<ImageType, string> = { 'image/jpeg': '.jpg', 'image/png': '.png', 'image/webp': '.webp' };

/** File-name extensions a person may upload (checked as well as the content). */
export const allowedExtensions = ['.jpg', '.jpeg', '.png', '.webp'] as const;

const PNG = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

function startsWith(bytes: Uint8Array, signature: number[], at = 0): boolean {
  if (bytes.length < at + signature.length) return false;
  return signature.every((b, i) => bytes[at + i] === b);
}

/** The image type from the file's first bytes (JPEG, PNG or WebP), or null when it is none of them. */
export function detectImageType(head: Uint8Array): ImageType | null {
  if (startsWith(head, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  if (startsWith(head, PNG)) return 'image/png';
  // RIFF <size> WEBP
  if (startsWith(head, [0x52, 0x49, 0x46, 0x46]) && startsWith(head, [0x57, 0x45, 0x42, 0x50], 8)) return 'image/webp';
  return null;
}
