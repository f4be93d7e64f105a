import { Global, Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { LogbookEntryRow } from './logbook-entry.entity';
import { LogbookController } from './logbook.controller';
import { LogbookQueryService } from './logbook-query.service';
import { LogbookVerifier } from './logbook-verifier.service';
import { LogbookService } from './logbook.service';

/** Global: every feature records its events through LogbookService, the chain's only writer. */
@Global()
@Module({
  imports: [TypeOrmModule.forFeature([LogbookEntryRow])],
  controllers: [LogbookController],
  providers: [LogbookService, LogbookQueryService, LogbookVerifier],
  exports: [LogbookService, LogbookVerifier],
})
export class LogbookModule {}
