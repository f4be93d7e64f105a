import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { AggregationService } from './aggregation.service';
import { PruneService } from './prune.service';
import { ReadingAggregateRow, ReadingHourAggregateRow } from './reading-aggregate.entity';
import { RetentionMarkRow } from './retention-mark.entity';
import { RetentionMarksService } from './retention-marks.service';
import { RetentionScheduler } from './retention-scheduler.service';

/** One-minute aggregates of the readings (kept for ever) and the pruning of old raw readings. */
@Module({
  imports: [
    TypeOrmModule.forFeature([ReadingAggregateRow, ReadingHourAggregateRow, RetentionMarkRow]),
    ReservoirsModule,
  ],
  providers: [AggregationService, PruneService, RetentionMarksService, RetentionScheduler],
  exports: [AggregationService, PruneService, RetentionMarksService],
})
export class RetentionModule {}
