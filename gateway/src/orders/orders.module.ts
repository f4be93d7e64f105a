import { Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { ReservoirsModule } from '../reservoirs/reservoirs.module';
import { TelemetryModule } from '../telemetry/telemetry.module';
import { ActuatorPositions } from './actuator-positions.service';
import { AutomaticRuleRow, AutomationEventRow } from './automatic-rule.entity';
import { AutomationService } from './automation.service';
import { OrderClearance } from '../notices/orders/order-clearance';
import { DOWNSTREAM_CLEARANCE } from './downstream-clearance';
import { EmergencyController } from './emergency.controller';
import { EmergencyRow } from './emergency.entity';
import { EmergencyService } from './emergency.service';
import { ForecastLinkService } from './forecast-link.service';
import { InterlocksService } from './interlocks.service';
import { LogOnlyAlarmSink, ORDER_ALARM_SINK } from './order-alarm';
import { OrderAcks } from './order-acks.service';
import { OrderCommandRow } from './order-command.entity';
import { OrderEvents } from './order-events';
import { OrderExecution } from './order-execution.service';
import { OrderProgress } from './order-progress.service';
import { readOrderSettings } from './order-settings';
import { OrderStore } from './order-store';
import { OrderTicker } from './order-ticker.service';
import { ORDER_SETTINGS } from './order-tokens';
import { OrderRow } from './order.entity';
import { OrdersController } from './orders.controller';
import { OrdersLiveGateway } from './orders-live.gateway';
import { OrdersService } from './orders.service';

/**
 * Gate operation orders under the two-person rule, their interlocks and commands, declared
 * emergencies and automatic rules. The notices module plugs its check in as DOWNSTREAM_CLEARANCE
 * and the alarms module its alarms as ORDER_ALARM_SINK.
 */
@Module({
  imports: [
    TypeOrmModule.forFeature([
      OrderRow,
      OrderCommandRow,
      EmergencyRow,
      AutomaticRuleRow,
      AutomationEventRow,
    ]),
    ReservoirsModule,
    TelemetryModule,
  ],
  controllers: [OrdersController, EmergencyController],
  providers: [
    { provide: ORDER_SETTINGS, inject: [ConfigService], useFactory: readOrderSettings },
    { provide: DOWNSTREAM_CLEARANCE, useExisting: OrderClearance },
    { provide: ORDER_ALARM_SINK, useClass: LogOnlyAlarmSink },
    OrderEvents,
    OrderStore,
    ActuatorPositions,
    ForecastLinkService,
    InterlocksService,
    EmergencyService,
    OrdersService,
    OrderExecution,
    OrderAcks,
    OrderProgress,
    OrderTicker,
    AutomationService,
    OrdersLiveGateway,
  ],
  exports: [OrdersService, EmergencyService, OrderEvents],
})
export class OrdersModule {}
