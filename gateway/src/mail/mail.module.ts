import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { DemoSmtpServer } from './demo-smtp.server';
import { MailTransport } from './mail-transport.service';
import { OutboxController } from './outbox.controller';
import { OutboxMessageRow } from './outbox-message.entity';
import { OutboxService } from './outbox.service';

/** Outgoing mail, and in demo mode the mail server that receives it. */
@Module({
  imports: [TypeOrmModule.forFeature([OutboxMessageRow])],
  controllers: [OutboxController],
  providers: [OutboxService, DemoSmtpServer, MailTransport],
  exports: [MailTransport, OutboxService, DemoSmtpServer],
})
export class MailModule {}
