import { Controller, Get, Header, NotFoundException, Param } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { CapFeed } from '@stillwell/shared/notices';
import { Public } from '../../common/decorators/public.decorator';
import { FeedService } from './feed.service';

/** Public, for emergency-management systems: active release notices as OASIS CAP 1.2, and as JSON. */
@ApiTags('downstream')
@Controller('notices')
export class FeedController {
  constructor(private readonly feed: FeedService) {}

  @Get('feed.xml')
  @Public()
  @Header('Content-Type', 'application/atom+xml; charset=utf-8')
  @Header('Cache-Control', 'no-cache')
  @ApiOkResponse({
    description: 'Atom feed; each entry holds one OASIS CAP 1.2 alert (application/cap+xml)',
  })
  atom(): Promise<string> {
    return this.feed.atom();
  }

  @Get('feed.json')
  @Public()
  @Header('Cache-Control', 'no-cache')
  @ApiOkResponse({ description: 'The same alerts as JSON, CAP 1.2 element names (CapFeed)' })
  json(): Promise<CapFeed> {
    return this.feed.json();
  }

  @Get('alerts/:noticeId.xml')
  @Public()
  @Header('Content-Type', 'application/cap+xml; charset=utf-8')
  @Header('Cache-Control', 'no-cache')
  @ApiOkResponse({ description: 'One active alert as a standalone OASIS CAP 1.2 document' })
  async alert(@Param('noticeId') noticeId: string): Promise<string> {
    const xml = await this.feed.alert(noticeId);
    if (!xml) throw new NotFoundException('No active alert with this id');
    return xml;
  }
}
