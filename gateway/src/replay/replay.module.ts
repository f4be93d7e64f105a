import { Module } from '@nestjs/common';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { RetentionModule } from '../retention/retention.module';
import { ReplayController } from './replay.controller';
import { ReplayEntriesService } from './replay-entries.service';
import { ReplayEventsService } from './replay-events.service';
import { ReplayService } from './replay.service';

/** Replay of a recorded window: readings (downsampled), alarms, forecast runs, the logbook. */
@Module({
  imports: [ReservoirsModule, RetentionModule],
  controllers: [ReplayController],
  providers: [ReplayService, ReplayEntriesService, ReplayEventsService],
})
export class ReplayModule {}
