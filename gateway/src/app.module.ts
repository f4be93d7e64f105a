import { existsSync } from 'node:fs';
import { Module, type DynamicModule } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { ScheduleModule } from '@nestjs/schedule';
import { ServeStaticModule } from '@nestjs/serve-static';
import { validateEnv } from './config';
import { ClockModule } from './clock/clock.module';
import { DatabaseModule } from './database/database.module';
import { HealthModule } from './health/health.module';
import { MqttModule } from './mqtt/mqtt.module';
import { ReservoirsModule } from './reservoirs/reservoirs.module';
import { TelemetryModule } from './telemetry/telemetry.module';

/** The built console, served from the same origin when it exists. */
function consoleModule(): DynamicModule[] {
  const root = validateEnv(process.env).CONSOLE_DIST;
  return existsSync(root) ? [ServeStaticModule.forRoot({ rootPath: root, exclude: ['/api/{*path}'] })] : [];
}

@Module({
  imports: [
    ConfigModule.forRoot({ isGlobal: true, validate: validateEnv, ignoreEnvFile: true }),
    ScheduleModule.forRoot(),
    DatabaseModule,
    MqttModule,
    ClockModule,
    ReservoirsModule,
    TelemetryModule,
    HealthModule,
    ...consoleModule(),
  ],
})
export class AppModule {}
