import {
  Body,
  Controller,
  Delete,
  Get,
  HttpCode,
  Param,
  Patch,
  Post,
  Req,
  Res,
  UseGuards,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { ApiNoContentResponse, ApiOkResponse, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import type { Me, SessionInfo, StepUpResponse, TokenResponse } from '@stillwell/shared/access';
import type { Env } from '../config';
import { CurrentPrincipal } from '../common/decorators/current-principal.decorator';
import { Permission } from '../common/decorators/permission.decorator';
import { Public } from '../common/decorators/public.decorator';
import { SignInThrottlerGuard } from '../common/guards/sign-in-throttler.guard';
import { UsersService } from '../users/users.service';
import { AuthService, type SignedIn } from './auth.service';
import { ChangePasswordDto, SignInDto, StepUpDto, UpdateMeDto } from './dto/auth.dto';
import { actorOf, type Principal } from './principal';
import {
  assertConsoleOrigin,
  clearRefreshCookie,
  clientMeta,
  readRefreshCookie,
  setRefreshCookie,
} from './refresh-cookie';
import { SessionsService } from './sessions.service';

/** Sign-in, refresh, step-up and one's own account and sessions. */
@ApiTags('auth')
@Controller('auth')
export class AuthController {
  private readonly secureCookie: boolean;
  private readonly origins: readonly string[];

  constructor(
    config: ConfigService<Env, true>,
    private readonly auth: AuthService,
    private readonly sessions: SessionsService,
    private readonly users: UsersService,
  ) {
    this.secureCookie =
      config.get('COOKIE_SECURE', { infer: true }) ?? !config.get('DEMO_MODE', { infer: true });
    this.origins = config.get('CONSOLE_ORIGIN', { infer: true });
  }

  @Post('sign-in')
  @HttpCode(200)
  @Public()
  @UseGuards(SignInThrottlerGuard)
  @ApiOkResponse({ description: 'TokenResponse; the refresh token is set as an httpOnly cookie' })
  async signIn(
    @Body() body: SignInDto,
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<TokenResponse> {
    return this.answer(await this.auth.signIn(body, clientMeta(req)), res);
  }

  @Post('refresh')
  @HttpCode(200)
  @Public()
  @ApiOkResponse({
    description: 'A new access token and a new refresh cookie; the old one is spent',
  })
  async refresh(
    @Req() req: Request,
    @Res({ passthrough: true }) res: Response,
  ): Promise<TokenResponse> {
    assertConsoleOrigin(req, this.origins);
    try {
      return this.answer(await this.auth.refresh(readRefreshCookie(req)), res);
    } catch (error) {
      clearRefreshCookie(res, this.secureCookie);
      throw error;
    }
  }

  @Post('sign-out')
  @HttpCode(204)
  @Permission('sessions.own')
  @ApiNoContentResponse({ description: 'Ends this session' })
  async signOut(
    @CurrentPrincipal() p: Principal,
    @Res({ passthrough: true }) res: Response,
  ): Promise<void> {
    await this.sessions.end(p, p.sessionId, 'auth.sign-out');
    clearRefreshCookie(res, this.secureCookie);
  }

  @Post('step-up')
  @HttpCode(200)
  @Permission('sessions.own')
  @UseGuards(SignInThrottlerGuard)
  @ApiOkResponse({
    description:
      'Password (and code) again; authorising routes accept the session until stepUpUntil',
  })
  async stepUp(@CurrentPrincipal() p: Principal, @Body() body: StepUpDto): Promise<StepUpResponse> {
    return { stepUpUntil: new Date(await this.auth.stepUp(p, body)).toISOString() };
  }

  @Get('me')
  @Permission('sessions.own')
  @ApiOkResponse({ description: 'Me: user, roles, permissions, step-up validity, second factor' })
  me(@CurrentPrincipal() p: Principal): Me {
    return this.auth.me(p);
  }

  @Patch('me')
  @Permission('sessions.own')
  @ApiOkResponse({
    description: "Changes one's display name (roles are changed by an administrator only)",
  })
  async updateMe(@CurrentPrincipal() p: Principal, @Body() body: UpdateMeDto): Promise<Me> {
    await this.users.rename(actorOf(p), body.displayName);
    return this.auth.me({ ...p, displayName: body.displayName });
  }

  @Post('password')
  @HttpCode(204)
  @Permission('sessions.own')
  @ApiNoContentResponse({ description: "Changes one's password; every other session ends" })
  async changePassword(
    @CurrentPrincipal() p: Principal,
    @Body() body: ChangePasswordDto,
  ): Promise<void> {
    await this.auth.changePassword(p, body.currentPassword, body.newPassword);
  }

  @Get('sessions')
  @Permission('sessions.own')
  @ApiOkResponse({ description: "SessionInfo[]: one's live sessions" })
  listSessions(@CurrentPrincipal() p: Principal): Promise<SessionInfo[]> {
    return this.sessions.list(p.userId, p.sessionId);
  }

  @Delete('sessions')
  @Permission('sessions.own')
  @ApiOkResponse({ description: "Ends every other session of one's own: { ended }" })
  async endOtherSessions(@CurrentPrincipal() p: Principal): Promise<{ ended: number }> {
    return { ended: await this.sessions.endOthers(p) };
  }

  @Delete('sessions/:id')
  @HttpCode(204)
  @Permission('sessions.own')
  @ApiNoContentResponse({ description: "Ends one session of one's own" })
  async endSession(@CurrentPrincipal() p: Principal, @Param('id') id: string): Promise<void> {
    await this.sessions.end(p, id, 'session.revoked');
  }

  private answer(signedIn: SignedIn, res: Response): TokenResponse {
    setRefreshCookie(res, signedIn.refreshToken, signedIn.sessionExpiresAt, this.secureCookie);
    return {
      accessToken: signedIn.accessToken,
      expiresAt: new Date(signedIn.expiresAt).toISOString(),
      me: this.auth.me(signedIn.principal),
    };
  }
}
