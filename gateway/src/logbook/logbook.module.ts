import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AttachmentStore } from './attachment-store.service';
import { LogbookEntryRow } from './logbook-entry.entity';
import { LogbookController } from './logbook.controller';
import { LogbookLiveGateway } from './logbook-live.gateway';
import { LogbookQueryService } from './logbook-query.service';
import { LogbookVerifier } from './logbook-verifier.service';
import { LogbookService } from './logbook.service';
import { ShiftLogController } from './shift-log.controller';
import { ShiftLogService } from './shift-log.service';

/** Global: every feature records its events through LogbookService, the chain's only writer. */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([LogbookEntryRow])],
  controllers: [LogbookController, ShiftLogController],
  providers: [
    LogbookService,
    LogbookQueryService,
    LogbookVerifier,
    AttachmentStore,
    ShiftLogService,
    LogbookLiveGateway,
  ],
  exports: [LogbookService, LogbookVerifier, AttachmentStore],
})
export class LogbookModule {}
