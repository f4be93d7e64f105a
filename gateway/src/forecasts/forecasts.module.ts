import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { Reading } from '../telemetry/reading.entity';
import { TelemetryModule } from '../telemetry/telemetry.module';
import { ForecastInputsService } from './forecast-inputs.service';
import { ForecastLiveGateway } from './forecast-live.gateway';
import { ForecastRunRow } from './forecast-run.entity';
import { ForecastScheduler } from './forecast-scheduler.service';
import { ForecastsController } from './forecasts.controller';
import { ForecastsService } from './forecasts.service';
import { WhatIfService } from './what-if.service';

/** The live forecast (scheduled and on material changes), its store and push, and what-if routing. */
@Module({
  imports: [TypeOrmModule.forFeature([ForecastRunRow, Reading]), ReservoirsModule, TelemetryModule],
  controllers: [ForecastsController],
  providers: [
    ForecastInputsService,
    ForecastsService,
    ForecastScheduler,
    ForecastLiveGateway,
    WhatIfService,
  ],
  exports: [ForecastsService],
})
export class ForecastsModule {}
