import { Module } from '@nestjs/common';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ForecastsModule } from '../forecasts/forecasts.module';
import { OrdersModule } from '../orders/orders.module';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { TelemetryModule } from '../telemetry/telemetry.module';
import { AlarmEventRow } from './alarm-event.entity';
import { AlarmLiveGateway } from './alarm-live.gateway';
import { AlarmStore } from './alarm-store.service';
import { AlarmViewsService } from './alarm-views.service';
import { AlarmRow } from './alarm.entity';
import { AlarmsController } from './alarms.controller';
import { AlarmsService } from './alarms.service';
import { OrderAlarmBridge } from './order-alarm-bridge.service';

/**
 * Alarms after ISA-18.2: the conditions judged from telemetry, quarantine and forecast, their
 * states and handling, history and rates. Exports AlarmsService, whose raise/clear other modules
 * use for conditions they judge themselves (gate position against its command); the gate-orders
 * module's order alarms come in through OrderAlarmBridge. AlarmLiveGateway pushes the list live.
 */
@Module({
  imports: [
    TypeOrmModule.forFeature([AlarmRow, AlarmEventRow]),
    ReservoirsModule,
    TelemetryModule,
    ForecastsModule,
    OrdersModule,
  ],
  controllers: [AlarmsController],
  providers: [AlarmStore, AlarmsService, AlarmViewsService, OrderAlarmBridge, AlarmLiveGateway],
  exports: [AlarmsService],
})
export class AlarmsModule {}
