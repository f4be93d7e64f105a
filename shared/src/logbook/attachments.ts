import { z } from 'zod';

/**
 * Files kept with a logbook entry: photos and PDF inspection notes. The type is read from the
 * file's first bytes, never taken from the name or the declared type; the file is stored under its
 * SHA-256, which goes into the entry's payload so that the hash chain covers the bytes too.
 */
export const ATTACHMENT_TYPES = {
  'image/jpeg': { ext: 'jpg', label: 'JPEG photo' },
  'image/png': { ext: 'png', label: 'PNG image' },
  'application/pdf': { ext: 'pdf', label: 'PDF document' },
} as const;
export type AttachmentType = keyof typeof ATTACHMENT_TYPES;
export const ATTACHMENT_MEDIA_TYPES = Object.keys(ATTACHMENT_TYPES) as AttachmentType[];

export const ATTACHMENT_LIMITS = {
  /** bytes per file */
  maxBytes: 10 * 1024 * 1024,
  maxFiles: 5,
  maxNameLength: 120,
} as const;

export const sha256HexSchema = z.string().regex(/^[0-9a-f]{64}$/, '64 lower-case hex digits');

export const attachmentRefSchema = z.strictObject({
  sha256: sha256HexSchema,
  /** the uploaded file's name, made safe (see safeAttachmentName); shown, never used as a path */
  name: z.string().min(1).max(ATTACHMENT_LIMITS.maxNameLength),
  mediaType: z.enum(ATTACHMENT_MEDIA_TYPES as [AttachmentType, ...AttachmentType[]]),
  size: z.number().int().min(1),
});
export type AttachmentRef = z.infer<typeof attachmentRefSchema>;

const startsWith = (bytes: Uint8Array, signature: readonly number[]) =>
  bytes.length >= signature.length && signature.every((b, i) => bytes[i] === b);

/** The type the file's own bytes declare (magic numbers), or null for anything else. */
export function sniffMediaType(bytes: Uint8Array): AttachmentType | null {
  // JPEG: SOI marker then the start of a segment (FF D8 FF)
  if (startsWith(bytes, [0xff, 0xd8, 0xff])) return 'image/jpeg';
  // PNG: the 8-byte signature of the PNG specification
  if (startsWith(bytes, [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])) return 'image/png';
  // PDF: "%PDF-"
  if (startsWith(bytes, [0x25, 0x50, 0x44, 0x46, 0x2d])) return 'application/pdf';
  return null;
}

/**
 * A display name without path, control or markup characters: the last path segment, letters,
 * digits, spaces and . _ - ( ) only, no leading dots, at most 120 characters. The stored file is
 * named by its hash alone, so this name never reaches the file system.
 */
export function safeAttachmentName(raw: string, fallback = 'attachment'): string {
  const last = raw.split(/[\\/]/).pop() ?? '';
  const cleaned = last
    .normalize('NFKC')
    .replace(/[^\p{L}\p{N} ._()-]/gu, '_')
    .replace(/^[.\s]+/, '')
    .replace(/\s+/g, ' ')
    .trim()
    .slice(0, ATTACHMENT_LIMITS.maxNameLength);
  return cleaned.length > 0 ? cleaned : fallback;
}
