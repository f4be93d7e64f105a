import { Global, Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { APP_FILTER, APP_GUARD } from '@nestjs/core';
import { JwtModule } from '@nestjs/jwt';
import { PassportModule } from '@nestjs/passport';
import { ThrottlerModule } from '@nestjs/throttler';
import { TypeOrmModule } from '@nestjs/typeorm';
import { AccessErrorFilter } from '../common/filters/access-error.filter';
import { AccessGuard } from '../common/guards/access.guard';
import type { Env } from '../config';
import { UsersModule } from '../users/users.module';
import { AccessTokens } from './access-tokens';
import { AuthController } from './auth.controller';
import { AuthService } from './auth.service';
import { JwtStrategy } from './jwt.strategy';
import { LiveSocketAuth } from './live-socket-auth';
import { RefreshTokenRow } from './refresh-token.entity';
import { SessionRow } from './session.entity';
import { SessionsService } from './sessions.service';
import { TotpController } from './totp.controller';
import { TotpService } from './totp.service';

/**
 * Sign-in and access control for the whole gateway: the global guard (APP_GUARD) that closes every
 * route by default, and the token and session checks the live socket uses too (hence global).
 */
@Global()
@Module({
  imports: [
    UsersModule,
    PassportModule,
    JwtModule.register({}),
    TypeOrmModule.forFeature([SessionRow, RefreshTokenRow]),
    ThrottlerModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService<Env, true>) => ({
        throttlers: [
          {
            name: 'sign-in',
            ttl: 60_000,
            limit: config.get('SIGN_IN_RATE_PER_MIN', { infer: true }),
          },
        ],
      }),
    }),
  ],
  controllers: [AuthController, TotpController],
  providers: [
    AccessTokens,
    SessionsService,
    AuthService,
    TotpService,
    JwtStrategy,
    LiveSocketAuth,
    { provide: APP_GUARD, useClass: AccessGuard },
    { provide: APP_FILTER, useClass: AccessErrorFilter },
  ],
  exports: [AccessTokens, SessionsService, LiveSocketAuth, UsersModule],
})
export class AuthModule {}
