import { Module, type DynamicModule } from '@nestjs/common';
import { ConfigModule } from '@nestjs/config';
import { validateEnv } from '../config';
import { DatabaseModule } from '../database/database.module';
import { LogbookModule } from '../logbook/logbook.module';
import { UsersModule } from '../users/users.module';

/** The one-time setup command needs only the database, the logbook and the accounts. */
export function setupEnv(raw: NodeJS.ProcessEnv): Record<string, unknown> {
  // no tokens are signed here, so the gateway's key is not needed; and never demo mode
  return {
    ...raw,
    DEMO_MODE: raw.DEMO_MODE ?? 'false',
    JWT_SECRET: raw.JWT_SECRET ?? 'unused-by-the-setup-command-'.repeat(2),
  };
}

/** Dynamic, so the environment is read when the command runs, not when this file is imported. */
@Module({})
export class SetupModule {
  static register(): DynamicModule {
    return {
      module: SetupModule,
      imports: [
        ConfigModule.forRoot({
          isGlobal: true,
          ignoreEnvFile: true,
          cache: false,
          validate: () => validateEnv(setupEnv(process.env)),
        }),
        DatabaseModule,
        LogbookModule,
        UsersModule,
      ],
    };
  }
}
