import { BadRequestException, Controller, Get, Query } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { LogbookEntry, LogbookHead, VerificationReport } from '@stillwell/shared/logbook';
import { LogbookQueryDto, VerifyQueryDto } from './dto/logbook-query.dto';
import { LogbookQueryService } from './logbook-query.service';
import { LogbookVerifier } from './logbook-verifier.service';
import { LogbookService } from './logbook.service';

@ApiTags('logbook')
@Controller('logbook')
export class LogbookController {
  constructor(
    private readonly logbook: LogbookService,
    private readonly query: LogbookQueryService,
    private readonly verifier: LogbookVerifier,
  ) {}

  @Get()
  @ApiOkResponse({ description: 'A page of entries, filtered and sorted on the server' })
  list(@Query() q: LogbookQueryDto): Promise<{ rows: LogbookEntry[]; total: number }> {
    return this.query.page(q);
  }

  @Get('head')
  @ApiOkResponse({
    description: 'The newest entry: its sequence number and hash, to publish or print',
  })
  head(): Promise<LogbookHead> {
    return this.logbook.head();
  }

  @Get('verify')
  @ApiOkResponse({
    description: 'Recompute the whole chain now; optionally check a published head',
  })
  async verify(@Query() q: VerifyQueryDto): Promise<VerificationReport> {
    if ((q.headSeq === undefined) !== (q.headHash === undefined)) {
      throw new BadRequestException('headSeq and headHash go together');
    }
    const published = q.headSeq !== undefined ? { seq: q.headSeq, hash: q.headHash! } : undefined;
    return this.verifier.run(published);
  }

  @Get('verification')
  @ApiOkResponse({
    description: 'The result of the last scheduled verification (null before the first)',
  })
  last(): VerificationReport | null {
    return this.verifier.last;
  }
}
