import {
  ArgumentsHost,
  BadRequestException,
  Body,
  Catch,
  Controller,
  ExceptionFilter,
  HttpException,
  PayloadTooLargeException,
  Post,
  UploadedFiles,
  UseFilters,
  UseInterceptors,
} from '@nestjs/common';
import { FilesInterceptor } from '@nestjs/platform-express';
import { ApiBody, ApiConsumes, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import { memoryStorage } from 'multer';
import { ATTACHMENT_LIMITS, type LogbookEntry } from '@stillwell/shared/logbook';
import type { Principal } from '../auth/principal';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import type { UploadedFile } from './attachment-store.service';
import { ShiftLogService } from './shift-log.service';

const MB = 1024 * 1024;
const LIMITS = `attachments: at most ${ATTACHMENT_LIMITS.maxFiles} files of at most ${ATTACHMENT_LIMITS.maxBytes / MB} MB each (JPEG, PNG or PDF)`;

/** multer stops a request past its limits before any handler runs: say which limit, in our words. */
@Catch(PayloadTooLargeException, BadRequestException)
class UploadLimitFilter implements ExceptionFilter {
  catch(error: HttpException, host: ArgumentsHost): void {
    const res = host.switchToHttp().getResponse<Response>();
    const body = error.getResponse() as { message?: unknown };
    const multer = /File too large|Too many files|Unexpected field/i.test(String(body.message));
    res
      .status(error.getStatus())
      .json(
        multer
          ? { statusCode: error.getStatus(), message: `${LIMITS} (${String(body.message)})` }
          : body,
      );
  }
}

const upload = FilesInterceptor('attachments', ATTACHMENT_LIMITS.maxFiles, {
  storage: memoryStorage(),
  limits: { fileSize: ATTACHMENT_LIMITS.maxBytes, files: ATTACHMENT_LIMITS.maxFiles, fields: 10 },
  // the raw name is kept and made safe by safeAttachmentName: busboy's own basename turns '..' into
  // '', and multer then drops the file without a word
  preservePath: true,
});

const form = (
  fields: Record<string, { type: string; description: string }>,
  required: string[],
) => ({
  schema: {
    type: 'object',
    required,
    properties: {
      ...fields,
      controls: {
        type: 'string',
        description: 'gate or valve ids the entry is about, comma-separated',
      },
      attachments: {
        type: 'array',
        items: { type: 'string', format: 'binary' },
        description: LIMITS,
      },
    },
  },
});

/** The operators' shift log: notes and handovers, with photos and PDF inspection notes. */
@ApiTags('logbook')
@Controller('logbook')
@UseFilters(UploadLimitFilter)
export class ShiftLogController {
  constructor(private readonly shiftLog: ShiftLogService) {}

  @Post('shift-notes')
  @Permission('logbook.write')
  @UseInterceptors(upload)
  @ApiConsumes('multipart/form-data')
  @ApiBody(form({ text: { type: 'string', description: '1-4000 characters' } }, ['text']))
  @ApiOkResponse({
    description: 'The new entry (kind shift.note); attachment hashes in its payload',
  })
  note(
    @Body() body: unknown,
    @UploadedFiles() files: UploadedFile[] | undefined,
    @CurrentPrincipal() p: Principal,
  ): Promise<LogbookEntry> {
    return this.shiftLog.note(body, files ?? [], p);
  }

  @Post('handovers')
  @Permission('logbook.write')
  @UseInterceptors(upload)
  @ApiConsumes('multipart/form-data')
  @ApiBody(
    form(
      {
        to: { type: 'string', description: 'who takes over (user name or name)' },
        text: { type: 'string', description: 'the handover, 1-4000 characters' },
      },
      ['to', 'text'],
    ),
  )
  @ApiOkResponse({ description: 'The new entry (kind shift.handover): who hands over to whom' })
  handover(
    @Body() body: unknown,
    @UploadedFiles() files: UploadedFile[] | undefined,
    @CurrentPrincipal() p: Principal,
  ): Promise<LogbookEntry> {
    return this.shiftLog.handover(body, files ?? [], p);
  }
}
