import { existsSync } from 'node:fs';
import { Module, type DynamicModule } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { ScheduleModule } from '@nestjs/schedule';
import { ServeStaticModule } from '@nestjs/serve-static';
import { AlarmsModule } from './alarms/alarms.module';
import { AuthModule } from './auth/auth.module';
import { BackupModule } from './backup/backup.module';
import { validateEnv } from './config';
import { ClockModule } from './clock/clock.module';
import { DatabaseModule } from './database/database.module';
import { ForecastsModule } from './forecasts/forecasts.module';
import { HealthModule } from './health/health.module';
import { InstrumentsModule } from './instruments/instruments.module';
import { LogbookModule } from './logbook/logbook.module';
import { MqttModule } from './mqtt/mqtt.module';
import { NoticesModule } from './notices/notices.module';
import { OrdersModule } from './orders/orders.module';
import { ReplayModule } from './replay/replay.module';
import { ReportsModule } from './reports/reports.module';
import { ReservoirsModule } from './reservoirs/reservoirs.module';
import { RetentionModule } from './retention/retention.module';
import { TelemetryModule } from './telemetry/telemetry.module';

/** The built console, served from the same origin when it exists. */
function consoleModule(root: string): DynamicModule[] {
  return existsSync(root)
    ? [ServeStaticModule.forRoot({ rootPath: root, exclude: ['/api/{*path}'] })]
    : [];
}

/**
 * The whole gateway. A dynamic module, so the environment is read when the app is built, not when
 * this file is first imported (tests start several gateways with different settings in one process).
 */
@Module({})
export class AppModule {
  static register(): DynamicModule {
    const env = validateEnv(process.env);
    return {
      module: AppModule,
      imports: [
        ConfigModule.forRoot({
          isGlobal: true,
          validate: validateEnv,
          ignoreEnvFile: true,
          cache: false,
        }),
        ScheduleModule.forRoot(),
        DatabaseModule,
        MqttModule,
        LogbookModule,
        AuthModule,
        ClockModule,
        ReservoirsModule,
        TelemetryModule,
        NoticesModule,
        OrdersModule,
        ForecastsModule,
        AlarmsModule,
        InstrumentsModule,
        RetentionModule,
        ReplayModule,
        ReportsModule,
        HealthModule,
        BackupModule,
        ...consoleModule(env.CONSOLE_DIST),
      ],
    };
  }
}
