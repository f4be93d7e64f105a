import { Controller, Get, NotFoundException } from '@nestjs/common';
import { ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { OutboxMessage } from '@stillwell/shared/notices';
import { Permission } from '../common/decorators/permission.decorator';
import { DemoSmtpServer } from './demo-smtp.server';
import { OutboxService } from './outbox.service';

/** The demo outbox: what the demo mail server received. Not there outside demo mode. */
@ApiTags('mail')
@Controller('mail/outbox')
export class OutboxController {
  constructor(
    private readonly demo: DemoSmtpServer,
    private readonly outbox: OutboxService,
  ) {}

  @Get()
  @Permission('notices.send')
  @ApiOkResponse({
    description: 'Messages the demo mail server accepted, newest first (OutboxMessage[])',
  })
  list(): Promise<OutboxMessage[]> {
    if (!this.demo.enabled)
      throw new NotFoundException('There is no demo outbox: mail goes to SMTP_URL');
    return this.outbox.list();
  }
}
