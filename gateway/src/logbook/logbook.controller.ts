import {
  BadRequestException,
  Controller,
  Get,
  Param,
  ParseIntPipe,
  Query,
  Res,
} from '@nestjs/common';
import { ApiOkResponse, ApiProduces, ApiTags } from '@nestjs/swagger';
import type { Response } from 'express';
import {
  attachmentRefSchema,
  sha256HexSchema,
  type LogbookEntry,
  type LogbookHead,
  type VerificationReport,
} from '@stillwell/shared/logbook';
import { Permission } from '../common/decorators/permission.decorator';
import { AttachmentStore } from './attachment-store.service';
import { LogbookFilterDto, LogbookQueryDto, VerifyQueryDto } from './dto/logbook-query.dto';
import { CSV_HEADER, csvField, csvLine } from './logbook-csv';
import { LogbookQueryService } from './logbook-query.service';
import { LogbookVerifier } from './logbook-verifier.service';
import { LogbookService } from './logbook.service';

const seqPipe = new ParseIntPipe({ errorHttpStatusCode: 400 });

@ApiTags('logbook')
@Controller('logbook')
export class LogbookController {
  constructor(
    private readonly logbook: LogbookService,
    private readonly query: LogbookQueryService,
    private readonly verifier: LogbookVerifier,
    private readonly attachments: AttachmentStore,
  ) {}

  @Get()
  @Permission('logbook.read')
  @ApiOkResponse({ description: 'A page of entries, filtered and sorted on the server' })
  list(@Query() q: LogbookQueryDto): Promise<{ rows: LogbookEntry[]; total: number }> {
    return this.query.page(q);
  }

  @Get('head')
  @Permission('logbook.read')
  @ApiOkResponse({
    description: 'The newest entry: its sequence number and hash, to publish or print',
  })
  head(): Promise<LogbookHead> {
    return this.logbook.head();
  }

  @Get('verify')
  @Permission('logbook.verify')
  @ApiOkResponse({
    description:
      'Recompute the whole chain and rehash every attachment now; optionally check a published head',
  })
  async verify(@Query() q: VerifyQueryDto): Promise<VerificationReport> {
    if ((q.headSeq === undefined) !== (q.headHash === undefined)) {
      throw new BadRequestException('headSeq and headHash go together');
    }
    const published = q.headSeq !== undefined ? { seq: q.headSeq, hash: q.headHash! } : undefined;
    return this.verifier.run(published);
  }

  @Get('verification')
  @Permission('logbook.verify')
  @ApiOkResponse({
    description: 'The result of the last scheduled verification (null before the first)',
  })
  last(): VerificationReport | null {
    return this.verifier.last;
  }

  @Get('export')
  @Permission('logbook.read')
  @ApiProduces('text/csv')
  @ApiOkResponse({ description: 'The filtered entries as CSV, oldest first (payload as hashed)' })
  async export(@Query() q: LogbookFilterDto, @Res() res: Response): Promise<void> {
    const stamp = (s?: string) => (s ? new Date(s).toISOString().replace(/[:.]/g, '-') : 'all');
    res.setHeader('Content-Type', 'text/csv; charset=utf-8');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="stillwell-logbook-${stamp(q.from)}-to-${stamp(q.to)}.csv"`,
    );
    res.write(CSV_HEADER.map(csvField).join(',') + '\r\n');
    for await (const page of this.query.inOrder(q)) {
      const chunk = page.map(csvLine).join('');
      // respect back-pressure: a long export must not pile up in memory
      if (!res.write(chunk)) await new Promise((r) => res.once('drain', r));
    }
    res.end();
  }

  @Get('entries/:seq')
  @Permission('logbook.read')
  @ApiOkResponse({ description: 'One entry (LogbookEntry)' })
  entry(@Param('seq', seqPipe) seq: number): Promise<LogbookEntry> {
    return this.query.one(seq);
  }

  @Get('entries/:seq/attachments/:sha256')
  @Permission('logbook.read')
  @ApiOkResponse({ description: 'An attachment of the entry, as a download' })
  async attachment(
    @Param('seq', seqPipe) seq: number,
    @Param('sha256') sha256: string,
    @Res() res: Response,
  ): Promise<void> {
    if (!sha256HexSchema.safeParse(sha256).success)
      throw new BadRequestException('sha256: 64 lower-case hex digits');
    const entry = await this.query.one(seq);
    const list = Array.isArray(entry.payload.attachments) ? entry.payload.attachments : [];
    const ref = list
      .map((a) => attachmentRefSchema.safeParse(a))
      .find((r) => r.success && r.data.sha256 === sha256);
    if (!ref?.success) throw new BadRequestException(`entry ${seq} has no attachment ${sha256}`);
    const bytes = await this.attachments.read(sha256);
    res.setHeader('Content-Type', ref.data.mediaType);
    // always a download: an uploaded file never renders in the console's origin
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="${ref.data.name.replace(/[^\x20-\x7e]|"/g, '_')}"; filename*=UTF-8''${encodeURIComponent(ref.data.name)}`,
    );
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
    res.end(bytes);
  }
}
