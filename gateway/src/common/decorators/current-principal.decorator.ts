import { createParamDecorator, ExecutionContext } from '@nestjs/common';
import type { Principal } from '../../auth/principal';

/** The signed-in principal the guard put on the request. */
export const CurrentPrincipal = createParamDecorator(
  (_data: unknown, ctx: ExecutionContext): Principal => {
    const req = ctx.switchToHttp().getRequest<{ user?: Principal }>();
    if (!req.user) throw new Error('CurrentPrincipal on a route without a signed-in principal');
    return req.user;
  },
);
