import { ExecutionContext, Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { Reflector } from '@nestjs/core';
import { AuthGuard } from '@nestjs/passport';
import { can, type Action } from '@stillwell/shared/access';
import type { Principal } from '../../auth/principal';
import type { Env } from '../../config';
import { PERMISSION_KEY } from '../decorators/permission.decorator';
import { IS_PUBLIC_KEY } from '../decorators/public.decorator';
import { STEP_UP_KEY } from '../decorators/requires-step-up.decorator';
import { AccessError } from '../errors/access-error';

/**
 * The global guard: every HTTP route is closed unless it says @Public() or names its action with
 * @Permission(). The token is checked by passport-jwt (HS256 only), its session and user in the
 * database on every request, the action against the shared permission matrix, and, on routes
 * that authorise or override, a recent step-up.
 */
@Injectable()
export class AccessGuard extends AuthGuard('jwt') {
  private readonly logger = new Logger(AccessGuard.name);
  private readonly stepUpTtlMs: number;

  constructor(
    private readonly reflector: Reflector,
    config: ConfigService<Env, true>,
  ) {
    super();
    this.stepUpTtlMs = config.get('STEP_UP_TTL_S', { infer: true }) * 1000;
  }

  override async canActivate(context: ExecutionContext): Promise<boolean> {
    // socket.io is authenticated in its own middleware (LiveGateway); nothing else is served
    if (context.getType() !== 'http') return false;
    const targets = [context.getHandler(), context.getClass()];
    if (this.reflector.getAllAndOverride<boolean>(IS_PUBLIC_KEY, targets)) return true;
    const action = this.reflector.getAllAndOverride<Action | undefined>(PERMISSION_KEY, targets);
    if (!action) {
      this.logger.error(
        `${context.getClass().name}.${context.getHandler().name} declares no permission: refused`,
      );
      throw new AccessError('route-not-declared');
    }
    await super.canActivate(context);
    const principal = context.switchToHttp().getRequest<{ user: Principal }>().user;
    if (principal.mustChangePassword && action !== 'sessions.own')
      throw new AccessError('password-change-required');
    if (!can(principal.roles, action)) throw new AccessError('forbidden');
    if (this.reflector.getAllAndOverride<boolean>(STEP_UP_KEY, targets)) {
      const fresh =
        principal.steppedUpAt !== null && Date.now() - principal.steppedUpAt <= this.stepUpTtlMs;
      if (!fresh) throw new AccessError('step-up-required');
    }
    return true;
  }

  /** passport's verdict, turned into our codes (an AccessError from the session check passes as is). */
  override handleRequest<TUser = Principal>(err: unknown, user: unknown, info: unknown): TUser {
    if (err instanceof AccessError) throw err;
    if (err) throw new AccessError('token-invalid');
    if (user) return user as TUser;
    const name = info instanceof Error ? info.name : '';
    const message = info instanceof Error ? info.message : '';
    if (name === 'TokenExpiredError') throw new AccessError('token-expired');
    if (message === 'No auth token') throw new AccessError('unauthenticated');
    throw new AccessError('token-invalid');
  }
}
