import { ExecutionContext, Injectable } from '@nestjs/common';
import { ThrottlerGuard, type ThrottlerLimitDetail } from '@nestjs/throttler';
import { AccessError } from '../errors/access-error';

/** Per-address limit on the password-checking routes (sign-in, step-up), with our error body. */
@Injectable()
export class SignInThrottlerGuard extends ThrottlerGuard {
  protected override async throwThrottlingException(
    _context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    throw new AccessError('too-many-requests', {
      retryAfterS: Math.max(1, Math.ceil(detail.timeToBlockExpire)),
    });
  }
}
