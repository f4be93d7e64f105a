import { createHash, randomUUID } from 'node:crypto';
import { constants } from 'node:fs';
import { mkdir, open, readFile, rename, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { BadRequestException, Injectable, NotFoundException } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import {
  ATTACHMENT_LIMITS,
  ATTACHMENT_TYPES,
  safeAttachmentName,
  sha256HexSchema,
  sniffMediaType,
  type AttachmentRef,
} from '@stillwell/shared/logbook';
import { attachmentsDir } from './logbook-settings';

export interface UploadedFile {
  originalname: string;
  mimetype: string;
  size: number;
  buffer: Buffer;
}

const MB = 1024 * 1024;

/**
 * Attachments on disk under their SHA-256 (lower-case hex, nothing else), so that no uploaded
 * name can reach the file system and the same bytes are stored once. The entry's payload holds
 * the hash: the chain covers the bytes, and verification rehashes each file.
 */
@Injectable()
export class AttachmentStore {
  readonly dir: string;

  constructor(config: ConfigService) {
    this.dir = attachmentsDir(config);
  }

  /** Checks every file first (type from its bytes, size), then stores them; refuses all or none. */
  async storeAll(files: readonly UploadedFile[]): Promise<AttachmentRef[]> {
    if (files.length > ATTACHMENT_LIMITS.maxFiles)
      throw new BadRequestException(`attachments: at most ${ATTACHMENT_LIMITS.maxFiles} files`);
    const checked = files.map((f, i) => this.check(f, i));
    const refs: AttachmentRef[] = [];
    for (const { file, ref } of checked) {
      await this.write(ref.sha256, file.buffer);
      refs.push(ref);
    }
    return refs;
  }

  private check(file: UploadedFile, i: number): { file: UploadedFile; ref: AttachmentRef } {
    const name = safeAttachmentName(file.originalname);
    const where = `attachments.${i} ("${name}")`;
    if (file.size === 0 || file.buffer.length === 0)
      throw new BadRequestException(`${where}: the file is empty`);
    if (file.buffer.length > ATTACHMENT_LIMITS.maxBytes)
      throw new BadRequestException(
        `${where}: ${(file.buffer.length / MB).toFixed(1)} MB is over the ${ATTACHMENT_LIMITS.maxBytes / MB} MB limit`,
      );
    const sniffed = sniffMediaType(file.buffer);
    const accepted = Object.values(ATTACHMENT_TYPES)
      .map((t) => t.label)
      .join(', ');
    if (!sniffed)
      throw new BadRequestException(
        `${where}: its content is not one of ${accepted} (declared ${file.mimetype || 'nothing'})`,
      );
    const declared = file.mimetype?.toLowerCase();
    if (declared && declared !== 'application/octet-stream' && declared !== sniffed)
      throw new BadRequestException(
        `${where}: declared ${declared}, but its content is ${ATTACHMENT_TYPES[sniffed].label}`,
      );
    const sha256 = createHash('sha256').update(file.buffer).digest('hex');
    return { file, ref: { sha256, name, mediaType: sniffed, size: file.buffer.length } };
  }

  private path(sha256: string): string {
    // the one place a path is made: from a checked hash only
    return join(this.dir, sha256HexSchema.parse(sha256));
  }

  private async write(sha256: string, bytes: Buffer): Promise<void> {
    await mkdir(this.dir, { recursive: true });
    const final = this.path(sha256);
    const temp = join(this.dir, `.upload-${randomUUID()}`);
    const handle = await open(
      temp,
      constants.O_CREAT | constants.O_EXCL | constants.O_WRONLY,
      0o640,
    );
    try {
      await handle.writeFile(bytes);
      // on disk before the entry that names it commits
      await handle.sync();
    } finally {
      await handle.close();
    }
    try {
      // content-addressed: a file already there under this name holds these bytes (or was
      // altered, which verification reports; it is not silently replaced)
      await open(final, 'r').then((h) => h.close());
      await rm(temp, { force: true });
    } catch {
      await rename(temp, final);
    }
  }

  async read(sha256: string): Promise<Buffer> {
    try {
      return await readFile(this.path(sha256));
    } catch {
      throw new NotFoundException(`Attachment ${sha256} is not on disk`);
    }
  }

  /** Rehashes a stored file against the hash its entry records. */
  async verify(ref: Pick<AttachmentRef, 'sha256' | 'size'>): Promise<'ok' | 'missing' | 'altered'> {
    let bytes: Buffer;
    try {
      bytes = await readFile(this.path(ref.sha256));
    } catch {
      return 'missing';
    }
    return createHash('sha256').update(bytes).digest('hex') === ref.sha256 ? 'ok' : 'altered';
  }
}
