import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { BackfillService } from './backfill.service';
import { IngestionService } from './ingestion.service';
import { LiveGateway } from './live.gateway';
import { QuarantinedMessage } from './quarantined-message.entity';
import { Reading } from './reading.entity';
import { ReadingsService } from './readings.service';
import { SequenceGap } from './sequence-gap.entity';
import { StatusService } from './status.service';
import { TelemetryController } from './telemetry.controller';

@Module({
  imports: [TypeOrmModule.forFeature([Reading, QuarantinedMessage, SequenceGap]), ReservoirsModule],
  controllers: [TelemetryController],
  providers: [IngestionService, BackfillService, ReadingsService, StatusService, LiveGateway],
  exports: [IngestionService, BackfillService, StatusService],
})
export class TelemetryModule {}
