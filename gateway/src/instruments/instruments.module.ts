import { Module } from '@nestjs/common';
import { AlarmsModule } from '../alarms/alarms.module';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { InstrumentsController } from './instruments.controller';
import { InstrumentsService } from './instruments.service';

/** The dam-safety instruments (seepage weirs, foundation piezometers): their record. */
@Module({
  imports: [ReservoirsModule, AlarmsModule],
  controllers: [InstrumentsController],
  providers: [InstrumentsService],
})
export class InstrumentsModule {}
