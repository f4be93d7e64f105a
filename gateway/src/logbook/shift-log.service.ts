import { BadRequestException, Injectable } from '@nestjs/common';
import type { z } from 'zod';
import {
  handoverFieldsSchema,
  shiftNoteFieldsSchema,
  type LogbookEntry,
} from '@stillwell/shared/logbook';
import { describeIssues } from '@stillwell/shared/telemetry';
import { actorOf, type Principal } from '../auth/principal';
import { AttachmentStore, type UploadedFile } from './attachment-store.service';
import { LogbookQueryService } from './logbook-query.service';
import { LogbookService } from './logbook.service';

/** Multipart fields are strings: `controls` comes as "gate-1,gate-2" or as repeated fields. */
function fieldsOf(raw: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = { ...raw };
  const c = raw.controls;
  if (typeof c === 'string')
    out.controls = c
      .split(',')
      .map((s) => s.trim())
      .filter(Boolean);
  if (Array.isArray(c))
    out.controls = c
      .flatMap((s) => String(s).split(','))
      .map((s) => s.trim())
      .filter(Boolean);
  if (out.controls !== undefined && (out.controls as unknown[]).length === 0) delete out.controls;
  return out;
}

function parse<S extends z.ZodType>(schema: S, raw: unknown): z.output<S> {
  const parsed = schema.safeParse(fieldsOf((raw ?? {}) as Record<string, unknown>));
  if (!parsed.success) throw new BadRequestException(describeIssues(parsed.error));
  return parsed.data;
}

/** The operators' own entries: shift notes and handovers, with their attachments. */
@Injectable()
export class ShiftLogService {
  constructor(
    private readonly logbook: LogbookService,
    private readonly query: LogbookQueryService,
    private readonly attachments: AttachmentStore,
  ) {}

  async note(raw: unknown, files: readonly UploadedFile[], p: Principal): Promise<LogbookEntry> {
    const fields = parse(shiftNoteFieldsSchema, raw);
    // files are checked and on disk before the entry that names them is written
    const attachments = await this.attachments.storeAll(files);
    const { seq } = await this.logbook.append({
      kind: 'shift.note',
      actor: actorOf(p),
      payload: {
        text: fields.text,
        ...(fields.controls ? { controls: fields.controls } : {}),
        attachments,
      },
    });
    return this.query.one(seq);
  }

  async handover(
    raw: unknown,
    files: readonly UploadedFile[],
    p: Principal,
  ): Promise<LogbookEntry> {
    const fields = parse(handoverFieldsSchema, raw);
    const attachments = await this.attachments.storeAll(files);
    const { seq } = await this.logbook.append({
      kind: 'shift.handover',
      actor: actorOf(p),
      payload: {
        from: p.username,
        fromName: p.displayName,
        to: fields.to,
        text: fields.text,
        ...(fields.controls ? { controls: fields.controls } : {}),
        attachments,
      },
    });
    return this.query.one(seq);
  }
}
