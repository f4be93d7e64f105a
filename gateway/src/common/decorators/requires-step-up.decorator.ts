import { applyDecorators, SetMetadata } from '@nestjs/common';
import { ApiExtension } from '@nestjs/swagger';

export const STEP_UP_KEY = 'stillwell:step-up';

/**
 * The route authorises or overrides something: the password (and code, where the account has a
 * second factor) must have been given again in this session lately (POST /api/auth/step-up).
 * Otherwise 403 with code step-up-required. Shown as x-step-up in the API doc.
 */
export const RequiresStepUp = () =>
  applyDecorators(SetMetadata(STEP_UP_KEY, true), ApiExtension('x-step-up', true));
